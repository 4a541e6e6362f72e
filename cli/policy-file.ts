/**
 * Reads a policy file given with `--policy`: JSON validated by the lint library's schema,
 * whose doc comments in src/lib/lint/policy.ts describe every field and default.
 */
import { readFile } from 'node:fs/promises';
import { resolve } from 'node:path';
import { defaultPolicy, parsePolicy, PolicyError, type Policy } from '$lib/lint';
import { CliError } from './cli-error';
import { ExitCode } from './exit-codes';

/**
 * The policy at `path` (relative to `cwd`), or the built-in default when `path` is null.
 * @throws CliError `policy.unreadable`, `policy.json-invalid` or `policy.invalid` (exit code 2);
 *   the last names the bad field, e.g. `policy.tolerances.unitWarning: ...`.
 */
export async function loadPolicy(path: string | null, cwd: string): Promise<Policy> {
  if (path === null) return defaultPolicy();
  let text: string;
  try {
    text = await readFile(resolve(cwd, path), 'utf8');
  } catch (error) {
    const reason = (error as { code?: string }).code ?? (error as Error).message;
    throw new CliError('policy.unreadable', `${path}: cannot read the policy file (${reason})`, ExitCode.UsageError, {
      cause: error
    });
  }
  let json: unknown;
  try {
    json = JSON.parse(text);
  } catch (error) {
    throw new CliError(
      'policy.json-invalid',
      `${path}: the policy is not valid JSON (${(error as Error).message}); fix the file or drop --policy`,
      ExitCode.UsageError,
      { cause: error }
    );
  }
  try {
    return parsePolicy(json);
  } catch (error) {
    if (!(error instanceof PolicyError)) throw error;
    throw new CliError(error.code, `${path}: ${error.message}`, ExitCode.UsageError, { cause: error });
  }
}
