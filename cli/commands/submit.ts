/**
 * `orientry submit`: uploads assets (with the side files they name) to an Orientry server as one
 * build. The server lints them under the project's policy, compares them with the baseline build
 * and decides the gate; this command prints that decision (or writes the build's report) and
 * exits with it, so a CI job fails exactly when the server's gate does.
 */
import { resolve } from 'node:path';
import { setTimeout as sleep } from 'node:timers/promises';
import { readApiToken } from '../api-token';
import type { SubmitOptions } from '../args';
import { resolveBuildDetails, type BuildDetails } from '../build-details';
import { formatBuildSummary } from '../build-summary-text';
import type { CommandContext } from '../command-context';
import { ExitCode } from '../exit-codes';
import { fetchBuildReport, type ServerReportFormat } from '../fetch-build-report';
import { expandInputs } from '../files';
import { createMultipartBody, type MultipartBody, type MultipartPart } from '../multipart-body';
import { plural } from '../plural';
import { postBuild } from '../post-build';
import { MAX_BACKOFF_MS, type RetryHooks, type RetryPolicy } from '../retry-policy';
import { collectUploadFiles, type UploadFile } from '../upload-files';
import { createUploadProgress, formatBytes } from '../upload-progress';
import { writeReportFile } from '../write-report-file';

const PREFIX = 'orientry submit:';

/** Runs `orientry submit` and returns the exit code. */
export async function submit(options: SubmitOptions, context: CommandContext): Promise<ExitCode> {
  const warn = (line: string) => context.stderr.write(`${PREFIX} warning: ${line}\n`);
  const token = await readApiToken(options.tokenFilePath, context.env, context.cwd);
  const { details, sources } = await resolveBuildDetails(
    { commit: options.commit, branch: options.branch, label: options.label, ciJobUrl: options.ciJobUrl },
    context.env,
    context.cwd
  );
  const rootPath = resolve(context.cwd, options.rootPath ?? '.');
  const { files: assets, unmatchedPatterns } = await expandInputs(options.inputs, context.cwd);
  for (const pattern of unmatchedPatterns) warn(`"${pattern}" matched no .glb or .gltf file`);
  const files = await collectUploadFiles(assets, rootPath, warn);

  const body = buildUploadBody({ details, files, idempotencyKey: options.idempotencyKey });
  context.stderr.write(`${PREFIX} ${describeSubmission(options, details, sources, files)}\n`);

  const retry: RetryPolicy = {
    retries: options.retries,
    baseDelayMs: options.retryDelaySeconds * 1000,
    maxDelayMs: Math.max(MAX_BACKOFF_MS, options.retryDelaySeconds * 1000)
  };
  const progress = createUploadProgress(context.stderr, options.isProgressForced);
  const hooks: RetryHooks = {
    sleep: (delayMs) => sleep(delayMs),
    onRetry: ({ attempt, attempts, reason, delayMs }) =>
      warn(`attempt ${attempt} of ${attempts} failed (${reason}); trying again in ${(delayMs / 1000).toFixed(1)} s`)
  };
  const posted = await postBuild(
    {
      serverUrl: options.serverUrl,
      project: options.project,
      token,
      idempotencyKey: options.idempotencyKey,
      body,
      retry,
      timeoutSeconds: options.timeoutSeconds,
      progress
    },
    hooks
  );

  const summary = formatBuildSummary(posted.build, { project: options.project, isExisting: posted.isExisting });
  if (options.format === 'text') {
    context.stdout.write(summary);
  } else {
    const report = await getReport({
      options,
      format: options.format,
      buildId: posted.build.id,
      token,
      retry,
      hooks,
      files,
      warn
    });
    if (options.outputPath === null) {
      context.stdout.write(report);
      context.stderr.write(summary);
    } else {
      await writeReportFile(resolve(context.cwd, options.outputPath), report, options.outputPath);
      context.stdout.write(summary);
    }
  }
  return posted.build.verdict === 'fail' ? ExitCode.GateFailed : ExitCode.Pass;
}

/**
 * The `meta` part first, then every file under its upload path (RFC 7578 keeps the order).
 * Without --idempotency-key, meta asks the server to derive the key from the build details and
 * the SHA-256 of each file, which it computes anyway to store them by content: a retried or
 * repeated submission of the same build is answered with the build already stored.
 */
function buildUploadBody(input: {
  details: BuildDetails;
  files: readonly UploadFile[];
  idempotencyKey: string | null;
}): MultipartBody {
  const { details, files, idempotencyKey } = input;
  const meta: MultipartPart = {
    kind: 'field',
    name: 'meta',
    contentType: 'application/json; charset=utf-8',
    value: JSON.stringify({
      ...details,
      ...(idempotencyKey === null ? { deriveIdempotencyKey: true } : { idempotencyKey })
    })
  };
  const fileParts = files.map((file): MultipartPart => ({
    kind: 'file',
    name: 'file',
    fileName: file.uploadPath,
    absolutePath: file.absolutePath,
    byteLength: file.byteLength
  }));
  return createMultipartBody([meta, ...fileParts]);
}

/** What fetching (or, failing that, rendering) the report needs. */
interface ReportRequest {
  options: SubmitOptions;
  format: ServerReportFormat;
  buildId: number;
  token: string;
  retry: RetryPolicy;
  hooks: RetryHooks;
  files: readonly UploadFile[];
  warn: (line: string) => void;
}

/**
 * The build's report from the server; when the server does not give it (no report route, or
 * one that does not take API tokens), the same files linted here with the built-in policy, with
 * a warning that it lacks the project's policy, baseline and waivers.
 */
async function getReport(request: ReportRequest): Promise<string> {
  const { options, format } = request;
  const fetched = await fetchBuildReport(
    {
      serverUrl: options.serverUrl,
      project: options.project,
      buildId: request.buildId,
      format,
      token: request.token,
      retry: request.retry,
      timeoutSeconds: options.timeoutSeconds
    },
    request.hooks
  );
  if (fetched.kind === 'report') return fetched.text;
  const { status, code, message } = fetched.error;
  request.warn(
    `the server did not give the ${format} report (HTTP ${status} ${code}: ${message}); ` +
      `it was rendered on this machine with the built-in policy, without the project's policy, baseline or waivers`
  );
  // Imported here: the lint engine is only needed on this fallback path (see main.ts).
  const [{ buildLintReport, defaultPolicy }, { formatReport }, { lintInputFile }] = await Promise.all([
    import('$lib/lint'),
    import('../format-report'),
    import('../lint-input-file')
  ]);
  const policy = defaultPolicy();
  const reports = [];
  // The server lints .glb and .gltf files; anything else that was named is a side file to it.
  for (const file of request.files.filter((file) => file.isAsset && /\.(glb|gltf)$/i.test(file.uploadPath))) {
    reports.push(await lintInputFile({ absolutePath: file.absolutePath, displayPath: file.uploadPath }, policy));
  }
  return formatReport(buildLintReport(reports, policy), format, false);
}

/** `3 files (1.2 MiB) to <server> for tidewatch: main at 3f2a9c1d0e5b (#12), details from GitHub Actions` */
function describeSubmission(
  options: SubmitOptions,
  details: BuildDetails,
  sources: readonly string[],
  files: readonly UploadFile[]
): string {
  const byteLength = files.reduce((sum, file) => sum + file.byteLength, 0);
  const label = details.label ? ` (${details.label})` : '';
  const from = sources.length > 0 ? `, details from ${sources.join(' and ')}` : '';
  return (
    `${plural(files.length, 'file')} (${formatBytes(byteLength)}) to ${options.serverUrl} for ${options.project}: ` +
    `${details.branch} at ${details.commit.slice(0, 12)}${label}${from}`
  );
}
