/**
 * The project API token `submit` authenticates with. It comes from the environment (CI systems
 * keep secrets there and mask them in logs) or a file, never from a flag, which would leave it
 * in shell history and process lists.
 */
import { readFile } from 'node:fs/promises';
import { resolve } from 'node:path';
import { CliError } from './cli-error';
import { ExitCode } from './exit-codes';

/** The environment variable holding the token. */
export const TOKEN_VARIABLE = 'ORIENTRY_TOKEN';

/**
 * The token from `--token-file` when given, else from ORIENTRY_TOKEN, trimmed.
 * @throws CliError (exit 2) `token.missing` saying to set ORIENTRY_TOKEN, `token.unreadable`
 *   for a token file that cannot be read, `token.invalid` for one that is not a single word.
 */
export async function readApiToken(
  tokenFilePath: string | null,
  env: Readonly<Record<string, string | undefined>>,
  cwd: string
): Promise<string> {
  let token: string;
  let source: string;
  if (tokenFilePath !== null) {
    source = tokenFilePath;
    try {
      token = (await readFile(resolve(cwd, tokenFilePath), 'utf8')).trim();
    } catch (error) {
      const reason = (error as { code?: string }).code ?? (error as Error).message;
      throw new CliError(
        'token.unreadable',
        `${tokenFilePath}: cannot read the token file (${reason})`,
        ExitCode.UsageError,
        {
          cause: error
        }
      );
    }
  } else {
    source = TOKEN_VARIABLE;
    token = env[TOKEN_VARIABLE]?.trim() ?? '';
  }
  if (token === '') {
    throw new CliError(
      'token.missing',
      `no API token: set ${TOKEN_VARIABLE} to the project's API token (a project lead creates one in the project settings)` +
        (tokenFilePath === null ? '' : `; ${tokenFilePath} is empty`),
      ExitCode.UsageError
    );
  }
  if (/\s/.test(token)) {
    throw new CliError(
      'token.invalid',
      `${source}: the API token must be one word without spaces or line breaks; copy the token again`,
      ExitCode.UsageError
    );
  }
  return token;
}
