/**
 * Frequency sweeps: frequency grids and TPG / return loss / Zin over them, written into typed
 * arrays the caller may reuse (no allocation per point).
 */
import { lossDb, returnLossDb } from './abcd.js';
import { EngineInputError } from './engine-input-error.js';
import { createResponsePoint, type Ladder, ladderResponse, ladderTpg } from './ladder.js';
import { frequencyProblems, throwIfProblems } from './port-limits.js';
import type { PortModel } from './port-model.js';

/** Largest sweep the engine builds (keeps a request from asking for gigabytes). */
export const MAX_SWEEP_POINTS = 1_000_001;

function checkGrid(startHz: number, stopHz: number, count: number): void {
  throwIfProblems([...frequencyProblems(startHz, 'startHz'), ...frequencyProblems(stopHz, 'stopHz')]);
  if (!(stopHz >= startHz)) throw new EngineInputError('stopHz', stopHz, `stopHz: ${stopHz} Hz is below startHz ${startHz} Hz`);
  if (!Number.isInteger(count) || count < 2 || count > MAX_SWEEP_POINTS) {
    throw new EngineInputError('points', count, `points: ${count} must be a whole number from 2 to ${MAX_SWEEP_POINTS}`);
  }
}

/** `count` evenly spaced frequencies from start to stop inclusive: `f_i = start + i (stop - start)/(count - 1)`. */
export function linearFrequencies(startHz: number, stopHz: number, count: number, out = new Float64Array(count)): Float64Array {
  checkGrid(startHz, stopHz, count);
  const step = (stopHz - startHz) / (count - 1);
  for (let i = 0; i < count; i++) out[i] = startHz + i * step;
  out[count - 1] = stopHz;
  return out;
}

/** `count` log-spaced frequencies: `f_i = start (stop/start)^(i/(count - 1))`. */
export function logFrequencies(startHz: number, stopHz: number, count: number, out = new Float64Array(count)): Float64Array {
  checkGrid(startHz, stopHz, count);
  const ratio = Math.log(stopHz / startHz) / (count - 1);
  for (let i = 0; i < count; i++) out[i] = startHz * Math.exp(i * ratio);
  out[count - 1] = stopHz;
  return out;
}

/**
 * TPG at each frequency, into `outTpg` (rf-engine.md: `4 Rs RL / |A ZL + B + C Zs ZL + D Zs|^2`).
 * @param values C/L per part (null: nominal); @param lossless drop loss resistance, keep parasitics
 */
export function sweepTpg(
  ladder: Ladder,
  source: PortModel,
  load: PortModel,
  frequenciesHz: ArrayLike<number>,
  outTpg: Float64Array = new Float64Array(frequenciesHz.length),
  values: ArrayLike<number> | null = null,
  lossless = false,
): Float64Array {
  for (let i = 0; i < frequenciesHz.length; i++) outTpg[i] = ladderTpg(ladder, source, load, frequenciesHz[i], values, lossless);
  return outTpg;
}

/** A sweep for plots: one typed array per quantity. */
export interface SweepResult {
  frequenciesHz: Float64Array;
  tpg: Float64Array;
  /** `-10 log10 TPG`, dB. */
  lossDb: Float64Array;
  /** `-20 log10 |G|`, dB. */
  returnLossDb: Float64Array;
  zinRe: Float64Array;
  zinIm: Float64Array;
  gammaRe: Float64Array;
  gammaIm: Float64Array;
}

/** Allocates a {@link SweepResult} for `frequenciesHz` (copied). */
export function createSweepResult(frequenciesHz: ArrayLike<number>): SweepResult {
  const n = frequenciesHz.length;
  return {
    frequenciesHz: Float64Array.from(frequenciesHz),
    tpg: new Float64Array(n),
    lossDb: new Float64Array(n),
    returnLossDb: new Float64Array(n),
    zinRe: new Float64Array(n),
    zinIm: new Float64Array(n),
    gammaRe: new Float64Array(n),
    gammaIm: new Float64Array(n),
  };
}

const point = createResponsePoint();

/** TPG, loss, return loss, Zin and reflection at each frequency of `out.frequenciesHz`, into `out`. */
export function sweepResponse(
  ladder: Ladder,
  source: PortModel,
  load: PortModel,
  out: SweepResult,
  values: ArrayLike<number> | null = null,
  lossless = false,
): SweepResult {
  const f = out.frequenciesHz;
  for (let i = 0; i < f.length; i++) {
    ladderResponse(ladder, source, load, f[i], point, values, lossless);
    out.tpg[i] = point.tpg;
    out.lossDb[i] = lossDb(point.tpg);
    out.returnLossDb[i] = returnLossDb(point.gammaMagnitude);
    out.zinRe[i] = point.zinRe;
    out.zinIm[i] = point.zinIm;
    out.gammaRe[i] = point.gammaRe;
    out.gammaIm[i] = point.gammaIm;
  }
  return out;
}
