import { describe, expect, it } from 'vitest';
import { CliError } from './cli-error';
import { ExitCode } from './exit-codes';
import { NetworkError } from './http-exchange';
import { apiUrl, outcomeOfFailure, outcomeOfNetworkError, readServerError } from './server-answer';

const apiError = (status: number, code: string, message: string, headers: Record<string, string> = {}) =>
  new Response(JSON.stringify({ error: { code, message } }), {
    status,
    headers: { 'content-type': 'application/json', ...headers }
  });

describe('apiUrl', () => {
  const rows: [string, string][] = [
    ['https://orientry.example', 'https://orientry.example/api/v1/projects/tidewatch/builds'],
    ['https://orientry.example/', 'https://orientry.example/api/v1/projects/tidewatch/builds'],
    ['https://ci.example/orientry', 'https://ci.example/orientry/api/v1/projects/tidewatch/builds'],
    ['http://127.0.0.1:5173/tools/orientry/', 'http://127.0.0.1:5173/tools/orientry/api/v1/projects/tidewatch/builds']
  ];
  for (const [serverUrl, expected] of rows) {
    it(`puts the API under ${serverUrl}`, () => {
      expect(apiUrl(serverUrl, 'api/v1/projects/tidewatch/builds').href).toBe(expected);
    });
  }
});

describe('readServerError', () => {
  it("reads the API's { error: { code, message } }", async () => {
    const error = await readServerError(apiError(404, 'project.not-found', 'There is no project "x".'));
    expect(error).toEqual({ status: 404, code: 'project.not-found', message: 'There is no project "x".' });
  });

  it("reads the framework's { message } answer, e.g. a refused cross-site form post", async () => {
    const response = new Response(JSON.stringify({ message: 'Cross-site POST form submissions are forbidden' }), {
      status: 403
    });
    expect(await readServerError(response)).toEqual({
      status: 403,
      code: 'http.403',
      message: 'Cross-site POST form submissions are forbidden'
    });
  });

  it("keeps the first line of a proxy's HTML page, and the status text for an empty body", async () => {
    const page = new Response('<html>Bad gateway\n<body>...</body></html>', { status: 502 });
    expect((await readServerError(page)).message).toBe('<html>Bad gateway');
    const empty = new Response('', { status: 503, statusText: 'Service Unavailable' });
    expect(await readServerError(empty)).toEqual({ status: 503, code: 'http.503', message: 'Service Unavailable' });
  });
});

describe('outcomeOfFailure', () => {
  const refusals: { status: number; code: string; exitCode: ExitCode }[] = [
    { status: 400, code: 'upload.no-assets', exitCode: ExitCode.UsageError },
    { status: 401, code: 'auth.token-invalid', exitCode: ExitCode.ServerUnreachable },
    { status: 403, code: 'auth.token-wrong-project', exitCode: ExitCode.ServerUnreachable },
    { status: 404, code: 'project.not-found', exitCode: ExitCode.ServerUnreachable },
    { status: 413, code: 'limit.build-bytes', exitCode: ExitCode.ServerUnreachable },
    { status: 422, code: 'http.422', exitCode: ExitCode.ServerUnreachable }
  ];
  for (const { status, code, exitCode } of refusals) {
    it(`ends with exit ${exitCode} and the server's words on HTTP ${status}`, async () => {
      const failure = await outcomeOfFailure(apiError(status, code, 'Explained.'), 'the upload').catch(
        (error: unknown) => error
      );
      expect(failure).toBeInstanceOf(CliError);
      expect((failure as CliError).exitCode).toBe(exitCode);
      expect((failure as CliError).code).toBe(code);
      expect((failure as CliError).message).toBe(`the server refused the upload (HTTP ${status} ${code}): Explained.`);
    });
  }

  const retries: { status: number; retryAfter?: string; retryAfterMs: number | null }[] = [
    { status: 408, retryAfterMs: null },
    { status: 429, retryAfter: '3', retryAfterMs: 3000 },
    { status: 500, retryAfterMs: null },
    { status: 502, retryAfterMs: null },
    { status: 503, retryAfter: '0', retryAfterMs: 0 }
  ];
  for (const { status, retryAfter, retryAfterMs } of retries) {
    it(`retries HTTP ${status}${retryAfter ? ` after Retry-After ${retryAfter}` : ''}`, async () => {
      const headers: Record<string, string> = retryAfter ? { 'retry-after': retryAfter } : {};
      expect(await outcomeOfFailure(apiError(status, 'server.busy', 'Later.', headers), 'the upload')).toEqual({
        kind: 'retry',
        reason: `HTTP ${status} server.busy: Later.`,
        retryAfterMs
      });
    });
  }

  it('explains a refused cross-site post by the address the server knows itself by', async () => {
    const response = new Response(JSON.stringify({ message: 'Cross-site POST form submissions are forbidden' }), {
      status: 403
    });
    const failure = (await outcomeOfFailure(response, 'the upload').catch((error: unknown) => error)) as CliError;
    expect(failure.exitCode).toBe(ExitCode.ServerUnreachable);
    expect(failure.message).toContain('(its ORIGIN)');
  });

  it('ends with exit 3 on a redirect, naming where to point --server', async () => {
    const response = new Response(null, { status: 308, headers: { location: 'https://orientry.example/' } });
    const failure = (await outcomeOfFailure(response, 'the upload').catch((error: unknown) => error)) as CliError;
    expect(failure.code).toBe('server.redirect');
    expect(failure.exitCode).toBe(ExitCode.ServerUnreachable);
    expect(failure.message).toContain('https://orientry.example/');
  });
});

describe('outcomeOfNetworkError', () => {
  it('retries a refused connection, naming the socket error', () => {
    const error = new NetworkError('connect ECONNREFUSED 127.0.0.1:9', {
      cause: Object.assign(new Error('connect ECONNREFUSED 127.0.0.1:9'), { code: 'ECONNREFUSED' })
    });
    expect(outcomeOfNetworkError(error, 600)).toEqual({
      kind: 'retry',
      reason: 'connect ECONNREFUSED 127.0.0.1:9',
      retryAfterMs: null
    });
  });

  it('retries a timeout, naming the limit', () => {
    const error = new DOMException('The operation was aborted due to timeout', 'TimeoutError');
    expect(outcomeOfNetworkError(error, 90)).toEqual({
      kind: 'retry',
      reason: 'no answer within 90 s',
      retryAfterMs: null
    });
  });

  it('passes on an input error that broke the body instead of retrying it', () => {
    const changed = new CliError('input.changed', 'keeper.bin: the file changed', ExitCode.UsageError);
    expect(() => outcomeOfNetworkError(changed, 600)).toThrow(changed);
  });

  it('passes on anything that is not a network failure', () => {
    const bug = new RangeError('bad index');
    expect(() => outcomeOfNetworkError(bug, 600)).toThrow(bug);
  });
});
