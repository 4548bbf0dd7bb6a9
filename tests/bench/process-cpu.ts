import fs from 'node:fs';

/** Clock ticks per second of /proc's CPU times (`getconf CLK_TCK`; 100 on Linux on x86 and arm). */
const TICKS_PER_S = 100;

/**
 * CPU seconds (user + system) spent so far by a process and every living descendant of it, from
 * /proc (Linux). Under load on a shared machine, latency swings with what else runs; the CPU a
 * request costs the server swings much less, so the benchmark prints both.
 */
export function processTreeCpuSeconds(rootPid: number): number {
  const stats = new Map<number, { parent: number; ticks: number }>();
  for (const entry of fs.readdirSync('/proc')) {
    if (!/^\d+$/.test(entry)) continue;
    let text: string;
    try {
      text = fs.readFileSync(`/proc/${entry}/stat`, 'utf8');
    } catch {
      continue; // ended meanwhile
    }
    const fields = statFields(text);
    stats.set(Number(entry), { parent: Number(fields[1]), ticks: Number(fields[11]) + Number(fields[12]) });
  }
  let ticks = 0;
  const inTree = (pid: number): boolean => {
    for (let p = pid, hops = 0; p > 1 && hops < 64; p = stats.get(p)?.parent ?? 0, hops++) if (p === rootPid) return true;
    return false;
  };
  for (const [pid, { ticks: t }] of stats) if (inTree(pid)) ticks += t;
  return ticks / TICKS_PER_S;
}

/**
 * CPU seconds (user + system) of this process's children that have ended and been waited for
 * (`cutime` + `cstime` in /proc/self/stat): the difference around a child's run is its CPU.
 */
export function waitedChildrenCpuSeconds(): number {
  const fields = statFields(fs.readFileSync('/proc/self/stat', 'utf8'));
  return (Number(fields[13]) + Number(fields[14])) / TICKS_PER_S;
}

/**
 * The fields of a /proc/PID/stat line after the command name, which is in parentheses and may hold
 * spaces: [0] state, [1] ppid, … [11] utime, [12] stime, [13] cutime, [14] cstime (proc(5), less 3).
 */
function statFields(text: string): string[] {
  return text.slice(text.lastIndexOf(')') + 2).split(' ');
}
