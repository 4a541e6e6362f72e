/**
 * The options of `orientry submit`: their table entries (for parsing and help) and the zod
 * schema that turns raw argv values into {@link SubmitOptions}. Kept apart from args.ts because
 * submit has more options than every other command together.
 */
import { z } from 'zod';
import { DEBUG_OPTION, HELP_OPTION, oneOf, optionalText, REPORT_FORMATS, type OptionSpec } from './option-spec';
import type { ReportFormat } from './option-spec';

/** Options of `orientry submit`, validated. */
export interface SubmitOptions {
  inputs: string[];
  /** Base URL of the Orientry server, normalised by the URL parser (`https://orientry.example/`). */
  serverUrl: string;
  /** Project slug on the server. */
  project: string;
  /** Folder the uploaded paths are relative to; null means the working directory. */
  rootPath: string | null;
  /** Build details given on the command line; null ones come from CI variables or git. */
  commit: string | null;
  branch: string | null;
  label: string | null;
  ciJobUrl: string | null;
  /** null: the server derives it from the build's details and content (see commands/submit.ts). */
  idempotencyKey: string | null;
  /** File holding the API token; null means the ORIENTRY_TOKEN environment variable. */
  tokenFilePath: string | null;
  format: ReportFormat;
  outputPath: string | null;
  /** Retries after the first attempt, for network errors, 5xx and 429 answers. */
  retries: number;
  /** Wait before the first retry; each further retry doubles it (with jitter). */
  retryDelaySeconds: number;
  /** Longest time one attempt (upload, lint and answer) may take. */
  timeoutSeconds: number;
  isProgressForced: boolean;
  isDebug: boolean;
}

/** Defaults that help prints and the schema applies. */
export const SUBMIT_DEFAULTS = { retries: 4, retryDelaySeconds: 1, timeoutSeconds: 600 } as const;

/** The option table of `submit`, in the order help lists it. */
export const SUBMIT_OPTIONS: readonly OptionSpec[] = [
  {
    name: 'server',
    type: 'string',
    valueName: 'url',
    description: 'Base URL of the Orientry server, e.g. https://orientry.lanternfish.example. Required.'
  },
  { name: 'project', type: 'string', valueName: 'slug', description: 'Project slug on the server. Required.' },
  {
    name: 'root',
    type: 'string',
    valueName: 'dir',
    description:
      'Folder the uploaded file paths are relative to (they name the assets in reports). Default: the working directory.'
  },
  {
    name: 'commit',
    type: 'string',
    valueName: 'sha',
    description: 'Commit of the build. Default: from the CI variables, else `git rev-parse HEAD`.'
  },
  {
    name: 'branch',
    type: 'string',
    valueName: 'name',
    description: 'Branch of the build; the baseline is chosen by it. Default: from the CI variables, else git.'
  },
  {
    name: 'label',
    type: 'string',
    valueName: 'text',
    description: 'Build number or label shown in lists, e.g. "#1482". Default: the CI run number, if any.'
  },
  {
    name: 'ci-job-url',
    type: 'string',
    valueName: 'url',
    description: 'Link back to the CI job. Default: from the CI variables, if any.'
  },
  {
    name: 'idempotency-key',
    type: 'string',
    valueName: 'key',
    description:
      'Key that makes a repeated submission answer the first build. Default: the server derives one from project, branch, commit, label and the files, so a retried CI job gets the same.'
  },
  {
    name: 'token-file',
    type: 'string',
    valueName: 'path',
    description: 'Read the project API token from this file. Default: the ORIENTRY_TOKEN environment variable.'
  },
  {
    name: 'format',
    type: 'string',
    valueName: REPORT_FORMATS.join('|'),
    description: 'text prints the build summary; json, sarif and junit write the build report. Default: text.'
  },
  {
    name: 'output',
    short: 'o',
    type: 'string',
    valueName: 'file',
    description: 'Write the json, sarif or junit report to this file (the summary stays on stdout).'
  },
  {
    name: 'retries',
    type: 'string',
    valueName: 'n',
    description: `Retries after network errors, 5xx and 429 answers, with the same idempotency key. Default: ${SUBMIT_DEFAULTS.retries}.`
  },
  {
    name: 'retry-delay',
    type: 'string',
    valueName: 'seconds',
    description: `Wait before the first retry; it doubles each time, with jitter. Default: ${SUBMIT_DEFAULTS.retryDelaySeconds}.`
  },
  {
    name: 'timeout',
    type: 'string',
    valueName: 'seconds',
    description: `Longest one attempt (upload, lint, answer) may take. Default: ${SUBMIT_DEFAULTS.timeoutSeconds}.`
  },
  { name: 'progress', type: 'boolean', description: 'Show upload progress on stderr even when it is not a terminal.' },
  DEBUG_OPTION,
  HELP_OPTION
];

/** Help notes of `submit`. */
export const SUBMIT_NOTES: readonly string[] = [
  'The token comes from ORIENTRY_TOKEN (or --token-file); a project lead creates one in the project settings.',
  'Files are collected as check collects them; each .gltf brings the .bin and images it names inside its own folder.',
  'Exit codes: 0 the gate passed, 1 the gate failed, 2 usage or input error, 3 the server could not be reached or refused the request.'
];

/** Printable text without control characters (the server refuses them too). */
const label = (max: number) =>
  z
    .string()
    .trim()
    .min(1, 'needs a non-empty value')
    .max(max, `must be at most ${max} characters`)
    // eslint-disable-next-line no-control-regex -- control characters are what is refused
    .regex(/^[^\u0000-\u001f\u007f]*$/, 'must not contain control characters')
    .optional();

const httpUrl = (example: string) =>
  z
    .url({ protocol: /^https?$/, error: `must be an http(s) URL such as ${example}` })
    .transform((text) => new URL(text).href);

/** A number of seconds or a count within bounds, written in argv as text. */
const numberText = (min: number, max: number, isInteger: boolean) =>
  z
    .string()
    .trim()
    .regex(isInteger ? /^\d+$/ : /^\d+(\.\d+)?$/, isInteger ? 'expected a whole number' : 'expected a number')
    .transform(Number)
    .pipe(z.number().min(min, `must be at least ${min}`).max(max, `must be at most ${max}`));

/** Same shape as the server's project slugs (PROJECT_SLUG_PATTERN in the project model). */
const PROJECT_SLUG = /^[a-z0-9][a-z0-9-]{1,62}$/;

/** Schema of the raw parseArgs result of `submit`. */
export const submitSchema = z
  .object({
    positionals: z.array(z.string().min(1)).min(1, 'give at least one file, folder or glob to submit'),
    values: z.object({
      server: z
        .string({ error: 'give the server URL, e.g. --server https://orientry.example' })
        .pipe(httpUrl('https://orientry.example')),
      project: z
        .string({ error: 'give the project slug, e.g. --project tidewatch' })
        .regex(PROJECT_SLUG, 'expected a project slug: lower-case letters, digits and dashes, 2 to 63 characters'),
      root: optionalText,
      commit: z
        .string()
        .trim()
        .regex(/^[0-9a-f]{7,64}$/i, 'expected a commit id of 7 to 64 hex digits')
        .transform((text) => text.toLowerCase())
        .optional(),
      branch: label(255),
      label: label(200),
      'ci-job-url': httpUrl('https://ci.example/jobs/1482').optional(),
      'idempotency-key': label(200),
      'token-file': optionalText,
      format: oneOf(REPORT_FORMATS).default('text'),
      output: optionalText,
      retries: numberText(0, 20, true).optional(),
      'retry-delay': numberText(0, 300, false).optional(),
      timeout: numberText(1, 86_400, false).optional(),
      progress: z.boolean().default(false),
      debug: z.boolean().default(false)
    })
  })
  .refine((input) => input.values.output === undefined || input.values.format !== 'text', {
    message: 'needs --format json, sarif or junit (the text summary always goes to stdout)',
    path: ['values', 'output']
  });

/** The typed options from a validated parse. */
export function toSubmitOptions(input: z.infer<typeof submitSchema>): SubmitOptions {
  const { values } = input;
  return {
    inputs: input.positionals,
    serverUrl: values.server,
    project: values.project,
    rootPath: values.root ?? null,
    commit: values.commit ?? null,
    branch: values.branch ?? null,
    label: values.label ?? null,
    ciJobUrl: values['ci-job-url'] ?? null,
    idempotencyKey: values['idempotency-key'] ?? null,
    tokenFilePath: values['token-file'] ?? null,
    format: values.format,
    outputPath: values.output ?? null,
    retries: values.retries ?? SUBMIT_DEFAULTS.retries,
    retryDelaySeconds: values['retry-delay'] ?? SUBMIT_DEFAULTS.retryDelaySeconds,
    timeoutSeconds: values.timeout ?? SUBMIT_DEFAULTS.timeoutSeconds,
    isProgressForced: values.progress,
    isDebug: values.debug
  };
}
