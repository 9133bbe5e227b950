/**
 * Timing for the benchmark reports: run a function many times, report the median (and spread) of
 * the per-call time, side by side with others measured in the same run. A report, never a test.
 */
import { performance } from 'node:perf_hooks';

/** One measured function. */
export interface Timing {
  name: string;
  /** Median time per call, ms. */
  medianMs: number;
  /** 10th and 90th percentile per call over the samples, ms. */
  p10Ms: number;
  p90Ms: number;
  /** Samples taken (each one batch of `batch` calls). */
  samples: number;
  batch: number;
}

/** Options of {@link measure}. */
export interface MeasureOptions {
  /** Samples to take (default 30). */
  samples?: number;
  /** Calls per sample, so short functions are timed above the clock's resolution (default 1). */
  batch?: number;
  /** Untimed warm-up calls so the JIT has compiled the code (default 3 batches). */
  warmupBatches?: number;
}

/** Keeps results alive so the JIT cannot drop the measured work. */
let sink = 0;

/** Median-of-samples timing of `run` (its numeric result is consumed so the work is not optimised away). */
export function measure(name: string, run: () => number, options: MeasureOptions = {}): Timing {
  const samples = options.samples ?? 30;
  const batch = options.batch ?? 1;
  const warmup = options.warmupBatches ?? 3;
  for (let w = 0; w < warmup * batch; w++) sink += run();
  const perCall: number[] = [];
  for (let s = 0; s < samples; s++) {
    const start = performance.now();
    for (let b = 0; b < batch; b++) sink += run();
    perCall.push((performance.now() - start) / batch);
  }
  perCall.sort((a, b) => a - b);
  const at = (q: number) => perCall[Math.min(samples - 1, Math.floor(q * samples))];
  return { name, medianMs: at(0.5), p10Ms: at(0.1), p90Ms: at(0.9), samples, batch };
}

/** The sink's value (print it once so nothing is dead code). */
export function sinkValue(): number {
  return sink;
}

/** Time as text with a fitting unit. */
export function formatMs(ms: number): string {
  if (ms < 1e-3) return `${(ms * 1e6).toFixed(0)} ns`;
  if (ms < 1) return `${(ms * 1e3).toFixed(2)} µs`;
  if (ms < 1000) return `${ms.toFixed(3)} ms`;
  return `${(ms / 1000).toFixed(2)} s`;
}

/** One line of a report: name, median per call, spread, and calls per second. */
export function formatTiming(t: Timing, extra = ''): string {
  const perSecond = 1000 / t.medianMs;
  const rate = perSecond >= 1e6 ? `${(perSecond / 1e6).toFixed(2)} M/s` : perSecond >= 1e3 ? `${(perSecond / 1e3).toFixed(1)} k/s` : `${perSecond.toFixed(1)} /s`;
  return `  ${t.name.padEnd(58)} median ${formatMs(t.medianMs).padStart(10)}  (p10 ${formatMs(t.p10Ms)}, p90 ${formatMs(t.p90Ms)})  ${rate.padStart(10)}${extra ? `  ${extra}` : ''}`;
}

/** `slow / fast` as "N.Nx". */
export function ratio(slow: Timing, fast: Timing): string {
  return `${(slow.medianMs / fast.medianMs).toFixed(1)}x`;
}

/** "met" or "NOT met" for a target in ms. */
export function target(t: Timing, limitMs: number): string {
  return `target < ${formatMs(limitMs)}: ${t.medianMs < limitMs ? 'met' : 'NOT met'}`;
}
