/**
 * The plots of a saved match: TPG over frequency of the ideal network and of the chosen fit (full
 * part models), and the Smith chart path (the impedance looking toward the load after each element,
 * from the load to the source, with points along each element's arc).
 */
import type { NetworkElement } from '../api/matches.js';
import type { Complex } from '../engine/complex.js';
import { idealLadder, type Ladder } from '../engine/ladder.js';
import { angularFrequency } from '../engine/part-kind.js';
import { elementImpedance } from '../engine/part-model.js';
import { linearFrequencies, sweepTpg } from '../engine/sweep.js';
import type { SolveInput } from '../engine/solve-request.js';
import { type MeasuredPort, measuredSpan, measuredTrace } from '../touchstone/measured-port.js';
import { MIN_FREQUENCY_HZ } from '../engine/port-limits.js';
import { seriesElement, shuntElement } from '../engine/l-network.js';

/** Points of a saved match's sweep. */
export const SWEEP_POINTS = 201;
/** The sweep spans at least f0 ± this fraction of f0. */
export const SWEEP_HALF_SPAN_FRACTION = 0.2;
/** Points along each element's arc on the Smith chart. */
export const SMITH_ARC_POINTS = 24;
/** Reference resistance the chart is normalised to, ohm. */
export const SMITH_REFERENCE_OHM = 50;

/** Sweep data for the TPG plot (TPG as a ratio, not dB). */
export interface MatchSweep {
  frequenciesHz: number[];
  idealTpg: number[];
  fitTpg: number[];
}

/** A measured port's impedance over the sweep (the Smith chart's measured trace), ohm. */
export interface MeasuredTrace {
  port: 'source' | 'load';
  fileName: string | null;
  frequenciesHz: number[];
  impedances: ImpedancePoint[];
}

/** What a sweep needs of a solve request: its ports over frequency, f0 and band. */
export type SweepPorts = Pick<SolveInput, 'sourcePort' | 'loadPort' | 'sourceMeasured' | 'loadMeasured' | 'frequencyHz' | 'bandwidthHz'>;

/** An impedance in ohm. */
export interface ImpedancePoint {
  re: number;
  im: number;
}

/** One element's step on the Smith chart: from the impedance before it (load side) to after it. */
export interface SmithStep {
  position: 'series' | 'shunt';
  /** Points along the arc, the last one the impedance after the element, ohm. */
  arc: ImpedancePoint[];
}

/** The Smith chart of one network at f0. */
export interface SmithPath {
  referenceOhm: number;
  load: ImpedancePoint;
  /** Where the path must end for a conjugate match: `conj(Zs)`. */
  target: ImpedancePoint;
  /** Impedance after each element, load side first, the last one `Zin`. */
  nodes: ImpedancePoint[];
  steps: SmithStep[];
}

/**
 * Frequencies of a saved match's sweep: {@link SWEEP_POINTS} points over `f0 ± max(bandwidth,
 * 0.2 f0)`, the low end kept above 1 % of f0, and kept inside the measured range of any measured
 * port (its data is not extrapolated).
 */
export function sweepFrequencies(frequencyHz: number, bandwidthHz: number | null, measured: readonly (MeasuredPort | null)[] = []): Float64Array {
  const half = Math.max(bandwidthHz ?? 0, SWEEP_HALF_SPAN_FRACTION * frequencyHz);
  let low = Math.max(frequencyHz - half, 0.01 * frequencyHz, MIN_FREQUENCY_HZ);
  let high = frequencyHz + half;
  const span = measuredSpan(measured);
  if (span) {
    low = Math.max(low, span.firstHz);
    high = Math.min(high, span.lastHz);
  }
  // A one-point file (f0 is its point) leaves nothing to sweep but f0.
  return high > low ? linearFrequencies(low, high, SWEEP_POINTS) : Float64Array.of(frequencyHz);
}

/**
 * TPG of the ideal network and of the fit over {@link sweepFrequencies}: typed ports as R with the
 * ideal L or C that gives their reactance at f0 (port-model.ts `series-equivalent`), measured ports
 * from their files.
 */
export function matchSweep(ports: SweepPorts, idealElements: readonly NetworkElement[], fit: Ladder): MatchSweep {
  const f = sweepFrequencies(ports.frequencyHz, ports.bandwidthHz, [ports.sourceMeasured, ports.loadMeasured]);
  const omega = angularFrequency(ports.frequencyHz);
  const ideal = idealLadder(idealElements.map((e) => (e.position === 'series' ? seriesElement(e.reactanceOhm, omega) : shuntElement(-1 / e.reactanceOhm, omega))));
  return {
    frequenciesHz: Array.from(f),
    idealTpg: Array.from(sweepTpg(ideal, ports.sourcePort, ports.loadPort, f)),
    fitTpg: Array.from(sweepTpg(fit, ports.sourcePort, ports.loadPort, f)),
  };
}

/** The measured ports' impedances over the sweep's range, for the Smith chart (empty when none is measured). */
export function measuredTraces(ports: SweepPorts): MeasuredTrace[] {
  const f = sweepFrequencies(ports.frequencyHz, ports.bandwidthHz, [ports.sourceMeasured, ports.loadMeasured]);
  const traces: MeasuredTrace[] = [];
  for (const [port, measured] of [['source', ports.sourceMeasured], ['load', ports.loadMeasured]] as const) {
    if (!measured) continue;
    const trace = measuredTrace(measured, f[0], f[f.length - 1]);
    traces.push({ port, fileName: measured.fileName, frequenciesHz: trace.frequenciesHz, impedances: trace.impedances.map((z) => ({ re: z.re, im: z.im })) });
  }
  return traces;
}

/**
 * The Smith path of a ladder at f0: starting at ZL, each element from the load side changes the
 * impedance looking toward the load: a series element `Z -> Z + t Ze`, a shunt element
 * `Z -> 1/(1/Z + t Ye)`, t from 0 to 1 along its arc.
 */
export function smithPath(source: Complex, load: Complex, frequencyHz: number, ladder: Ladder): SmithPath {
  const omega = angularFrequency(frequencyHz);
  let z: ImpedancePoint = { re: load.re, im: load.im };
  const nodes: ImpedancePoint[] = [];
  const steps: SmithStep[] = [];
  const e = { re: 0, im: 0 };
  for (let i = ladder.elements.length - 1; i >= 0; i--) {
    const element = ladder.elements[i];
    elementImpedance(element, omega, e, null, ladder.firstPart[i]);
    const start = z;
    const arc: ImpedancePoint[] = [];
    for (let k = 1; k <= SMITH_ARC_POINTS; k++) {
      const t = k / SMITH_ARC_POINTS;
      if (element.position === 'series') arc.push({ re: start.re + t * e.re, im: start.im + t * e.im });
      else {
        const d = start.re * start.re + start.im * start.im;
        const de = e.re * e.re + e.im * e.im;
        const yRe = start.re / d + (t * e.re) / de;
        const yIm = -start.im / d - (t * e.im) / de;
        const dy = yRe * yRe + yIm * yIm;
        arc.push({ re: yRe / dy, im: -yIm / dy });
      }
    }
    z = arc[arc.length - 1];
    nodes.push(z);
    steps.push({ position: element.position, arc });
  }
  return { referenceOhm: SMITH_REFERENCE_OHM, load: { re: load.re, im: load.im }, target: { re: source.re, im: -source.im }, nodes, steps };
}
