/**
 * Memory readings for the fuzz tests: this process's heap after a full garbage collection (to
 * see what a run keeps), its resident set sampled as it goes (to see the peak), and another
 * process's peak resident set from Linux's `/proc/<pid>/status` (VmHWM, proc(5)).
 */
import fs from 'node:fs';
import v8 from 'node:v8';
import vm from 'node:vm';

let collect: (() => void) | undefined;

/**
 * Runs a full garbage collection. Node exposes `gc` only with --expose-gc; setting the flag at
 * run time and taking `gc` from a fresh context is the documented V8 way to get it afterwards.
 */
export function collectGarbage(): void {
  if (!collect) {
    v8.setFlagsFromString('--expose-gc');
    collect = vm.runInNewContext('gc') as () => void;
  }
  collect();
}

/** Heap bytes in use after a full collection: what the process keeps. */
export function retainedHeapBytes(): number {
  collectGarbage();
  collectGarbage();
  return process.memoryUsage().heapUsed;
}

/** Peak resident set of process `pid` in bytes (VmHWM), or null when /proc does not say. */
export function peakRssBytesOf(pid: number): number | null {
  const status = fs.readFileSync(`/proc/${pid}/status`, 'utf8');
  const match = /^VmHWM:\s+(\d+)\s+kB$/m.exec(status);
  return match ? Number(match[1]) * 1024 : null;
}

/** Current resident set of process `pid` in bytes (VmRSS), or null when /proc does not say. */
export function rssBytesOf(pid: number): number | null {
  const status = fs.readFileSync(`/proc/${pid}/status`, 'utf8');
  const match = /^VmRSS:\s+(\d+)\s+kB$/m.exec(status);
  return match ? Number(match[1]) * 1024 : null;
}
