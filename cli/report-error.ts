/**
 * The command line's one mapping from an error to an exit code and a message on stderr.
 * Expected failures (CliError, PolicyError) print one line, prefixed with the command so a CI log
 * says which step failed; anything else is a bug: "orientry: internal error: ...", and the stack
 * only under --debug.
 */
import { PolicyError } from '$lib/lint/policy';
import { CliError } from './cli-error';
import type { TextStream } from './command-context';
import { ExitCode } from './exit-codes';

/**
 * Writes what went wrong to `stderr` and returns the exit code.
 * @param prefix `orientry` or `orientry <command>`.
 */
export function reportError(error: unknown, stderr: TextStream, prefix: string, isDebug: boolean): ExitCode {
  if (error instanceof CliError || error instanceof PolicyError) {
    stderr.write(`${prefix}: ${error.message}\n`);
    if (isDebug && error.cause) stderr.write(`${describeCause(error.cause)}\n`);
    return error instanceof CliError ? error.exitCode : ExitCode.UsageError;
  }
  const message = error instanceof Error ? error.message : String(error);
  stderr.write(`orientry: internal error: ${message}\n`);
  if (isDebug && error instanceof Error && error.stack) stderr.write(`${error.stack}\n`);
  else stderr.write('orientry: run again with --debug for the stack trace, and report it with the asset.\n');
  // A bug is no verdict on the assets: never 0 or 1, which CI reads as pass or gate failure.
  return ExitCode.UsageError;
}

function describeCause(cause: unknown): string {
  return cause instanceof Error ? `caused by: ${cause.stack ?? cause.message}` : `caused by: ${String(cause)}`;
}
