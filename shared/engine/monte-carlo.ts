/**
 * Monte Carlo yield: the share of samples whose total loss at f0 stays within a loss budget
 * (rf-engine.md, "yield").
 *
 * Assumption (stated, not from a standard): each part's value is drawn independently from a normal
 * distribution centred on nominal with sigma = tolerance / 3, clipped at ± tolerance (a draw beyond
 * is set to the limit, not redrawn). Real lots are often not normal (binned or skewed), so yield
 * is an estimate, not a promise. Samples come from a seeded generator: the same seed gives the same
 * yield everywhere.
 */
import { lossDb } from './abcd.js';
import { EngineInputError } from './engine-input-error.js';
import { type Ladder, ladderTpg } from './ladder.js';
import type { PortModel } from './port-model.js';
import { mulberry32, normalSource } from './seeded-random.js';
import { clampValue } from './tolerance.js';

/** Samples per yield unless asked otherwise. */
export const DEFAULT_SAMPLES = 10_000;
/** Seed unless asked otherwise. */
export const DEFAULT_SEED = 60063;
/** Sigma as a share of the tolerance. */
export const SIGMA_PER_TOLERANCE = 1 / 3;
/** Most samples one call draws. */
export const MAX_SAMPLES = 10_000_000;

/** Options of {@link monteCarloYield}. */
export interface YieldOptions {
  /** Loss budget, dB: a sample passes when its total loss is at most this. */
  budgetDb: number;
  samples?: number;
  seed?: number;
  /** Keep every sample's loss (dB) here, length >= samples. */
  lossesOut?: Float64Array;
}

/** What {@link monteCarloYield} found. */
export interface YieldResult {
  samples: number;
  passing: number;
  /** `passing / samples`. */
  yieldFraction: number;
  seed: number;
  budgetDb: number;
  /** Median and 95th percentile of the total loss over the samples, dB. */
  medianLossDb: number;
  p95LossDb: number;
  worstLossDb: number;
}

/**
 * One Monte Carlo draw of every part value into `out`: `nominal + clip(sigma z, ±tol)` with
 * `sigma = tol/3` and z from `normal` (standard normal), kept above {@link clampValue}'s floor.
 */
export function drawToleranceValues(ladder: Ladder, normal: () => number, out: Float64Array): Float64Array {
  const nominal = ladder.nominalValues;
  const delta = ladder.toleranceValues;
  for (let i = 0; i < nominal.length; i++) {
    let offset = normal() * SIGMA_PER_TOLERANCE * delta[i];
    if (offset > delta[i]) offset = delta[i];
    else if (offset < -delta[i]) offset = -delta[i];
    out[i] = clampValue(nominal[i] + offset, nominal[i]);
  }
  return out;
}

/**
 * Monte Carlo yield at `frequencyHz`: each sample draws every part as
 * `nominal + clip(N(0, tol/3), ±tol)` and counts a pass when `-10 log10 TPG <= budgetDb`.
 * No allocation per sample (one values array, one losses array per call).
 */
export function monteCarloYield(ladder: Ladder, source: PortModel, load: PortModel, frequencyHz: number, options: YieldOptions): YieldResult {
  const samples = options.samples ?? DEFAULT_SAMPLES;
  const seed = options.seed ?? DEFAULT_SEED;
  if (!Number.isInteger(samples) || samples < 1 || samples > MAX_SAMPLES) {
    throw new EngineInputError('samples', samples, `samples: ${samples} must be a whole number from 1 to ${MAX_SAMPLES}`);
  }
  if (!Number.isFinite(options.budgetDb) || options.budgetDb < 0) {
    throw new EngineInputError('budgetDb', options.budgetDb, `budgetDb: ${options.budgetDb} must be a finite loss >= 0 dB`);
  }
  const normal = normalSource(mulberry32(seed));
  const values = new Float64Array(ladder.parts.length);
  const losses = options.lossesOut ?? new Float64Array(samples);
  let passing = 0;
  for (let s = 0; s < samples; s++) {
    drawToleranceValues(ladder, normal, values);
    const loss = lossDb(ladderTpg(ladder, source, load, frequencyHz, values, false));
    losses[s] = loss;
    if (loss <= options.budgetDb) passing++;
  }
  const sorted = losses.slice(0, samples).sort();
  const quantile = (q: number) => sorted[Math.min(samples - 1, Math.floor(q * samples))];
  return {
    samples,
    passing,
    yieldFraction: passing / samples,
    seed,
    budgetDb: options.budgetDb,
    medianLossDb: quantile(0.5),
    p95LossDb: quantile(0.95),
    worstLossDb: sorted[samples - 1],
  };
}
