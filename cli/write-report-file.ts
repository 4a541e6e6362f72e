import { mkdir, writeFile } from 'node:fs/promises';
import { dirname } from 'node:path';
import { CliError } from './cli-error';
import { ExitCode } from './exit-codes';

/**
 * Writes a report for `--output`, creating its folder. Used by `check` and `submit`.
 * @param shownPath the path as the user typed it, for the message.
 * @throws CliError `output.unwritable` (exit 2) with the file system's reason.
 */
export async function writeReportFile(absolutePath: string, text: string, shownPath: string): Promise<void> {
  try {
    await mkdir(dirname(absolutePath), { recursive: true });
    await writeFile(absolutePath, text);
  } catch (error) {
    const reason = (error as { code?: string }).code ?? (error as Error).message;
    throw new CliError('output.unwritable', `${shownPath}: cannot write the report (${reason})`, ExitCode.UsageError, {
      cause: error
    });
  }
}
