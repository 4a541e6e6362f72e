import { describe, expect, it } from 'vitest';
import {
  COMMANDS,
  parseCommandLine,
  POLICY_DOCS_PATH,
  type CheckOptions,
  type FixOptions,
  type SubmitOptions
} from './args';
import { CliError } from './cli-error';
import { ExitCode } from './exit-codes';
import { formatCommandHelp, formatMainHelp } from './help';

const CHECK_DEFAULTS: CheckOptions = {
  inputs: [],
  policyPath: null,
  format: 'text',
  outputPath: null,
  failOn: null,
  isProgressForced: false,
  isDebug: false
};

const FIX_DEFAULTS: FixOptions = {
  inputPath: '',
  outputPath: null,
  rules: null,
  policyPath: null,
  isInPlace: false,
  isDebug: false
};

const SUBMIT_DEFAULTS: SubmitOptions = {
  inputs: ['build'],
  serverUrl: 'https://orientry.lanternfish.example/',
  project: 'tidewatch',
  rootPath: null,
  commit: null,
  branch: null,
  label: null,
  ciJobUrl: null,
  idempotencyKey: null,
  tokenFilePath: null,
  format: 'text',
  outputPath: null,
  retries: 4,
  retryDelaySeconds: 1,
  timeoutSeconds: 600,
  isProgressForced: false,
  isDebug: false
};

const SUBMIT_REQUIRED = ['--server', 'https://orientry.lanternfish.example', '--project', 'tidewatch'];

describe('parseCommandLine', () => {
  const accepted: { name: string; argv: string[]; expected: ReturnType<typeof parseCommandLine> }[] = [
    { name: 'top-level --help', argv: ['--help'], expected: { kind: 'help', command: null } },
    { name: 'top-level -h', argv: ['-h'], expected: { kind: 'help', command: null } },
    { name: '--version', argv: ['--version'], expected: { kind: 'version' } },
    { name: '-V', argv: ['-V'], expected: { kind: 'version' } },
    { name: 'help for a command', argv: ['help', 'fix'], expected: { kind: 'help', command: 'fix' } },
    {
      name: 'check --help wins over missing files',
      argv: ['check', '--help'],
      expected: { kind: 'help', command: 'check' }
    },
    {
      name: 'check with one folder and defaults',
      argv: ['check', 'build'],
      expected: { kind: 'check', options: { ...CHECK_DEFAULTS, inputs: ['build'] } }
    },
    {
      name: 'check with every option',
      argv: [
        'check',
        'a.glb',
        'chars/**/*.gltf',
        '--policy',
        'policy.json',
        '--format=sarif',
        '-o',
        'out.sarif',
        '--fail-on',
        'warning',
        '--progress',
        '--debug'
      ],
      expected: {
        kind: 'check',
        options: {
          inputs: ['a.glb', 'chars/**/*.gltf'],
          policyPath: 'policy.json',
          format: 'sarif',
          outputPath: 'out.sarif',
          failOn: 'warning',
          isProgressForced: true,
          isDebug: true
        }
      }
    },
    {
      name: 'check with a file after "--" that starts with a dash',
      argv: ['check', '--format', 'json', '--', '-odd.glb'],
      expected: { kind: 'check', options: { ...CHECK_DEFAULTS, inputs: ['-odd.glb'], format: 'json' } }
    },
    {
      name: 'fix with -o',
      argv: ['fix', 'hero.glb', '-o', 'hero.fixed.glb'],
      expected: { kind: 'fix', options: { ...FIX_DEFAULTS, inputPath: 'hero.glb', outputPath: 'hero.fixed.glb' } }
    },
    {
      name: 'fix with rules (spaces and repeats tolerated) and a policy',
      argv: [
        'fix',
        'hero.gltf',
        '--output',
        'out/hero.gltf',
        '--rules',
        'unit-drift, hemisphere-jump,unit-drift',
        '--policy',
        'p.json'
      ],
      expected: {
        kind: 'fix',
        options: {
          ...FIX_DEFAULTS,
          inputPath: 'hero.gltf',
          outputPath: 'out/hero.gltf',
          rules: ['unit-drift', 'hemisphere-jump'],
          policyPath: 'p.json'
        }
      }
    },
    {
      name: 'fix --in-place without -o',
      argv: ['fix', 'hero.glb', '--in-place'],
      expected: { kind: 'fix', options: { ...FIX_DEFAULTS, inputPath: 'hero.glb', isInPlace: true } }
    },
    {
      name: 'submit with the server and project only',
      argv: ['submit', 'build', ...SUBMIT_REQUIRED],
      expected: { kind: 'submit', options: SUBMIT_DEFAULTS }
    },
    {
      name: 'submit with a server under a path prefix',
      argv: ['submit', 'build', '--server', 'http://ci.example:8080/orientry', '--project', 'tidewatch'],
      expected: { kind: 'submit', options: { ...SUBMIT_DEFAULTS, serverUrl: 'http://ci.example:8080/orientry' } }
    },
    {
      name: 'submit with every option (an upper-case commit lowered)',
      argv: [
        'submit',
        'chars',
        'props/**/*.glb',
        ...SUBMIT_REQUIRED,
        '--root',
        'export',
        '--commit',
        '3F2A9C1D',
        '--branch',
        'feature/lantern-arm',
        '--label',
        '#1482',
        '--ci-job-url',
        'https://ci.lanternfish.example/jobs/1482',
        '--idempotency-key',
        'tidewatch-1482',
        '--token-file',
        'secrets/orientry-token',
        '--format',
        'junit',
        '-o',
        'reports/orientry.xml',
        '--retries',
        '0',
        '--retry-delay',
        '0.25',
        '--timeout',
        '90',
        '--progress',
        '--debug'
      ],
      expected: {
        kind: 'submit',
        options: {
          inputs: ['chars', 'props/**/*.glb'],
          serverUrl: 'https://orientry.lanternfish.example/',
          project: 'tidewatch',
          rootPath: 'export',
          commit: '3f2a9c1d',
          branch: 'feature/lantern-arm',
          label: '#1482',
          ciJobUrl: 'https://ci.lanternfish.example/jobs/1482',
          idempotencyKey: 'tidewatch-1482',
          tokenFilePath: 'secrets/orientry-token',
          format: 'junit',
          outputPath: 'reports/orientry.xml',
          retries: 0,
          retryDelaySeconds: 0.25,
          timeoutSeconds: 90,
          isProgressForced: true,
          isDebug: true
        }
      }
    }
  ];

  for (const { name, argv, expected } of accepted) {
    it(`accepts ${name}`, () => {
      expect(parseCommandLine(argv)).toEqual(expected);
    });
  }

  const rejected: { name: string; argv: string[]; code: string; mentions: string }[] = [
    { name: 'no command', argv: [], code: 'args.no-command', mentions: 'no command' },
    { name: 'an unknown command', argv: ['lint', 'a.glb'], code: 'args.unknown-command', mentions: '"lint"' },
    {
      name: 'an unknown option',
      argv: ['check', 'a.glb', '--frmat', 'json'],
      code: 'args.invalid',
      mentions: '--frmat'
    },
    { name: 'an unknown short option', argv: ['check', 'a.glb', '-x'], code: 'args.invalid', mentions: '-x' },
    {
      name: 'a missing option value',
      argv: ['check', 'a.glb', '--format'],
      code: 'args.invalid',
      mentions: '--format'
    },
    {
      name: 'a value on a flag',
      argv: ['check', 'a.glb', '--progress=yes'],
      code: 'args.invalid',
      mentions: '--progress'
    },
    { name: 'an unknown format', argv: ['check', 'a.glb', '--format', 'xml'], code: 'args.invalid', mentions: '"xml"' },
    {
      name: 'an unknown severity',
      argv: ['check', 'a.glb', '--fail-on', 'fatal'],
      code: 'args.invalid',
      mentions: '--fail-on'
    },
    { name: 'an empty policy path', argv: ['check', 'a.glb', '--policy='], code: 'args.invalid', mentions: '--policy' },
    {
      name: 'check without files',
      argv: ['check', '--format', 'json'],
      code: 'args.invalid',
      mentions: 'at least one'
    },
    { name: 'fix without an output', argv: ['fix', 'hero.glb'], code: 'args.invalid', mentions: '--in-place' },
    {
      name: 'fix with two inputs',
      argv: ['fix', 'a.glb', 'b.glb', '-o', 'c.glb'],
      code: 'args.invalid',
      mentions: 'exactly one'
    },
    {
      name: 'fix with an unknown rule',
      argv: ['fix', 'a.glb', '-o', 'b.glb', '--rules', 'spin'],
      code: 'args.invalid',
      mentions: '"spin"'
    },
    {
      name: 'fix with an empty rule list',
      argv: ['fix', 'a.glb', '-o', 'b.glb', '--rules', ' , '],
      code: 'args.invalid',
      mentions: '--rules'
    },
    {
      name: 'submit without a server',
      argv: ['submit', 'build', '--project', 'tidewatch'],
      code: 'args.invalid',
      mentions: '--server'
    },
    {
      name: 'submit without a project',
      argv: ['submit', 'build', '--server', 'https://orientry.example'],
      code: 'args.invalid',
      mentions: '--project'
    },
    {
      name: 'submit without files',
      argv: ['submit', ...SUBMIT_REQUIRED],
      code: 'args.invalid',
      mentions: 'at least one'
    },
    {
      name: 'submit to a server that is not http(s)',
      argv: ['submit', 'build', '--server', 'ftp://orientry.example', '--project', 'tidewatch'],
      code: 'args.invalid',
      mentions: '--server'
    },
    {
      name: 'submit to a project slug with capitals',
      argv: ['submit', 'build', '--server', 'https://orientry.example', '--project', 'Tidewatch'],
      code: 'args.invalid',
      mentions: '--project'
    },
    {
      name: 'submit with a commit that is not hex',
      argv: ['submit', 'build', ...SUBMIT_REQUIRED, '--commit', 'HEAD'],
      code: 'args.invalid',
      mentions: '--commit'
    },
    {
      name: 'submit with a negative retry count',
      argv: ['submit', 'build', ...SUBMIT_REQUIRED, '--retries', '-1'],
      code: 'args.invalid',
      mentions: '--retries'
    },
    {
      name: 'submit with too many retries',
      argv: ['submit', 'build', ...SUBMIT_REQUIRED, '--retries', '50'],
      code: 'args.invalid',
      mentions: 'at most 20'
    },
    {
      name: 'submit with a zero timeout',
      argv: ['submit', 'build', ...SUBMIT_REQUIRED, '--timeout', '0'],
      code: 'args.invalid',
      mentions: '--timeout'
    },
    {
      name: 'submit with a job URL that is not a URL',
      argv: ['submit', 'build', ...SUBMIT_REQUIRED, '--ci-job-url', 'job 1482'],
      code: 'args.invalid',
      mentions: '--ci-job-url'
    },
    {
      name: 'submit with a label holding a line break',
      argv: ['submit', 'build', ...SUBMIT_REQUIRED, '--label', 'a\nb'],
      code: 'args.invalid',
      mentions: 'control characters'
    },
    {
      name: 'submit --output with the text format',
      argv: ['submit', 'build', ...SUBMIT_REQUIRED, '-o', 'summary.txt'],
      code: 'args.invalid',
      mentions: '--output'
    },
    {
      name: 'a token given as an option (tokens come from the environment)',
      argv: ['submit', 'build', ...SUBMIT_REQUIRED, '--token', 'ort_secret'],
      code: 'args.invalid',
      mentions: '--token'
    },
    {
      name: 'a check-only option on fix',
      argv: ['fix', 'a.glb', '-o', 'b.glb', '--format', 'json'],
      code: 'args.invalid',
      mentions: '--format'
    }
  ];

  for (const { name, argv, code, mentions } of rejected) {
    it(`rejects ${name} with a one-line usage error`, () => {
      let caught: unknown;
      try {
        parseCommandLine(argv);
      } catch (error) {
        caught = error;
      }
      expect(caught).toBeInstanceOf(CliError);
      const error = caught as CliError;
      expect(error.code).toBe(code);
      expect(error.exitCode).toBe(ExitCode.UsageError);
      expect(error.message).toContain(mentions);
      expect(error.message).not.toContain('\n');
    });
  }
});

describe('help', () => {
  it('lists every option of a command from the option table', () => {
    for (const spec of Object.values(COMMANDS)) {
      const help = formatCommandHelp(spec);
      for (const option of spec.options) expect(help).toContain(`--${option.name}`);
      expect(help).toContain(`Usage: orientry ${spec.usage}`);
    }
  });

  it('points at the policy documentation from the --policy option', () => {
    expect(formatCommandHelp(COMMANDS.check)).toContain(POLICY_DOCS_PATH);
    expect(formatCommandHelp(COMMANDS.fix)).toContain(POLICY_DOCS_PATH);
  });

  it('names every command in the main help', () => {
    const help = formatMainHelp();
    for (const name of Object.keys(COMMANDS)) expect(help).toContain(`  ${name} `);
  });
});
