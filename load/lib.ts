/** Small helpers shared by the benchmarks: process CPU and memory from /proc, statistics. */
import { readFileSync } from 'node:fs';

const TICKS_PER_SECOND = 100; // USER_HZ on Linux

/** User + system CPU time of a process, in microseconds (from /proc/<pid>/stat). */
export function cpuMicros(pid: number): number {
  const stat = readFileSync(`/proc/${pid}/stat`, 'utf8');
  const fields = stat.slice(stat.lastIndexOf(')') + 2).split(' ');
  const utime = Number(fields[11]);
  const stime = Number(fields[12]);
  return ((utime + stime) / TICKS_PER_SECOND) * 1e6;
}

/** Resident set size of a process, in MiB. */
export function rssMiB(pid: number): number {
  const status = readFileSync(`/proc/${pid}/status`, 'utf8');
  const m = /VmRSS:\s+(\d+) kB/.exec(status);
  return m ? Number(m[1]) / 1024 : Number.NaN;
}

export function median(xs: number[]): number {
  const s = [...xs].sort((a, b) => a - b);
  const n = s.length;
  if (n === 0) return Number.NaN;
  return n % 2 ? s[(n - 1) / 2]! : (s[n / 2 - 1]! + s[n / 2]!) / 2;
}

export function fmt(x: number, digits = 3): string {
  if (!Number.isFinite(x)) return String(x);
  return Math.abs(x) >= 1000 ? Math.round(x).toLocaleString('en-US') : x.toPrecision(digits);
}

export function table(rows: string[][]): string {
  const widths = rows[0]!.map((_, i) => Math.max(...rows.map((r) => (r[i] ?? '').length)));
  return rows.map((r) => r.map((c, i) => (i === 0 ? c.padEnd(widths[i]!) : c.padStart(widths[i]!))).join('  ')).join('\n');
}
