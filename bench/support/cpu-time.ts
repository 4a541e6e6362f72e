/**
 * CPU time from Linux's /proc, for benches whose work is split over processes: wall clock on a
 * busy machine depends on what else runs, CPU time much less. Fields 14-17 of /proc/<pid>/stat
 * are utime, stime, cutime and cstime in clock ticks (proc(5)); 100 ticks per second is the
 * common Linux setting (sysconf(_SC_CLK_TCK)), assumed here. Null where /proc is missing.
 */
import fs from 'node:fs';

const TICKS_PER_SECOND = 100;

/** CPU milliseconds used by process `pid` itself so far (user + system). */
export function processCpuMs(pid: number): number | null {
  const fields = statFields(pid);
  return fields === null ? null : ((fields[13] + fields[14]) * 1000) / TICKS_PER_SECOND;
}

/** CPU milliseconds of this process's children that have exited and been waited for. */
export function exitedChildrenCpuMs(): number | null {
  const fields = statFields(process.pid);
  return fields === null ? null : ((fields[15] + fields[16]) * 1000) / TICKS_PER_SECOND;
}

/** The numeric fields of /proc/<pid>/stat, indexed from 0 (field 1 is the pid). */
function statFields(pid: number): number[] | null {
  let text: string;
  try {
    text = fs.readFileSync(`/proc/${pid}/stat`, 'utf8');
  } catch (error) {
    // No /proc (not Linux) or the process is gone: the bench then shows no CPU figures.
    if (process.env.DEBUG) console.debug(`no /proc/${pid}/stat`, error);
    return null;
  }
  // Field 2 is the command in parentheses and may hold spaces: split after its closing one.
  const rest = text.slice(text.lastIndexOf(')') + 2).split(' ');
  return [pid, 0, ...rest.map(Number)];
}
