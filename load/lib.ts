/** Small helpers shared by the benchmarks: process CPU and memory from /proc, statistics. */
import { readFileSync } from 'node:fs';

const TICKS_PER_SECOND = 100; // USER_HZ on Linux

/** User + system CPU time of a process, in microseconds (from /proc/<pid>/stat). */
export function cpuMicros(pid: number): number {
  const { user, system } = cpuSplit(pid);
  return user + system;
}

/** A process's CPU time so far in user and in kernel mode, in microseconds. */
export function cpuSplit(pid: number): { user: number; system: number } {
  const stat = readFileSync(`/proc/${pid}/stat`, 'utf8');
  const fields = stat.slice(stat.lastIndexOf(')') + 2).split(' ');
  return { user: (Number(fields[11]) / TICKS_PER_SECOND) * 1e6, system: (Number(fields[12]) / TICKS_PER_SECOND) * 1e6 };
}

/** Resident set size of a process, in MiB. */
export function rssMiB(pid: number): number {
  return statusMiB(pid, 'VmRSS');
}

/** The most resident memory a process has held so far (its high-water mark), in MiB. */
export function peakRssMiB(pid: number): number {
  return statusMiB(pid, 'VmHWM');
}

function statusMiB(pid: number, field: 'VmRSS' | 'VmHWM'): number {
  const status = readFileSync(`/proc/${pid}/status`, 'utf8');
  const m = new RegExp(`${field}:\\s+(\\d+) kB`).exec(status);
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

let sink = 0;

/**
 * Nanoseconds per call of fn: `warmup` calls first, then batches doubling from `first` calls
 * until one batch takes about targetMs. Every result is looked at, so no call can be dropped.
 */
export function nsPerCall(fn: () => unknown, targetMs: number, warmup = 2000, first = 1000): number {
  for (let i = 0; i < warmup; i++) if (fn() === undefined) sink++;
  let n = first;
  for (;;) {
    const t0 = process.hrtime.bigint();
    for (let i = 0; i < n; i++) if (fn() === undefined) sink++;
    const ns = Number(process.hrtime.bigint() - t0);
    if (ns > targetMs * 1e6 || n > 1e8) return ns / n;
    n *= 2;
  }
}

/** Read at the end of a benchmark so the results above stay observable. */
export function benchSink(): number {
  return sink;
}
