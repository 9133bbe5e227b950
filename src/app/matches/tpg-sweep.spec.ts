import type { Fit, NetworkElement } from '../../../shared/api/matches.js';
import { parseSolveRequest } from '../../../shared/engine/index.js';
import { FLOOR_DB, SWEEP_POINTS, curveFromTpg, fitTpgCurve, frequencyUnit, idealTpgCurve, sweepRange, tpgDb } from './tpg-sweep.js';

// A 200 Ω load matched to a 50 Ω source at 100 MHz by the real-to-real L section (a fact of the
// trade: Q = sqrt(200/50 - 1) = sqrt(3); shunt X = -200/Q across the load, series X = +50 Q).
const F0 = 100e6;
const OMEGA = 2 * Math.PI * F0;
const Q = Math.sqrt(3);
const ELEMENTS: NetworkElement[] = [
  { position: 'series', kind: 'inductor', value: (50 * Q) / OMEGA, reactanceOhm: 50 * Q },
  { position: 'shunt', kind: 'capacitor', value: 1 / (OMEGA * (200 / Q)), reactanceOhm: -200 / Q },
];
/** The typed 50 Ω source and 200 Ω load at f0, as the workspace reads them. */
const PORTS = parseSolveRequest({ source: 50, load: 200, frequencyHz: F0 });

/** The sample nearest to f0. */
function atF0(curve: { frequenciesHz: readonly number[]; tpgDb: readonly number[] }): number {
  let best = 0;
  curve.frequenciesHz.forEach((f, i) => {
    if (Math.abs(f - F0) < Math.abs(curve.frequenciesHz[best] - F0)) best = i;
  });
  return curve.tpgDb[best];
}

describe('idealTpgCurve', () => {
  it('reaches 0 dB at f0 and never rises above it (a passive network never has TPG above 1)', () => {
    const curve = idealTpgCurve(ELEMENTS, PORTS);
    expect(curve.frequenciesHz.length).toBe(SWEEP_POINTS);
    expect(atF0(curve)).toBeCloseTo(0, 9);
    for (const db of curve.tpgDb) expect(db).toBeLessThanOrEqual(1e-9);
    // Away from f0 the match falls off on both sides.
    expect(curve.tpgDb[0]).toBeLessThan(-0.1);
    expect(curve.tpgDb.at(-1)!).toBeLessThan(-0.1);
  });
});

describe('fitTpgCurve', () => {
  const fit = (values: [number, number]): Fit => ({
    rank: 1,
    elements: [
      { position: 'series', kind: 'inductor', arrangement: 'single', parts: [{ partNumber: 'L1', quantity: 1 }], nominalValue: values[0], effectiveValue: values[0], frequencyRatio: null, flags: [] },
      // Two equal capacitors in parallel make the shunt element (C adds in parallel).
      { position: 'shunt', kind: 'capacitor', arrangement: 'parallel', parts: [{ partNumber: 'C1', quantity: 2 }], nominalValue: values[1], effectiveValue: values[1], frequencyRatio: null, flags: [] },
    ],
    loss: { valueErrorDb: 0, dissipativeDb: 0, totalDb: 0, worstCaseDb: 0, bandDb: null },
    tpg: 1,
    returnLossDb: 60,
    flags: [],
  });
  const part = (partNumber: string, kind: 'capacitor' | 'inductor', value: number, extra: { srfHz?: number; esrOhm?: number } = {}) =>
    [partNumber, { partNumber, kind, value, srfHz: extra.srfHz ?? null, esrOhm: extra.esrOhm ?? null, q: null, qFrequencyHz: null }] as const;

  it('matches the ideal network at f0 when the parts are exact, lossless and without SRF', () => {
    const [l, c] = [ELEMENTS[0].value, ELEMENTS[1].value];
    const parts = new Map([part('L1', 'inductor', l), part('C1', 'capacitor', c / 2)]);
    expect(atF0(fitTpgCurve(fit([l, c]), parts, PORTS))).toBeCloseTo(0, 9);
  });

  it('loses power when the parts have loss', () => {
    const [l, c] = [ELEMENTS[0].value, ELEMENTS[1].value];
    const parts = new Map([part('L1', 'inductor', l, { esrOhm: 2 }), part('C1', 'capacitor', c / 2, { esrOhm: 0.5 })]);
    expect(atF0(fitTpgCurve(fit([l, c]), parts, PORTS))).toBeLessThan(-0.05);
  });

  it('names a part number the stock lookup did not find', () => {
    const parts = new Map([part('L1', 'inductor', 1e-7)]);
    expect(() => fitTpgCurve(fit([1e-7, 1e-11]), parts, PORTS)).toThrow(/C1/);
  });
});

describe('a measured load', () => {
  // 200 Ω flat from 80 to 110 MHz (Touchstone 2.0 Z data in ohm): the sweep stays inside the file.
  const file = ['[Version] 2.0', '# MHz Z RI R 50', '[Number of Ports] 1', '[Number of Frequencies] 2', '[Network Data]', '80 200 0', '110 200 0', '[End]'].join('\n');
  const measured = parseSolveRequest({ source: 50, loadTouchstone: { fileName: 'flat.s1p', text: file }, frequencyHz: F0 });

  it('cuts the sweep to the file and sweeps the file, not the typed model', () => {
    expect(sweepRange(F0, null, [measured.loadMeasured])).toEqual({ startHz: 80e6, stopHz: 110e6 });
    const curve = idealTpgCurve(ELEMENTS, measured);
    expect(curve.frequenciesHz[0]).toBe(80e6);
    expect(curve.frequenciesHz.at(-1)).toBe(110e6);
    expect(atF0(curve)).toBeCloseTo(0, 2);
    // A flat 200 Ω and the typed 200 Ω (a pure resistance, so also flat) agree at every point.
    const typed = parseSolveRequest({ source: 50, load: 200, frequencyHz: F0 });
    const sameGrid = idealTpgCurve(ELEMENTS, { ...typed, loadMeasured: measured.loadMeasured });
    sameGrid.tpgDb.forEach((db, i) => expect(db).toBeCloseTo(curve.tpgDb[i], 9));
  });
});

describe('sweep helpers', () => {
  it('sweeps f0 ± 40 %, or 1.5 band widths either side when the band is wider', () => {
    expect(sweepRange(100e6, null)).toEqual({ startHz: 60e6, stopHz: 140e6 });
    expect(sweepRange(100e6, 40e6)).toEqual({ startHz: 40e6, stopHz: 160e6 });
    expect(sweepRange(100e6, 90e6).startHz).toBe(1e6);
  });

  it('writes TPG in dB with a floor', () => {
    expect(tpgDb(0.5)).toBeCloseTo(-3.0103, 4);
    expect(tpgDb(0)).toBe(FLOOR_DB);
    expect(curveFromTpg([1, 2], [1, 0.1]).tpgDb).toEqual([0, -10]);
    expect(() => curveFromTpg([1, 2], [1])).toThrow(/2 frequencies but 1/);
  });

  it('picks the frequency unit', () => {
    expect(frequencyUnit(868e6)).toEqual({ unit: 'MHz', divisor: 1e6 });
    expect(frequencyUnit(2.45e9)).toEqual({ unit: 'GHz', divisor: 1e9 });
    expect(frequencyUnit(13.56e6).unit).toBe('MHz');
    expect(frequencyUnit(500).unit).toBe('Hz');
  });
});
