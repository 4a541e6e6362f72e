import { describe, expect, it } from 'vitest';
import type { ProgressStream } from './progress';
import { createUploadProgress, formatBytes } from './upload-progress';

function recordingStream(isTTY: boolean, columns = 80): ProgressStream & { text: string } {
  const stream = { isTTY, columns, text: '', write: (chunk: string) => (stream.text += chunk) };
  return stream;
}

const MIB = 1024 * 1024;

describe('createUploadProgress', () => {
  it('writes a start and a sent line without a terminal when progress is not forced', () => {
    const stream = recordingStream(false);
    const progress = createUploadProgress(stream, false);
    progress.start(10 * MIB);
    for (let step = 0; step < 10; step++) progress.advance(MIB);
    progress.sent();
    progress.finish();
    expect(stream.text).toBe(
      'orientry submit: sending 10.0 MiB\n' + 'orientry submit: uploaded; waiting for the server to lint the build\n'
    );
  });

  it('writes nothing after finish, when the server answered before the body was fully sent', () => {
    for (const isTTY of [false, true]) {
      const stream = recordingStream(isTTY);
      const progress = createUploadProgress(stream, true, () => 0);
      progress.start(10 * MIB);
      progress.advance(MIB);
      progress.finish();
      const before = stream.text;
      progress.advance(9 * MIB);
      progress.sent();
      expect(stream.text).toBe(before);
    }
  });

  it('adds a plain line per tenth of the upload when forced without a terminal', () => {
    const stream = recordingStream(false);
    const progress = createUploadProgress(stream, true);
    progress.start(10 * MIB);
    progress.advance(2.5 * MIB);
    progress.advance(0.1 * MIB);
    progress.advance(7.4 * MIB);
    progress.sent();
    const lines = stream.text.trimEnd().split('\n');
    expect(lines).toEqual([
      'orientry submit: sending 10.0 MiB',
      'orientry submit: 2.5 MiB of 10.0 MiB sent (20%)',
      'orientry submit: uploaded; waiting for the server to lint the build'
    ]);
  });

  it('draws a bar in place on a terminal, at most every 100 ms, and clears it at the end', () => {
    const stream = recordingStream(true);
    let now = 0;
    const progress = createUploadProgress(stream, false, () => now);
    progress.start(4 * MIB);
    progress.advance(MIB);
    now = 50;
    progress.advance(MIB);
    now = 150;
    progress.advance(MIB);
    progress.finish();
    // \r returns to column 0; ESC[2K (ECMA-48 "erase in line", mode 2) clears the whole line.
    const frames = stream.text.split('\r\u001b[2K').filter(Boolean);
    expect(frames).toEqual([
      '[------------------------] 0 B / 4.0 MiB 0%',
      '[##################------] 3.0 MiB / 4.0 MiB 75%'
    ]);
    expect(stream.text.endsWith('\r\u001b[2K')).toBe(true);
  });

  it('restarts from zero when a retry starts the upload again', () => {
    const stream = recordingStream(false);
    const progress = createUploadProgress(stream, true);
    progress.start(MIB);
    progress.advance(0.5 * MIB);
    progress.start(MIB);
    progress.advance(0.3 * MIB);
    expect(stream.text.trimEnd().split('\n').at(-1)).toBe('orientry submit: 307.2 KiB of 1.0 MiB sent (30%)');
  });
});

describe('formatBytes', () => {
  // Binary prefixes (IEC 80000-13): 1 KiB = 1024 B.
  const rows: [number, string][] = [
    [0, '0 B'],
    [1023, '1023 B'],
    [1024, '1.0 KiB'],
    [1536, '1.5 KiB'],
    [5 * MIB, '5.0 MiB'],
    [1024 * MIB * 1.25, '1.3 GiB']
  ];
  for (const [byteLength, expected] of rows) {
    it(`writes ${byteLength} bytes as ${expected}`, () => expect(formatBytes(byteLength)).toBe(expected));
  }
});
