/**
 * The process exit codes of `orientry`, one per outcome a CI script may branch on.
 * Stable across releases: pipelines test them, so a code never changes meaning.
 */
export enum ExitCode {
  /** Nothing reached the failing severity (or the command did its job). */
  Pass = 0,
  /** At least one finding reached the gate's failing severity. */
  GateFailed = 1,
  /** Bad arguments, no input files, an unreadable or invalid policy, an unwritable output. */
  UsageError = 2,
  /** The Orientry server could not be reached (commands that talk to it). */
  ServerUnreachable = 3
}
