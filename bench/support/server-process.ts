/**
 * Process helpers the benchmarks share when they run the built server as a child process:
 * waiting for /api/health here, a free port and a clean stop from the integration tests' helpers.
 */
import type { ChildProcess } from 'node:child_process';

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

// The integration tests' own process helpers: one free-port probe and one stop for both.
export { freePort, stopChild } from '../../tests/integration/helpers/server-process';
