/**
 * The process exit codes of `orientry`, one per outcome a CI script may branch on.
 * Stable across releases: pipelines test them, so a code never changes meaning.
 */
export enum ExitCode {
  /** Nothing reached the failing severity, the server's gate passed (or the command did its job). */
  Pass = 0,
  /** At least one finding reached the gate's failing severity, or the server's gate failed. */
  GateFailed = 1,
  /**
   * Bad arguments, no input files, an unreadable or invalid policy, an unwritable output, no API
   * token, an upload the server refused as malformed (HTTP 400).
   */
  UsageError = 2,
  /** The Orientry server could not be reached after every retry, or refused the token, project or size. */
  ServerUnreachable = 3
}
