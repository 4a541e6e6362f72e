/**
 * Downloads a stored build's report (`GET .../builds/{id}/report.{json|sarif|junit}`) with the
 * submit token, for `submit --format`. Retried like the upload; a refusal is returned, not
 * thrown, so `submit` can explain it and fall back to a report rendered on this machine.
 */
import { version as packageVersion } from '../package.json';
import { exchange, type HttpAnswer } from './http-exchange';
import { withRetries, type RetryHooks, type RetryPolicy } from './retry-policy';
import {
  apiUrl,
  isRetryableStatus,
  outcomeOfNetworkError,
  readServerError,
  retryOutcome,
  type ServerError
} from './server-answer';

/** Report formats the server exports, by the file name of their route. */
export type ServerReportFormat = 'json' | 'sarif' | 'junit';

/** The report text, or why the server did not give it. */
export type FetchedReport = { kind: 'report'; text: string } | { kind: 'refused'; error: ServerError };

/** What to fetch and how patiently. */
export interface FetchReportRequest {
  serverUrl: string;
  project: string;
  buildId: number;
  format: ServerReportFormat;
  token: string;
  retry: RetryPolicy;
  timeoutSeconds: number;
}

/**
 * The build's report as the server renders it.
 * @throws CliError `server.unreachable` (exit 3) when every attempt failed on the network or with 5xx.
 */
export async function fetchBuildReport(request: FetchReportRequest, hooks: RetryHooks): Promise<FetchedReport> {
  const path = `api/v1/projects/${encodeURIComponent(request.project)}/builds/${request.buildId}/report.${request.format}`;
  const url = apiUrl(request.serverUrl, path);
  return withRetries<FetchedReport>(
    async () => {
      let response: HttpAnswer;
      try {
        response = await exchange(url, {
          method: 'GET',
          timeoutMs: request.timeoutSeconds * 1000,
          headers: { authorization: `Bearer ${request.token}`, 'user-agent': `orientry-cli/${packageVersion}` }
        });
      } catch (error) {
        return outcomeOfNetworkError(error, request.timeoutSeconds);
      }
      if (response.status >= 200 && response.status < 300)
        return { kind: 'done', value: { kind: 'report', text: await response.text() } };
      const error = await readServerError(response);
      if (isRetryableStatus(error.status)) return retryOutcome(error, response.headers.get('retry-after'));
      return { kind: 'done', value: { kind: 'refused', error } };
    },
    request.retry,
    `GET ${url.href}`,
    hooks
  );
}
