// CPU time spent by processes on this machine, read from /proc (Linux), for benches that ask where
// a figure's time went: the API, a job worker, PostgreSQL's backends, the bench itself.
import { readdirSync, readFileSync } from 'node:fs';

/** Linux reports utime and stime in clock ticks; 100 per second on every common kernel (USER_HZ). */
const TICK_MS = 10;

function ticksOf(stat: string): number {
  // the command name may hold spaces or parentheses: fields are counted after its closing ')'
  const fields = stat.slice(stat.lastIndexOf(')') + 2).split(' ');
  return Number(fields[11]) + Number(fields[12]);
}

/** CPU milliseconds (user + system) a process has used since it started; 0 once it has gone. */
export function cpuMsOf(pid: number): number {
  try {
    return ticksOf(readFileSync(`/proc/${pid}/stat`, 'utf8')) * TICK_MS;
  } catch {
    return 0;
  }
}

/** CPU milliseconds used by every live process whose command name is `name` (e.g. each PostgreSQL backend). */
export function cpuMsOfCommand(name: string): number {
  let total = 0;
  for (const entry of readdirSync('/proc')) {
    if (!/^\d+$/.test(entry)) continue;
    try {
      const stat = readFileSync(`/proc/${entry}/stat`, 'utf8');
      if (stat.slice(stat.indexOf('(') + 1, stat.lastIndexOf(')')) === name) total += ticksOf(stat) * TICK_MS;
    } catch {
      // the process ended while the list was read
    }
  }
  return total;
}
