/**
 * Help text for `orientry` and each command, generated from the command table in args.ts so an
 * option is never documented twice.
 */
import { COMMANDS, COMMAND_NAMES, type CommandSpec, type OptionSpec } from './args';

/** Help lines stay within a common terminal width. */
const LINE_WIDTH = 100;

/** Help for `orientry --help`: the commands and where to read more. */
export function formatMainHelp(): string {
  const width = Math.max(...COMMAND_NAMES.map((name) => name.length)) + 2;
  const lines = [
    'Usage: orientry <command> [options]',
    '',
    'Lints the rotations in glTF 2.0 assets: drifting quaternions, hemisphere jumps, baked basis corrections,',
    'gimbal-lock traps and more.',
    '',
    'Commands:',
    ...COMMAND_NAMES.map((name) => `  ${name.padEnd(width)}${COMMANDS[name].summary}`),
    '',
    'Options:',
    '  -h, --help     Show this help (orientry <command> --help for a command).',
    '  -V, --version  Show the Orientry and lint engine versions.'
  ];
  return lines.join('\n') + '\n';
}

/** Help for `orientry <command> --help`: usage, every option, notes. */
export function formatCommandHelp(spec: CommandSpec): string {
  const labels = spec.options.map(optionLabel);
  const width = Math.max(...labels.map((label) => label.length)) + 2;
  const lines = [
    `Usage: orientry ${spec.usage}`,
    '',
    spec.summary,
    '',
    'Options:',
    ...spec.options.flatMap((option, index) =>
      wrap(option.description, LINE_WIDTH - width - 2).map(
        (line, lineIndex) => `  ${(lineIndex === 0 ? labels[index] : '').padEnd(width)}${line}`
      )
    ),
    '',
    ...spec.notes.flatMap((note) => [...wrap(note, LINE_WIDTH), ''])
  ];
  return lines.join('\n').trimEnd() + '\n';
}

/** Splits text into lines of at most `width` characters at spaces (a longer word keeps its own line). */
function wrap(text: string, width: number): string[] {
  const lines: string[] = [];
  let line = '';
  for (const word of text.split(' ')) {
    if (line && line.length + 1 + word.length > width) {
      lines.push(line);
      line = word;
    } else {
      line = line ? `${line} ${word}` : word;
    }
  }
  lines.push(line);
  return lines;
}

/** `-o, --output <file>` or `    --debug`: short aliases line up in their own column. */
function optionLabel(option: OptionSpec): string {
  const short = option.short ? `-${option.short}, ` : '    ';
  const value = option.type === 'string' ? ` <${option.valueName ?? 'value'}>` : '';
  return `${short}--${option.name}${value}`;
}
