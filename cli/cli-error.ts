import { ExitCode } from './exit-codes';

/**
 * An expected failure of the command line: bad arguments, missing files, an unwritable output.
 * The top-level handler prints its message as one line on stderr and exits with its `exitCode`;
 * anything that is not a CliError (or a PolicyError) is treated as a bug.
 *
 * @example
 *   throw new CliError('input.no-match', 'no .glb or .gltf file matched "build/**"', ExitCode.UsageError);
 */
export class CliError extends Error {
  constructor(
    /** Stable dotted code, e.g. `args.unknown-option`. */
    readonly code: string,
    message: string,
    readonly exitCode: ExitCode = ExitCode.UsageError,
    options?: { cause?: unknown }
  ) {
    super(message, options);
    this.name = 'CliError';
  }
}
