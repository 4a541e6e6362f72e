/**
 * Sends one build to the server: `POST /api/v1/projects/{project}/builds` with the streamed
 * multipart body, retried on network errors, timeouts and 5xx/429 answers with the same body
 * (so the same idempotency key: given, or derived by the server from the same files), and the
 * answer validated into a {@link BuildAnswer}.
 */
import { z } from 'zod';
import { version as packageVersion } from '../package.json';
import { CliError } from './cli-error';
import { ExitCode } from './exit-codes';
import { exchange, type HttpAnswer } from './http-exchange';
import type { MultipartBody } from './multipart-body';
import { withRetries, type RetryHooks, type RetryPolicy } from './retry-policy';
import { apiUrl, outcomeOfFailure, outcomeOfNetworkError } from './server-answer';
import type { UploadProgress } from './upload-progress';

const count = z.number().int().nonnegative();

/** The part of the server's build answer `submit` relies on (more fields may come). */
export const buildAnswerSchema = z.object({
  build: z.object({
    id: z.number().int().positive(),
    branch: z.string(),
    commit: z.string().nullable(),
    label: z.string().nullable(),
    verdict: z.enum(['pass', 'fail']),
    verdictReason: z.string().nullable(),
    counts: z.object({
      error: count,
      warning: count,
      info: count,
      new: count,
      unchanged: count,
      fixed: count,
      waived: count
    }),
    assetCount: count,
    baselineBuildId: z.number().int().nullable(),
    reportUrl: z.string()
  })
});

/** A stored build as the server answers it. */
export type BuildAnswer = z.infer<typeof buildAnswerSchema>['build'];

/** The stored build, and whether the server already had it (a repeated idempotency key: HTTP 200). */
export interface PostedBuild {
  build: BuildAnswer;
  isExisting: boolean;
}

/** Everything one submission needs. */
export interface PostBuildRequest {
  serverUrl: string;
  project: string;
  token: string;
  /**
   * A given key, also sent as the `Idempotency-Key` header so a server that stored it answers
   * before the body is read; null sends no header (meta asks the server to derive the key).
   */
  idempotencyKey: string | null;
  body: MultipartBody;
  retry: RetryPolicy;
  timeoutSeconds: number;
  progress: UploadProgress;
}

/**
 * Uploads the build and returns the server's answer.
 * @throws CliError: exit 3 when the server cannot be reached after every retry or refuses the
 *   token, project or size; exit 2 when it refuses the upload's content (HTTP 400) or an input
 *   file changed while it was read.
 */
export async function postBuild(request: PostBuildRequest, hooks: RetryHooks): Promise<PostedBuild> {
  const url = apiUrl(request.serverUrl, `api/v1/projects/${encodeURIComponent(request.project)}/builds`);
  return withRetries(
    async () => {
      let response: HttpAnswer;
      try {
        response = await send(url, request);
      } catch (error) {
        request.progress.finish();
        return outcomeOfNetworkError(error, request.timeoutSeconds);
      }
      request.progress.finish();
      if (response.status !== 200 && response.status !== 201) return outcomeOfFailure(response, 'the upload');
      return { kind: 'done', value: await readAnswer(response) };
    },
    request.retry,
    `POST ${url.href}`,
    hooks
  );
}

/** One attempt: the whole body streamed and the answer read, within the timeout. */
async function send(url: URL, request: PostBuildRequest): Promise<HttpAnswer> {
  const { body, progress } = request;
  const { idempotencyKey } = request;
  let sentBytes = 0;
  progress.start(body.byteLength);
  return exchange(url, {
    method: 'POST',
    body: body.open((byteLength) => {
      sentBytes += byteLength;
      progress.advance(byteLength);
      if (sentBytes === body.byteLength) progress.sent();
    }),
    timeoutMs: request.timeoutSeconds * 1000,
    headers: {
      authorization: `Bearer ${request.token}`,
      accept: 'application/json',
      'content-type': body.contentType,
      'content-length': String(body.byteLength),
      ...(idempotencyKey === null ? {} : { 'idempotency-key': idempotencyKey }),
      // The server refuses cross-site form posts; an API client states the server's own origin.
      origin: url.origin,
      'user-agent': `orientry-cli/${packageVersion}`
    }
  });
}

async function readAnswer(response: HttpAnswer): Promise<PostedBuild> {
  const text = await response.text();
  let json: unknown;
  try {
    json = JSON.parse(text);
  } catch (error) {
    throw notABuild(response, 'not JSON', error);
  }
  const parsed = buildAnswerSchema.safeParse(json);
  if (!parsed.success) throw notABuild(response, 'no build in it', parsed.error);
  return { build: parsed.data.build, isExisting: response.status === 200 };
}

function notABuild(response: HttpAnswer, what: string, cause: unknown): CliError {
  return new CliError(
    'server.answer-invalid',
    `the server answered HTTP ${response.status} with ${what} (${response.headers.get('content-type') ?? 'no content type'}); check that --server is the Orientry server's address`,
    ExitCode.ServerUnreachable,
    { cause }
  );
}
