/** What a lint thread answers for one job (see lint-worker.ts and lint-thread.ts). */
import type { DiskLintResult } from './lint-file-on-disk';

export type LintThreadAnswer =
  { id: number; result: DiskLintResult } | { id: number; error: { message: string; stack?: string } };
