// How every API bench prints its figures: JSON lines with the machine's load beside each, since the
// API shares two cores with builds and test runs.
import { loadavg } from 'node:os';

export const round = (v: number) => Math.round(v * 10) / 10;

/** One JSON line of figures, with the 1-minute load average. */
export const line = (o: object) => console.log(JSON.stringify({ ...o, loadAverage1m: round(loadavg()[0]) }));

/** The value at or below which a share p of the timings falls (nearest rank). */
export function percentile(values: number[], p: number): number {
  const s = [...values].sort((a, b) => a - b);
  return s[Math.min(s.length - 1, Math.max(0, Math.ceil(p * s.length) - 1))];
}

/** The middle value (mean of the middle two for an even count). */
export function median(values: number[]): number {
  const s = [...values].sort((a, b) => a - b);
  return s.length % 2 ? s[(s.length - 1) / 2] : (s[s.length / 2 - 1] + s[s.length / 2]) / 2;
}

/** Timings in milliseconds summarised as count, min, p50, p95, p99 and max. */
export function stats(ms: number[]) {
  return {
    n: ms.length,
    minMs: round(Math.min(...ms)),
    p50Ms: round(percentile(ms, 0.5)),
    p95Ms: round(percentile(ms, 0.95)),
    p99Ms: round(percentile(ms, 0.99)),
    maxMs: round(Math.max(...ms)),
  };
}

export const mb = (bytes: number) => Math.round(bytes / 1048576);
