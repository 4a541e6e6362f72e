/**
 * Upload progress of `submit` on stderr (stdout carries the summary or report). On a terminal a
 * bar is redrawn in place; with `--progress` and no terminal, a plain line every tenth of the
 * upload, for CI logs; otherwise just a line when the upload starts and when it is sent.
 */
import type { ProgressStream } from './progress';

/** Follows one upload attempt (a retry starts again). */
export interface UploadProgress {
  /** An attempt starts sending a body of `totalBytes` (files and form headers). */
  start(totalBytes: number): void;
  /** `byteLength` more bytes were handed to the connection. */
  advance(byteLength: number): void;
  /** The whole body is sent; the server is now linting. */
  sent(): void;
  /** Removes the in-place line, if any (before other output, e.g. a retry notice). */
  finish(): void;
}

const PREFIX = 'orientry submit:';
/** A terminal is redrawn at most this often; faster only costs CPU in the terminal. */
const REDRAW_INTERVAL_MS = 100;
const BAR_WIDTH = 24;

/** Progress on `stream`: a bar on a terminal, tenths when forced, else two plain lines. */
export function createUploadProgress(
  stream: ProgressStream,
  isForced: boolean,
  nowMs: () => number = Date.now
): UploadProgress {
  if (stream.isTTY === true) return terminalProgress(stream, nowMs);
  return plainProgress(stream, isForced);
}

function terminalProgress(stream: ProgressStream, nowMs: () => number): UploadProgress {
  let total = 0;
  let done = 0;
  let lastDrawMs = Number.NEGATIVE_INFINITY;
  let hasLine = false;
  // The server may answer (a refusal) while the body is still being pulled: nothing is drawn
  // after finish(), so the answer stays the last thing on the terminal.
  let isActive = false;
  const draw = (text: string) => {
    // Leave the last column free so the terminal never wraps the line.
    const width = Math.max(10, (stream.columns ?? 80) - 1);
    stream.write(`\r\u001b[2K${text.length > width ? `${text.slice(0, width - 1)}…` : text}`);
    hasLine = true;
  };
  const drawBar = () => {
    const fraction = total === 0 ? 1 : Math.min(1, done / total);
    const filled = Math.round(fraction * BAR_WIDTH);
    const bar = `${'#'.repeat(filled)}${'-'.repeat(BAR_WIDTH - filled)}`;
    draw(`[${bar}] ${formatBytes(done)} / ${formatBytes(total)} ${Math.floor(fraction * 100)}%`);
  };
  return {
    start(totalBytes) {
      total = totalBytes;
      done = 0;
      isActive = true;
      lastDrawMs = nowMs();
      drawBar();
    },
    advance(byteLength) {
      if (!isActive) return;
      done += byteLength;
      if (nowMs() - lastDrawMs < REDRAW_INTERVAL_MS) return;
      lastDrawMs = nowMs();
      drawBar();
    },
    sent() {
      if (isActive) draw(`Uploaded ${formatBytes(total)}; the server is linting...`);
    },
    finish() {
      isActive = false;
      if (hasLine) stream.write('\r\u001b[2K');
      hasLine = false;
    }
  };
}

function plainProgress(stream: ProgressStream, isForced: boolean): UploadProgress {
  let total = 0;
  let done = 0;
  let tenthsShown = 0;
  // As in terminalProgress: no line after finish(), so a refusal stays the last line.
  let isActive = false;
  return {
    start(totalBytes) {
      total = totalBytes;
      done = 0;
      tenthsShown = 0;
      isActive = true;
      stream.write(`${PREFIX} sending ${formatBytes(totalBytes)}\n`);
    },
    advance(byteLength) {
      done += byteLength;
      if (!isActive || !isForced || total === 0) return;
      const tenths = Math.min(10, Math.floor((done / total) * 10));
      if (tenths <= tenthsShown || tenths === 10) return;
      tenthsShown = tenths;
      stream.write(`${PREFIX} ${formatBytes(done)} of ${formatBytes(total)} sent (${tenths * 10}%)\n`);
    },
    sent() {
      if (isActive) stream.write(`${PREFIX} uploaded; waiting for the server to lint the build\n`);
    },
    finish() {
      isActive = false;
    }
  };
}

/** `812 B`, `3.4 KiB`, `12.0 MiB`, `1.2 GiB` (binary units). */
export function formatBytes(byteLength: number): string {
  const units = ['B', 'KiB', 'MiB', 'GiB', 'TiB'];
  let value = byteLength;
  let unit = 0;
  while (value >= 1024 && unit < units.length - 1) {
    value /= 1024;
    unit++;
  }
  return unit === 0 ? `${value} B` : `${value.toFixed(1)} ${units[unit]}`;
}
