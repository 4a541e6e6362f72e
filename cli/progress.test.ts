import { describe, expect, it } from 'vitest';
import { createProgress, type ProgressStream } from './progress';

function recordingStream(isTTY: boolean, columns = 80): ProgressStream & { text: string } {
  const stream = { isTTY, columns, text: '', write: (chunk: string) => (stream.text += chunk) };
  return stream;
}

describe('createProgress', () => {
  it('writes nothing when stderr is not a terminal and progress is not forced', () => {
    const stream = recordingStream(false);
    const progress = createProgress(stream, false);
    progress.step(0, 2, 'chars/hero.glb');
    progress.finish();
    expect(stream.text).toBe('');
  });

  it('writes one plain line per file when forced without a terminal', () => {
    const stream = recordingStream(false);
    const progress = createProgress(stream, true);
    progress.step(0, 2, 'chars/hero.glb');
    progress.step(1, 2, 'props/lantern.gltf');
    progress.finish();
    expect(stream.text).toBe('orientry: [1/2] chars/hero.glb\norientry: [2/2] props/lantern.gltf\n');
  });

  it('redraws one line in place on a terminal and clears it at the end', () => {
    const stream = recordingStream(true);
    const progress = createProgress(stream, false);
    progress.step(0, 1, 'chars/hero.glb');
    progress.finish();
    // \r returns to column 0; ESC[2K (ECMA-48 "erase in line", mode 2) clears the whole line.
    expect(stream.text).toBe('\r\u001b[2K[1/1] chars/hero.glb\r\u001b[2K');
  });

  it('clips a long label to the terminal width so the line never wraps', () => {
    const stream = recordingStream(true, 20);
    createProgress(stream, false).step(0, 1, 'characters/harbor-keeper/keeper.glb');
    const line = stream.text.replace('\r\u001b[2K', '');
    expect(line.length).toBe(19);
    expect(line.endsWith('…')).toBe(true);
  });
});
