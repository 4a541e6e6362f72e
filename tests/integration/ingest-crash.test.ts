/**
 * A server killed (SIGKILL) in the middle of an upload leaves no trace of the build: no rows,
 * and its upload folder is swept once a restarted server takes the next upload.
 */
import http from 'node:http';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { diverGlb } from './api-fixtures';
import {
  countBuildRows,
  listUploadFolders,
  postBuild,
  seedProject,
  startApiTestServer,
  type ApiTestServer
} from './api-test-server';

let server: ApiTestServer;
let secret: string;

beforeAll(async () => {
  server = await startApiTestServer();
  ({ secret } = await seedProject('tidewatch'));
});
afterAll(async () => server?.remove());

/** Waits until `check` holds, polling every 20 ms, or fails after `timeoutMs`. */
async function waitFor(check: () => boolean, what: string, timeoutMs = 10_000): Promise<void> {
  const deadline = Date.now() + timeoutMs;
  while (!check()) {
    if (Date.now() > deadline) throw new Error(`Timed out waiting for ${what}.`);
    await new Promise((resolve) => setTimeout(resolve, 20));
  }
}

describe('a server killed mid-upload', () => {
  it('stores nothing of the build, and the next server sweeps the half-written upload at start-up', async () => {
    const first = await postBuild(server, 'tidewatch', secret, [
      { path: 'chars/kelp-diver.glb', bytes: await diverGlb() }
    ]);
    expect(first.status).toBe(201);
    const rowsBefore = await countBuildRows(server.database);

    // Send the meta part and half of a file part, then stop sending: the server is now streaming
    // the file into its upload folder and waiting for the rest.
    const boundary = '----orientry-crash-test';
    const url = new URL(`${server.url}/api/v1/projects/tidewatch/builds`);
    const request = http.request({
      host: url.hostname,
      port: url.port,
      path: url.pathname,
      method: 'POST',
      headers: {
        authorization: `Bearer ${secret}`,
        origin: server.url,
        'content-type': `multipart/form-data; boundary=${boundary}`,
        'transfer-encoding': 'chunked'
      }
    });
    const requestEnded = new Promise<void>((resolve) => {
      request.on('error', () => resolve());
      request.on('response', (response) => {
        response.resume();
        response.on('end', resolve);
        response.on('error', () => resolve());
      });
    });
    request.write(
      `--${boundary}\r\nContent-Disposition: form-data; name="meta"\r\n\r\n{"branch":"main","label":"#killed"}\r\n` +
        `--${boundary}\r\nContent-Disposition: form-data; name="file"; filename="chars/huge.glb"\r\n\r\n`
    );
    request.write(Buffer.alloc(256 * 1024, 7));
    await waitFor(() => listUploadFolders(server).length === 1, 'the upload folder to appear');

    server.child.kill('SIGKILL');
    await new Promise((resolve) => server.child.once('exit', resolve));
    await requestEnded;
    expect(listUploadFolders(server)).toHaveLength(1);
    expect(await countBuildRows(server.database)).toEqual(rowsBefore);

    await server.restart();
    // The restarted server sweeps the dead process's folder at start-up, before any upload.
    expect(listUploadFolders(server)).toEqual([]);
    expect(await countBuildRows(server.database)).toEqual(rowsBefore);
    const next = await postBuild(server, 'tidewatch', secret, [
      { path: 'chars/kelp-diver.glb', bytes: await diverGlb() }
    ]);
    expect(next.status).toBe(201);
    expect(listUploadFolders(server)).toEqual([]);
    const rowsAfter = await countBuildRows(server.database);
    expect(rowsAfter.builds).toBe(rowsBefore.builds + 1);
  });
});
