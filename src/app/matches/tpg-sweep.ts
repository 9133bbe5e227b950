/**
 * The TPG-against-frequency data the match plot draws. The ideal network's curve is computed here
 * with the engine (shared/engine/ladder.ts, sweep.ts: ABCD cascade, `TPG = 4 Rs RL / |A ZL + B +
 * C Zs ZL + D Zs|^2`), with each typed port as R in series with the L or C that gives its X at f0
 * (the engine's default port model, port-model.ts) and each measured port from its Touchstone file
 * (the sweep then stays inside the file's range), so the browser and the server draw the same curve.
 */
import type { Fit, NetworkElement } from '../../../shared/api/matches.js';
import {
  type IdealElement,
  createLadder,
  elementModel,
  idealLadder,
  partModel,
  linearFrequencies,
  sweepTpg,
} from '../../../shared/engine/index.js';
import type { SweepPorts } from '../../../shared/snapping/match-sweep.js';
import { type MeasuredPort, measuredSpan } from '../../../shared/touchstone/measured-port.js';

/** Points per sweep: enough for a smooth curve, few enough to draw at once. */
export const SWEEP_POINTS = 201;
/** Half-width of the default sweep as a fraction of f0 (f0 ± 40 %). */
export const DEFAULT_SPAN_FRACTION = 0.4;
/** Lowest dB the plot's axis reaches. */
export const FLOOR_DB = -40;

/** One curve: TPG in dB at each frequency (Hz). */
export interface TpgCurve {
  frequenciesHz: readonly number[];
  tpgDb: readonly number[];
}

/**
 * The sweep range around f0: f0 ± 40 %, widened to one and a half band widths either side of f0
 * when a wider band is given, never below 1 % of f0, and cut to the range every measured port
 * covers (a file's data is not extrapolated).
 * @returns start and stop in Hz
 */
export function sweepRange(frequencyHz: number, bandwidthHz: number | null, measured: readonly (MeasuredPort | null)[] = []): { startHz: number; stopHz: number } {
  const halfSpan = Math.max(DEFAULT_SPAN_FRACTION * frequencyHz, bandwidthHz === null ? 0 : 1.5 * bandwidthHz);
  let startHz = Math.max(0.01 * frequencyHz, frequencyHz - halfSpan);
  let stopHz = frequencyHz + halfSpan;
  const span = measuredSpan(measured);
  if (span) {
    startHz = Math.max(startHz, span.firstHz);
    stopHz = Math.min(stopHz, span.lastHz);
  }
  return { startHz, stopHz };
}

/** The frequencies of a sweep over {@link sweepRange} for these ports (f0 alone when a file holds only f0). */
export function sweepFrequenciesOf(ports: SweepPorts): Float64Array {
  const { startHz, stopHz } = sweepRange(ports.frequencyHz, ports.bandwidthHz, [ports.sourceMeasured, ports.loadMeasured]);
  return stopHz > startHz ? linearFrequencies(startHz, stopHz, SWEEP_POINTS) : Float64Array.of(ports.frequencyHz);
}

/** `10 log10 TPG`, held at {@link FLOOR_DB} so a deep null does not flatten the plot. */
export function tpgDb(tpg: number): number {
  return tpg > 0 ? Math.max(FLOOR_DB, 10 * Math.log10(tpg)) : FLOOR_DB;
}

/** An api.md network element as the engine's ideal element (`B = -1/X` for the susceptance). */
function idealElementOf(element: NetworkElement): IdealElement {
  return { ...element, susceptanceS: -1 / element.reactanceOhm };
}

/**
 * TPG of an ideal network over the sweep range, in dB.
 * @param ports the request's ports over frequency, f0 and band (a parsed solve request fits)
 */
export function idealTpgCurve(elements: readonly NetworkElement[], ports: SweepPorts): TpgCurve {
  const frequencies = sweepFrequenciesOf(ports);
  const tpg = sweepTpg(idealLadder(elements.map(idealElementOf)), ports.sourcePort, ports.loadPort, frequencies);
  return { frequenciesHz: Array.from(frequencies), tpgDb: Array.from(tpg, tpgDb) };
}

/** A curve from TPG values (not dB) the server sent, e.g. a saved match's sweep. */
export function curveFromTpg(frequenciesHz: readonly number[], tpg: readonly number[]): TpgCurve {
  if (frequenciesHz.length !== tpg.length) {
    throw new Error(`curveFromTpg: ${frequenciesHz.length} frequencies but ${tpg.length} TPG values.`);
  }
  return { frequenciesHz, tpgDb: tpg.map(tpgDb) };
}

/** The SI prefix to show frequencies of this size in, with the divisor (868e6 -> MHz, 1e6). */
export function frequencyUnit(frequencyHz: number): { unit: string; divisor: number } {
  const units: [number, string][] = [
    [1e12, 'THz'],
    [1e9, 'GHz'],
    [1e6, 'MHz'],
    [1e3, 'kHz'],
  ];
  for (const [divisor, unit] of units) if (frequencyHz >= divisor) return { unit, divisor };
  return { unit: 'Hz', divisor: 1 };
}

/** What a fit's curve needs of a stocked part (a subset of `GET /api/parts` items). */
export interface StockedPartModelData {
  partNumber: string;
  kind: 'capacitor' | 'inductor';
  /** F or H. */
  value: number;
  srfHz: number | null;
  esrOhm: number | null;
  q: number | null;
  qFrequencyHz: number | null;
}

/**
 * TPG of a stocked fit over the sweep range, in dB, with the engine's full part models (rf-engine.md
 * "Part models": ESL or Cp from SRF, loss from ESR or Q) at nominal values.
 * @param parts the fit's parts by part number
 * @throws Error naming a part number the lookup did not find
 */
export function fitTpgCurve(fit: Fit, parts: ReadonlyMap<string, StockedPartModelData>, ports: SweepPorts): TpgCurve {
  const elements = fit.elements.map((element, index) => {
    const models = element.parts.flatMap((used) => {
      const part = parts.get(used.partNumber);
      if (!part) throw new Error(`fitTpgCurve: part ${used.partNumber} of the fit was not found in stock.`);
      const model = partModel(
        { kind: part.kind, valueSi: part.value, srfHz: part.srfHz, esrOhm: part.esrOhm, q: part.q, qFrequencyHz: part.qFrequencyHz, partNumber: part.partNumber },
        `fit.elements.${index}`,
      );
      return Array.from({ length: used.quantity }, () => model);
    });
    return elementModel(element.position, element.arrangement, models, `fit.elements.${index}`);
  });
  const frequencies = sweepFrequenciesOf(ports);
  const tpg = sweepTpg(createLadder(elements), ports.sourcePort, ports.loadPort, frequencies);
  return { frequenciesHz: Array.from(frequencies), tpgDb: Array.from(tpg, tpgDb) };
}
