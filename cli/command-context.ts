/**
 * What a command gets from the process: where it runs and where to write. Commands take it as
 * a parameter instead of touching `process` so they stay easy to follow and to test.
 */

/** A writable text stream; process.stdout and process.stderr fit. */
export interface TextStream {
  write(text: string): unknown;
  isTTY?: boolean;
  columns?: number;
}

export interface CommandContext {
  /** Working directory that relative paths and globs resolve against. */
  cwd: string;
  /** The report (check), nothing (fix), the build summary or report (submit). */
  stdout: TextStream;
  /** Summaries, warnings and progress. */
  stderr: TextStream;
  /** True when colour may be used on stdout (a terminal, and NO_COLOR unset). */
  isColorAllowed: boolean;
  /** Environment variables (the API token and CI build details for `submit`). */
  env: Readonly<Record<string, string | undefined>>;
}
