import { mkdtemp, rm, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { readApiToken } from './api-token';
import { CliError } from './cli-error';
import { ExitCode } from './exit-codes';

let folder: string;

beforeAll(async () => {
  folder = await mkdtemp(join(tmpdir(), 'orientry-token-'));
  await writeFile(join(folder, 'token'), 'ort_fromfile\n');
  await writeFile(join(folder, 'empty'), '\n');
  await writeFile(join(folder, 'two-words'), 'ort_a ort_b');
});
afterAll(async () => {
  await rm(folder, { recursive: true, force: true });
});

async function failureOf(promise: Promise<unknown>): Promise<CliError> {
  const failure = await promise.catch((error: unknown) => error);
  expect(failure).toBeInstanceOf(CliError);
  expect((failure as CliError).exitCode).toBe(ExitCode.UsageError);
  return failure as CliError;
}

describe('readApiToken', () => {
  it('reads ORIENTRY_TOKEN, trimmed', async () => {
    expect(await readApiToken(null, { ORIENTRY_TOKEN: ' ort_secret\n' }, folder)).toBe('ort_secret');
  });

  it('prefers --token-file, read relative to the working folder', async () => {
    expect(await readApiToken('token', { ORIENTRY_TOKEN: 'ort_env' }, folder)).toBe('ort_fromfile');
  });

  it('says to set ORIENTRY_TOKEN when it is missing or blank', async () => {
    for (const env of [{}, { ORIENTRY_TOKEN: '  ' }]) {
      const failure = await failureOf(readApiToken(null, env, folder));
      expect(failure.code).toBe('token.missing');
      expect(failure.message).toContain('set ORIENTRY_TOKEN');
    }
  });

  it('names an empty token file', async () => {
    const failure = await failureOf(readApiToken('empty', {}, folder));
    expect(failure.code).toBe('token.missing');
    expect(failure.message).toContain('empty is empty');
  });

  it('names a token file that cannot be read, with the reason', async () => {
    const failure = await failureOf(readApiToken('missing', {}, folder));
    expect(failure.code).toBe('token.unreadable');
    expect(failure.message).toContain('ENOENT');
  });

  it('refuses a token with spaces inside', async () => {
    const failure = await failureOf(readApiToken('two-words', {}, folder));
    expect(failure.code).toBe('token.invalid');
  });
});
