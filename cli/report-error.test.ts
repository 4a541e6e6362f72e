import { describe, expect, it } from 'vitest';
import { parsePolicy, PolicyError } from '$lib/lint';
import { CliError } from './cli-error';
import { ExitCode } from './exit-codes';
import { reportError } from './report-error';

function capture(error: unknown, isDebug: boolean) {
  let text = '';
  const exitCode = reportError(error, { write: (chunk: string) => (text += chunk) }, 'orientry check', isDebug);
  return { exitCode, text };
}

function policyError(): PolicyError {
  try {
    parsePolicy({ wideArcDegrees: 'wide' });
  } catch (error) {
    if (error instanceof PolicyError) return error;
  }
  throw new Error('expected parsePolicy to reject a string wideArcDegrees');
}

describe('reportError', () => {
  it('prints an expected error as one prefixed line and returns its exit code', () => {
    const error = new CliError('server.unreachable', 'cannot reach the server', ExitCode.ServerUnreachable);
    expect(capture(error, false)).toEqual({
      exitCode: ExitCode.ServerUnreachable,
      text: 'orientry check: cannot reach the server\n'
    });
  });

  it('maps an invalid policy to a usage error naming the field', () => {
    const { exitCode, text } = capture(policyError(), false);
    expect(exitCode).toBe(ExitCode.UsageError);
    expect(text).toContain('policy.wideArcDegrees');
    expect(text.trimEnd().split('\n')).toHaveLength(1);
  });

  it('adds the cause of an expected error only under --debug', () => {
    const error = new CliError('input.unreadable', 'cannot read hero.glb', ExitCode.UsageError, {
      cause: new Error('EACCES: permission denied')
    });
    expect(capture(error, false).text).not.toContain('EACCES');
    expect(capture(error, true).text).toContain('caused by: Error: EACCES');
  });

  it('reports an unexpected error as an internal error, with the stack only under --debug', () => {
    const bug = new TypeError('cannot read properties of undefined');
    const quiet = capture(bug, false);
    expect(quiet.exitCode).toBe(ExitCode.UsageError);
    expect(quiet.text.split('\n')[0]).toBe('orientry: internal error: cannot read properties of undefined');
    expect(quiet.text).not.toContain('    at ');
    expect(capture(bug, true).text).toContain('    at ');
  });
});
