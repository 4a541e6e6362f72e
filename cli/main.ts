/**
 * Entry point of `orientry`: parses the command line, runs one command and maps every outcome
 * to an exit code. Expected failures (CliError, PolicyError) print one line on stderr; anything
 * else is a bug and prints "orientry: internal error: ...", with the stack under --debug.
 *
 * Commands are imported when they run: `submit` never needs the lint engine (gltf-transform and
 * the rules), and loading it cost every submit about 40 ms before the first byte left. The bundle
 * stays one file; esbuild only starts a dynamically imported module when it is imported.
 */
import { ENGINE_VERSION } from '$lib/lint/version';
import { version as packageVersion } from '../package.json';
import { COMMAND_NAMES, COMMANDS, parseCommandLine, type Invocation } from './args';
import type { CommandContext } from './command-context';
import { ExitCode } from './exit-codes';
import { formatCommandHelp, formatMainHelp } from './help';
import { reportError } from './report-error';

/** Runs the command line `argv` (without node and script) and resolves to the exit code. */
async function main(argv: readonly string[], context: CommandContext): Promise<ExitCode> {
  const isDebug = argv.includes('--debug');
  const command = COMMAND_NAMES.find((name) => name === argv[0]);
  try {
    return await run(parseCommandLine(argv), context);
  } catch (error) {
    return reportError(error, context.stderr, command ? `orientry ${command}` : 'orientry', isDebug);
  }
}

async function run(invocation: Invocation, context: CommandContext): Promise<ExitCode> {
  switch (invocation.kind) {
    case 'help':
      context.stdout.write(invocation.command ? formatCommandHelp(COMMANDS[invocation.command]) : formatMainHelp());
      return ExitCode.Pass;
    case 'version':
      context.stdout.write(`orientry ${packageVersion} (lint engine ${ENGINE_VERSION})\n`);
      return ExitCode.Pass;
    case 'check':
      return (await import('./commands/check')).check(invocation.options, context);
    case 'fix':
      return (await import('./commands/fix')).fix(invocation.options, context);
    case 'submit':
      return (await import('./commands/submit')).submit(invocation.options, context);
  }
}

// A reader that closes the pipe early (`orientry check ... | head`) wants no more output; the
// verdict still travels in the exit code, so dropping the rest of the report is safe.
process.stdout.on('error', (error: NodeJS.ErrnoException) => {
  if (error.code !== 'EPIPE') throw error;
});

const isColorAllowed = process.stdout.isTTY === true && !process.env.NO_COLOR;
process.exitCode = await main(process.argv.slice(2), {
  cwd: process.cwd(),
  stdout: process.stdout,
  stderr: process.stderr,
  isColorAllowed,
  env: process.env
});
