// CPU time of processes on this machine, from /proc, so a benchmark can say which process was busy.
import { readFileSync, readdirSync } from 'node:fs';

const TICKS_PER_S = 100; // USER_HZ on Linux

/** utime + stime of one process, in seconds; 0 when it is gone. */
export function cpuSeconds(pid: number): number {
  try {
    const stat = readFileSync(`/proc/${pid}/stat`, 'utf8');
    const fields = stat.slice(stat.lastIndexOf(')') + 2).split(' ');
    return (Number(fields[11]) + Number(fields[12])) / TICKS_PER_S; // fields 14 and 15 of stat(5)
  } catch {
    return 0;
  }
}

/** A PostgreSQL postmaster and its children (backends, WAL writer, …). */
export function clusterPids(dataDir: string): number[] {
  const postmaster = Number(readFileSync(`${dataDir}/postmaster.pid`, 'utf8').split('\n')[0]);
  const children = readdirSync('/proc')
    .filter((d) => /^\d+$/.test(d))
    .filter((d) => {
      try {
        const stat = readFileSync(`/proc/${d}/stat`, 'utf8');
        return Number(stat.slice(stat.lastIndexOf(')') + 2).split(' ')[1]) === postmaster;
      } catch {
        return false;
      }
    })
    .map(Number);
  return [postmaster, ...children];
}

/** Starts a CPU meter over named process groups; stop() gives each group's share of one core, in %. */
export function cpuMeter(groups: Record<string, () => number[]>) {
  const started = Date.now();
  const sum = (pids: number[]) => pids.reduce((s, p) => s + cpuSeconds(p), 0);
  const before = Object.fromEntries(Object.entries(groups).map(([k, pids]) => [k, sum(pids())]));
  return {
    stop(): Record<string, number> {
      const wall = (Date.now() - started) / 1000;
      return Object.fromEntries(
        Object.entries(groups).map(([k, pids]) => [k, (100 * (sum(pids()) - before[k]!)) / wall]),
      );
    },
  };
}

/** Resident memory of one process in MB (VmRSS); 0 when it is gone. */
export function residentMb(pid: number): number {
  try {
    const m = /VmRSS:\s+(\d+) kB/.exec(readFileSync(`/proc/${pid}/status`, 'utf8'));
    return m ? Number(m[1]) / 1024 : 0;
  } catch {
    return 0;
  }
}
