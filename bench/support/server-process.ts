/**
 * Process helpers the benchmarks share when they run the built server as a child process:
 * a free port, waiting for /api/health, and a clean stop.
 */
import type { ChildProcess } from 'node:child_process';
import net from 'node:net';

/** Resolves once GET `${url}/api/health` answers 200; rejects with the server's output if it exits or times out. */
export async function waitForHealth(
  child: ChildProcess,
  url: string,
  output: string[],
  timeoutMs = 60_000
): Promise<void> {
  const deadline = Date.now() + timeoutMs;
  while (Date.now() < deadline) {
    if (child.exitCode !== null) throw new Error(`The bench server exited early:\n${output.join('')}`);
    try {
      if ((await fetch(`${url}/api/health`)).ok) return;
    } catch {
      // Connection refused until the server listens: expected while it starts.
    }
    await new Promise((resolve) => setTimeout(resolve, 100));
  }
  throw new Error(`The bench server did not answer within ${timeoutMs / 1000} s:\n${output.join('')}`);
}

/** Sends SIGTERM and waits for the exit (nothing to do when it already ended). */
export async function stopChild(child: ChildProcess): Promise<void> {
  if (child.exitCode !== null || child.signalCode !== null) return;
  const exited = new Promise<void>((resolve) => child.once('exit', () => resolve()));
  child.kill('SIGTERM');
  await exited;
}

/** A TCP port nobody listens on right now. */
export async function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const probe = net.createServer();
    probe.once('error', reject);
    probe.listen(0, '127.0.0.1', () => {
      const { port } = probe.address() as net.AddressInfo;
      probe.close(() => resolve(port));
    });
  });
}
