/**
 * The command line of `orientry`: one table of commands and options, parsed with node's
 * `util.parseArgs` and validated with zod into typed options. The same table generates `--help`
 * (see help.ts), so an option is described in exactly one place.
 */
import { parseArgs } from 'node:util';
import { z } from 'zod';
import { SEVERITIES, type Severity } from '$lib/lint/finding';
import { RULE_IDS, type RuleId } from '$lib/lint/rule-ids';
import { CliError } from './cli-error';
import { ExitCode } from './exit-codes';
import {
  DEBUG_OPTION,
  HELP_OPTION,
  oneOf,
  optionalText,
  REPORT_FORMATS,
  type OptionSpec,
  type ReportFormat
} from './option-spec';
import { SUBMIT_NOTES, SUBMIT_OPTIONS, submitSchema, toSubmitOptions, type SubmitOptions } from './submit-args';

export { REPORT_FORMATS, type OptionSpec, type ReportFormat, type SubmitOptions };

/** A command: what help shows and which options parseArgs accepts. */
export interface CommandSpec {
  name: CommandName;
  /** One line for the command list. */
  summary: string;
  /** What follows `orientry <name>` in the usage line. */
  usage: string;
  options: readonly OptionSpec[];
  /** Extra paragraphs after the options (exit codes, notes). */
  notes: readonly string[];
}

export const COMMAND_NAMES = ['check', 'fix', 'submit'] as const;
export type CommandName = (typeof COMMAND_NAMES)[number];

/** Where the policy fields are documented; help points there instead of copying them. */
export const POLICY_DOCS_PATH = 'src/lib/lint/policy.ts';

const POLICY_OPTION: OptionSpec = {
  name: 'policy',
  type: 'string',
  valueName: 'file.json',
  description: `Lint policy as JSON (fields and defaults: ${POLICY_DOCS_PATH}). Default: the built-in policy.`
};

/** Every command with its options: the single source for parsing and for help. */
export const COMMANDS: Record<CommandName, CommandSpec> = {
  check: {
    name: 'check',
    summary: 'Lint the rotations in glTF 2.0 assets offline and write a report.',
    usage: 'check <files, folders or globs...> [options]',
    options: [
      POLICY_OPTION,
      {
        name: 'format',
        type: 'string',
        valueName: REPORT_FORMATS.join('|'),
        description: 'Report format. Default: text.'
      },
      {
        name: 'output',
        short: 'o',
        type: 'string',
        valueName: 'file',
        description: 'Write the report to this file instead of stdout; a one-line summary goes to stderr.'
      },
      {
        name: 'fail-on',
        type: 'string',
        valueName: SEVERITIES.join('|'),
        description: "Lowest severity that fails the run. Default: the policy's gate.failOn (error)."
      },
      {
        name: 'progress',
        type: 'boolean',
        description: 'Show progress on stderr even when stderr is not a terminal.'
      },
      DEBUG_OPTION,
      HELP_OPTION
    ],
    notes: [
      'Folders expand to every .glb and .gltf file below them (node_modules skipped); quote globs so the shell leaves them alone.',
      'Side files (.bin, images) are read only from the folder of their .gltf file or below it.',
      'Exit codes: 0 nothing reached the failing severity, 1 something did, 2 usage or input error.'
    ]
  },
  fix: {
    name: 'fix',
    summary: 'Write a copy of one asset with the fixable rotation findings corrected.',
    usage: 'fix <in.glb|in.gltf> -o <out.glb|out.gltf> [options]',
    options: [
      {
        name: 'output',
        short: 'o',
        type: 'string',
        valueName: 'file',
        description: 'Where to write the fixed asset (.glb, or .gltf with its .bin beside it).'
      },
      {
        name: 'rules',
        type: 'string',
        valueName: 'rule,rule',
        description: 'Fix only these rules (comma-separated). Default: every rule that has a fix.'
      },
      POLICY_OPTION,
      {
        name: 'in-place',
        type: 'boolean',
        description: 'Overwrite the input file (without it, the input is never written).'
      },
      DEBUG_OPTION,
      HELP_OPTION
    ],
    notes: [
      'What was applied and the finding counts before and after go to stderr.',
      'Exit codes: 0 written, 2 usage or input error.'
    ]
  },
  submit: {
    name: 'submit',
    summary: 'Upload assets to an Orientry server as one build; the server lints them and decides the CI gate.',
    usage: 'submit <files, folders or globs...> --server <url> --project <slug> [options]',
    options: SUBMIT_OPTIONS,
    notes: SUBMIT_NOTES
  }
};

/** Options of `orientry check`, validated. */
export interface CheckOptions {
  inputs: string[];
  policyPath: string | null;
  format: ReportFormat;
  outputPath: string | null;
  failOn: Severity | null;
  isProgressForced: boolean;
  isDebug: boolean;
}

/** Options of `orientry fix`, validated. */
export interface FixOptions {
  inputPath: string;
  outputPath: string | null;
  /** null means every rule that has a fix. */
  rules: RuleId[] | null;
  policyPath: string | null;
  isInPlace: boolean;
  isDebug: boolean;
}

/** What the command line asks for. */
export type Invocation =
  | { kind: 'help'; command: CommandName | null }
  | { kind: 'version' }
  | { kind: 'check'; options: CheckOptions }
  | { kind: 'fix'; options: FixOptions }
  | { kind: 'submit'; options: SubmitOptions };

const checkSchema = z.object({
  positionals: z.array(z.string().min(1)).min(1, 'give at least one file, folder or glob to check'),
  values: z.object({
    policy: optionalText,
    format: oneOf(REPORT_FORMATS).default('text'),
    output: optionalText,
    'fail-on': oneOf(SEVERITIES).optional(),
    progress: z.boolean().default(false),
    debug: z.boolean().default(false)
  })
});

const ruleList = z
  .string()
  .transform((text) =>
    text
      .split(',')
      .map((part) => part.trim())
      .filter((part) => part.length > 0)
  )
  .pipe(z.array(oneOf(RULE_IDS)).min(1, 'name at least one rule'));

const fixSchema = z
  .object({
    positionals: z.array(z.string().min(1)).length(1, 'give exactly one input file (fix works on one asset at a time)'),
    values: z.object({
      output: optionalText,
      rules: ruleList.optional(),
      policy: optionalText,
      'in-place': z.boolean().default(false),
      debug: z.boolean().default(false)
    })
  })
  .refine((input) => input.values.output !== undefined || input.values['in-place'], {
    message: 'give -o <file> for the fixed copy, or --in-place to overwrite the input'
  });

/**
 * Parses `process.argv.slice(2)` into what to do.
 * @throws CliError (exit code 2) for an unknown command or option, a missing or invalid value.
 * @example
 *   parseCommandLine(['check', 'build', '--format', 'sarif'])
 *   // → { kind: 'check', options: { inputs: ['build'], format: 'sarif', ... } }
 */
export function parseCommandLine(argv: readonly string[]): Invocation {
  const [first, ...rest] = argv;
  if (first === undefined)
    throw usage('args.no-command', `no command given (use ${COMMAND_NAMES.join(', ')}; see orientry --help)`);
  if (first === '--help' || first === '-h') return { kind: 'help', command: null };
  if (first === '--version' || first === '-V') return { kind: 'version' };
  if (first === 'help') return { kind: 'help', command: rest[0] === undefined ? null : toCommandName(rest[0]) };
  const command = toCommandName(first);
  const raw = parseRaw(command, rest);
  if (raw.values.help === true) return { kind: 'help', command };
  switch (command) {
    case 'check':
      return { kind: 'check', options: toCheckOptions(validate(command, checkSchema, raw)) };
    case 'fix':
      return { kind: 'fix', options: toFixOptions(validate(command, fixSchema, raw)) };
    case 'submit':
      return { kind: 'submit', options: toSubmitOptions(validate(command, submitSchema, raw)) };
  }
}

function toCheckOptions(input: z.infer<typeof checkSchema>): CheckOptions {
  const { values } = input;
  return {
    inputs: input.positionals,
    policyPath: values.policy ?? null,
    format: values.format,
    outputPath: values.output ?? null,
    failOn: values['fail-on'] ?? null,
    isProgressForced: values.progress,
    isDebug: values.debug
  };
}

function toFixOptions(input: z.infer<typeof fixSchema>): FixOptions {
  const { values } = input;
  return {
    inputPath: input.positionals[0],
    outputPath: values.output ?? null,
    rules: values.rules ? [...new Set(values.rules)] : null,
    policyPath: values.policy ?? null,
    isInPlace: values['in-place'],
    isDebug: values.debug
  };
}

function toCommandName(text: string): CommandName {
  if ((COMMAND_NAMES as readonly string[]).includes(text)) return text as CommandName;
  throw usage(
    'args.unknown-command',
    `unknown command "${text}" (use ${COMMAND_NAMES.join(', ')}; see orientry --help)`
  );
}

interface RawArgs {
  positionals: string[];
  values: Record<string, string | boolean | undefined>;
}

function parseRaw(command: CommandName, args: string[]): RawArgs {
  const options: Record<string, { type: 'string' | 'boolean'; short?: string }> = {};
  for (const option of COMMANDS[command].options) {
    options[option.name] = option.short ? { type: option.type, short: option.short } : { type: option.type };
  }
  try {
    const { values, positionals } = parseArgs({ args, options, allowPositionals: true, strict: true });
    return { values: values as RawArgs['values'], positionals };
  } catch (error) {
    throw usage('args.invalid', `${describeParseError(error)} (see orientry ${command} --help)`, {
      cause: error
    });
  }
}

/** Rewrites node's parseArgs errors into one short line each. */
function describeParseError(error: unknown): string {
  const code = (error as { code?: unknown }).code;
  const message = error instanceof Error ? error.message : String(error);
  const quoted = /'([^']+)'/.exec(message)?.[1];
  if (code === 'ERR_PARSE_ARGS_UNKNOWN_OPTION' && quoted) return `unknown option ${quoted}`;
  if (code === 'ERR_PARSE_ARGS_INVALID_OPTION_VALUE' && quoted) {
    const name = quoted.split(' ')[0];
    if (/does not take an argument/.test(message)) return `option ${name} takes no value`;
    return `option ${name} needs a value (write ${name}=<value> when the value starts with "-")`;
  }
  return message;
}

function validate<T>(command: CommandName, schema: z.ZodType<T>, raw: RawArgs): T {
  const result = schema.safeParse(raw);
  if (result.success) return result.data;
  const issue = result.error.issues[0];
  const where = issue.path[0] === 'values' ? `--${String(issue.path[1])}: ` : '';
  throw usage('args.invalid', `${where}${issue.message} (see orientry ${command} --help)`, {
    cause: result.error
  });
}

function usage(code: string, message: string, options?: { cause?: unknown }): CliError {
  return new CliError(code, message, ExitCode.UsageError, options);
}
