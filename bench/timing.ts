/** Timing helpers for the benchmarks: warm-up, repeated runs, percentiles. */

export interface Timing {
  readonly median: number;
  readonly p95: number;
  readonly min: number;
  readonly max: number;
  readonly runs: number;
}

export function percentile(sorted: readonly number[], fraction: number): number {
  if (sorted.length === 0) return NaN;
  const index = Math.min(sorted.length - 1, Math.max(0, Math.ceil(fraction * sorted.length) - 1));
  return sorted[index]!;
}

export function summarize(samples: readonly number[]): Timing {
  const sorted = [...samples].sort((a, b) => a - b);
  return { median: percentile(sorted, 0.5), p95: percentile(sorted, 0.95), min: sorted[0] ?? NaN, max: sorted[sorted.length - 1] ?? NaN, runs: sorted.length };
}

/** Times `work` after `warmup` untimed runs, in milliseconds. */
export function time(work: () => unknown, runs: number, warmup = 3): Timing {
  for (let i = 0; i < warmup; i++) work();
  const samples: number[] = [];
  for (let i = 0; i < runs; i++) {
    const start = performance.now();
    work();
    samples.push(performance.now() - start);
  }
  return summarize(samples);
}

export function ms(value: number): string {
  return value < 1 ? `${value.toFixed(3)} ms` : `${value.toFixed(1)} ms`;
}
