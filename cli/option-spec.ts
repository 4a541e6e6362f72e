/**
 * The shapes and shared pieces of the command table: how one option is described (for
 * `util.parseArgs` and for help) and the zod helpers every command's schema uses, so each
 * command's options can live in their own file without repeating them.
 */
import { z } from 'zod';

/** One option of one command, as parseArgs needs it plus what help prints. */
export interface OptionSpec {
  /** Long name without dashes (`fail-on`). */
  name: string;
  /** One-letter alias without the dash (`o`). */
  short?: string;
  type: 'string' | 'boolean';
  /** Placeholder for the value in help (`file.json`). */
  valueName?: string;
  description: string;
}

/** `-h, --help`, on every command. */
export const HELP_OPTION: OptionSpec = { name: 'help', short: 'h', type: 'boolean', description: 'Show this help.' };

/** `--debug`, on every command: stack traces for the unexpected. */
export const DEBUG_OPTION: OptionSpec = {
  name: 'debug',
  type: 'boolean',
  description: 'Print stack traces when something unexpected goes wrong.'
};

/** Report formats `check` writes and `submit` fetches. */
export const REPORT_FORMATS = ['text', 'json', 'sarif', 'junit'] as const;
export type ReportFormat = (typeof REPORT_FORMATS)[number];

/** A string option that, when given, must not be empty (`--policy=` is a mistake, not a default). */
export const optionalText = z.string().min(1, 'needs a non-empty value').optional();

/** One of a fixed list of words, with a message that lists them. */
export const oneOf = <const T extends readonly [string, ...string[]]>(values: T) =>
  z.enum(values, { error: (issue) => `expected one of ${values.join(', ')}, got "${String(issue.input)}"` });
