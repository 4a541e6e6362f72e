import { describe, expect, it } from 'vitest';
import { submitCommand } from './submit-command';

describe('submitCommand', () => {
  it('names the server and the project, one option per line', () => {
    const lines = submitCommand('https://orientry.lanternfish.example', 'tidewatch').split('\n');
    expect(lines[0]).toBe('orientry submit \\');
    expect(lines).toContain('  --server https://orientry.lanternfish.example \\');
    expect(lines).toContain('  --project tidewatch \\');
  });

  it('keeps branch and commit as CI variables and quotes the glob so the shell leaves it to the tool', () => {
    const command = submitCommand('http://localhost:3000', 'harbour-props');
    expect(command).toContain('--branch "$CI_BRANCH" --commit "$CI_COMMIT"');
    expect(command).toMatch(/"export\/\*\*\/\*\.glb"$/);
  });

  it('continues every line but the last with a backslash', () => {
    const lines = submitCommand('http://localhost:3000', 'x').split('\n');
    expect(lines.slice(0, -1).every((line) => line.endsWith(' \\'))).toBe(true);
    expect(lines.at(-1)?.endsWith('\\')).toBe(false);
  });

  it('never contains a token value', () => {
    expect(submitCommand('http://localhost:3000', 'x')).not.toMatch(/ORIENTRY_TOKEN=\S/);
  });
});
