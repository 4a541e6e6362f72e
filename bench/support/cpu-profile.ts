import path from 'node:path';

/**
 * Node arguments that make a child process write V8 CPU profiles (its worker threads' too) into
 * `$BENCH_PROFILE/<subfolder>` when BENCH_PROFILE is set, for finding where a benchmark's time
 * goes; none otherwise. Open the `.cpuprofile` files in Chromium's DevTools (Performance).
 */
export function cpuProfileArgs(subfolder = ''): string[] {
  const folder = process.env.BENCH_PROFILE;
  return folder ? ['--cpu-prof', `--cpu-prof-dir=${path.resolve(folder, subfolder)}`] : [];
}
