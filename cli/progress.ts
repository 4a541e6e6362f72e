/**
 * Progress for long runs, on stderr only: stdout carries the report and must stay parseable.
 * Shown when stderr is a terminal (one line redrawn in place, cleared at the end) or when
 * `--progress` forces it (one plain line per file, for CI logs).
 */

/** The part of a stream progress needs; process.stderr fits. */
export interface ProgressStream {
  write(text: string): unknown;
  isTTY?: boolean;
  columns?: number;
}

/** Reports which file is being worked on. */
export interface Progress {
  /** Called before file `index` (0-based) of `total` starts. */
  step(index: number, total: number, label: string): void;
  /** Removes the in-place line, if any. */
  finish(): void;
}

const SILENT: Progress = { step: () => undefined, finish: () => undefined };

/** Progress on `stream`, or a silent one when it is neither a terminal nor forced. */
export function createProgress(stream: ProgressStream, isForced: boolean): Progress {
  if (stream.isTTY === true) return createTerminalProgress(stream);
  if (isForced) {
    return {
      step: (index, total, label) => stream.write(`orientry: [${index + 1}/${total}] ${label}\n`),
      finish: () => undefined
    };
  }
  return SILENT;
}

function createTerminalProgress(stream: ProgressStream): Progress {
  let hasLine = false;
  return {
    step(index, total, label) {
      const text = `[${index + 1}/${total}] ${label}`;
      // Leave the last column free so the terminal never wraps the line.
      const width = Math.max(10, (stream.columns ?? 80) - 1);
      const clipped = text.length > width ? `${text.slice(0, width - 1)}…` : text;
      stream.write(`\r\u001b[2K${clipped}`);
      hasLine = true;
    },
    finish() {
      if (hasLine) stream.write('\r\u001b[2K');
      hasLine = false;
    }
  };
}
