import { describe, expect, it } from 'vitest';
import { submitCommand } from './submit-command';

describe('submitCommand', () => {
  it('names the assets, the server and the project, one per line', () => {
    expect(submitCommand('https://orientry.lanternfish.example', 'tidewatch').split('\n')).toEqual([
      'orientry submit "export/**/*.glb" \\',
      '  --server https://orientry.lanternfish.example \\',
      '  --project tidewatch'
    ]);
  });

  it('quotes the glob so the shell leaves it to the tool', () => {
    expect(submitCommand('http://localhost:3000', 'harbour-props')).toContain('"export/**/*.glb"');
  });

  it('continues every line but the last with a backslash', () => {
    const lines = submitCommand('http://localhost:3000', 'x').split('\n');
    expect(lines.slice(0, -1).every((line) => line.endsWith(' \\'))).toBe(true);
    expect(lines.at(-1)?.endsWith('\\')).toBe(false);
  });

  it('never contains a token', () => {
    expect(submitCommand('http://localhost:3000', 'x')).not.toMatch(/token/i);
  });
});
