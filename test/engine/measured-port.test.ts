/**
 * A measured one-port Touchstone file as the load or the source of a match (shared/touchstone/
 * measured-port.ts, read by shared/engine/solve-request.ts): the impedance at f0 by linear
 * interpolation, refusals that name the field and the file's line, and the measured data driving
 * the sweep, the band loss and the Smith chart trace.
 *
 * Outside references:
 * - The conversion `Z = R (1 + S)/(1 - S)` is Pozar, Microwave Engineering, 4th ed., eq. 2.35 (also
 *   checked in touchstone-read.test.ts); the files here are written as Z data in ohm (version 2.0
 *   keywords, Touchstone File Format Specification Version 2.0, IBIS Open Forum, 2009) so the
 *   expected impedances below are the file's own numbers, worked out by hand.
 * - The reference network: 50 ohm to 12.5 ohm at 100 MHz (C. Bowick, RF Circuit Design, 2nd ed.,
 *   ch. 4, from memory): Q = sqrt(3), shunt C 55.13 pF across the source, series L 34.46 nH.
 * - TPG of a conjugate-matched lossless network is 1 at f0 (fact of the trade: the definition of a
 *   conjugate match).
 */
import { describe, expect, it } from 'vitest';
import { isEngineInputError, type EngineInputError } from '../../shared/engine/engine-input-error.js';
import { parseSolveRequest } from '../../shared/engine/solve-request.js';
import { constantPort, seriesEquivalentPort } from '../../shared/engine/port-model.js';
import { idealLadder } from '../../shared/engine/ladder.js';
import { seriesElement, shuntElement } from '../../shared/engine/l-network.js';
import { angularFrequency } from '../../shared/engine/part-kind.js';
import { sweepTpg } from '../../shared/engine/sweep.js';
import type { Tolerance } from '../../shared/engine/tolerance-codes.js';
import { DEFAULT_SNAP_SETTINGS, snapMatch } from '../../shared/snapping/snap-match.js';
import { matchSweep, measuredTraces, sweepFrequencies } from '../../shared/snapping/match-sweep.js';
import type { SnapPart } from '../../shared/snapping/snap-part.js';
import { buildStockIndex } from '../../shared/snapping/stock-index.js';
import { writeOnePortTouchstone } from '../../shared/touchstone/index.js';

/** A version 2.0 one-port file of Z data in ohm, one line per point. */
function zFile(points: [mhz: number, r: number, x: number][], comment = 'test load'): string {
  return [
    `! ${comment}`,
    '[Version] 2.0',
    '# MHz Z RI R 50',
    '[Number of Ports] 1',
    `[Number of Frequencies] ${points.length}`,
    '[Network Data]',
    ...points.map(([f, r, x]) => `${f} ${r} ${x}`),
    '[End]',
  ].join('\n');
}

function problemOf(run: () => unknown): EngineInputError {
  try {
    run();
  } catch (error) {
    if (isEngineInputError(error)) return error;
    throw error;
  }
  throw new Error('expected an EngineInputError');
}

describe('the impedance at f0 comes from the file', () => {
  it('interpolates linearly in R and X between the neighbouring points', () => {
    // 860 MHz: 10 - j40; 880 MHz: 14 - j30. At 868 MHz t = 8/20 = 0.4: R = 10 + 0.4*4 = 11.6,
    // X = -40 + 0.4*10 = -36 (worked by hand).
    const input = parseSolveRequest({
      source: 50,
      loadTouchstone: { fileName: 'ant.s1p', text: zFile([[850, 9, -45], [860, 10, -40], [880, 14, -30], [890, 15, -20]]) },
      frequencyHz: '868MHz',
    });
    expect(input.load.re).toBeCloseTo(11.6, 12);
    expect(input.load.im).toBeCloseTo(-36, 12);
    expect(input.loadMeasured?.fileName).toBe('ant.s1p');
    expect(input.loadMeasured?.firstHz).toBe(850e6);
    expect(input.loadPort.model).toBe('table');
    expect(input.sourcePort.model).toBe('series-equivalent');
  });

  it('takes a file point exactly when f0 is one, and serves as the source too', () => {
    const input = parseSolveRequest({ sourceTouchstone: { text: zFile([[90, 40, 5], [100, 45, 10], [110, 50, 15]]) }, load: 12.5, frequencyHz: 100e6 });
    expect(input.source).toEqual({ re: 45, im: 10 });
    expect(input.sourceMeasured?.fileName).toBeNull();
  });

  it('reads S-parameter files the same way (S11 written by our writer from known impedances)', () => {
    const text = writeOnePortTouchstone({ frequencyHz: [800e6, 900e6], resistanceOhm: [8, 12], reactanceOhm: [-30, -20], format: 'MA', frequencyUnit: 'MHz' });
    const input = parseSolveRequest({ source: 50, loadTouchstone: { text }, frequencyHz: 850e6 });
    // Midway: R = 10, X = -25 (hand), after an S round trip of 12 significant digits.
    expect(input.load.re).toBeCloseTo(10, 8);
    expect(input.load.im).toBeCloseTo(-25, 8);
  });
});

describe('refusals name the field, and the line for problems inside the file', () => {
  const text = zFile([[860, 10, -40], [880, 14, -30]]);

  it('refuses f0 outside the measured range and names the range', () => {
    const error = problemOf(() => parseSolveRequest({ source: 50, loadTouchstone: { fileName: 'ant.s1p', text }, frequencyHz: '915MHz' }));
    expect(error.details[0].field).toBe('frequencyHz');
    expect(error.details[0].message).toMatch(/915 MHz is outside the measured data \(860 MHz to 880 MHz\).*"ant\.s1p"/);
  });

  it('refuses a band that reaches outside the file', () => {
    const error = problemOf(() => parseSolveRequest({ source: 50, loadTouchstone: { text }, frequencyHz: '870MHz', bandwidthHz: '30MHz' }));
    expect(error.details.map((d) => d.field)).toEqual(['bandwidthHz']);
    expect(error.details[0].message).toMatch(/855 MHz to 885 MHz reaches outside the measured data/);
  });

  it('refuses a malformed file with its line number, under loadTouchstone.text', () => {
    const bad = zFile([[860, 10, -40], [850, 14, -30]]);
    const error = problemOf(() => parseSolveRequest({ source: 50, loadTouchstone: { fileName: 'b.s1p', text: bad }, frequencyHz: '870MHz' }));
    expect(error.details[0]).toMatchObject({ field: 'loadTouchstone.text', value: 'b.s1p', line: 8 });
    expect(error.details[0].message).toMatch(/^loadTouchstone: "b\.s1p" line 8: /);
  });

  it('refuses a point with R <= 0 (|S11| >= 1) with its line', () => {
    const error = problemOf(() => parseSolveRequest({ source: 50, loadTouchstone: { text: zFile([[860, 10, -40], [870, -0.5, -30], [880, 3, 1]]) }, frequencyHz: 865e6 }));
    expect(error.details[0]).toMatchObject({ field: 'loadTouchstone.text', line: 8 });
    expect(error.details[0].message).toMatch(/R > 0 at every point/);
  });

  it('refuses both a typed load and a file, a missing text, a two-port file and unknown fields', () => {
    expect(problemOf(() => parseSolveRequest({ source: 50, load: 10, loadTouchstone: { text }, frequencyHz: 870e6 })).details[0].field).toBe('loadTouchstone');
    expect(problemOf(() => parseSolveRequest({ source: 50, loadTouchstone: { text: '  ' }, frequencyHz: 870e6 })).details[0].field).toBe('loadTouchstone.text');
    expect(problemOf(() => parseSolveRequest({ source: 50, loadTouchstone: 'ant.s1p', frequencyHz: 870e6 })).details[0].field).toBe('loadTouchstone');
    expect(problemOf(() => parseSolveRequest({ source: 50, loadTouchstone: { text, path: '/x' }, frequencyHz: 870e6 })).details[0].field).toBe('loadTouchstone.path');
    const twoPort = ['# MHz S RI R 50', '860 0.1 0 0.9 0 0.9 0 0.1 0'].join('\n');
    const error = problemOf(() => parseSolveRequest({ source: 50, loadTouchstone: { text: twoPort }, frequencyHz: 860e6 }));
    expect(error.details[0]).toMatchObject({ field: 'loadTouchstone.text', line: 2 });
  });

  it('still says a load is needed when neither is given', () => {
    const error = problemOf(() => parseSolveRequest({ source: 50, frequencyHz: 870e6 }));
    expect(error.details[0]).toMatchObject({ field: 'load' });
    expect(error.details[0].message).toMatch(/or loadTouchstone/);
  });
});

let nextId = 1;
function part(partNumber: string, kind: 'capacitor' | 'inductor', value: number, more: Partial<SnapPart> = {}): SnapPart {
  return {
    id: nextId++,
    partNumber,
    kind,
    value,
    tolerance: { mode: 'relative', fraction: 0.02 } as Tolerance,
    srfHz: kind === 'capacitor' ? 2e9 : 1.5e9,
    q: kind === 'inductor' ? 40 : null,
    qFrequencyHz: kind === 'inductor' ? 100e6 : null,
    esrOhm: kind === 'capacitor' ? 0.3 : null,
    available: 100,
    voltageRating: null,
    currentRating: null,
    location: 'main',
    unitCost: '0.0100',
    ...more,
  };
}

/** E12 capacitors 10 pF..100 pF and inductors 10 nH..100 nH, two arrangements possible. */
const STOCK: SnapPart[] = [10, 12, 15, 18, 22, 27, 33, 39, 47, 56, 68, 82, 100].flatMap((v) => [
  part(`C-${v}p`, 'capacitor', v * 1e-12),
  part(`L-${v}n`, 'inductor', v * 1e-9),
]);

describe('a load read from a file gives the same fits as the same impedance typed in', () => {
  // 12.5 ohm, the Bowick reference load, written as a flat file around 100 MHz.
  const file = zFile([[80, 12.5, 0], [100, 12.5, 0], [120, 12.5, 0]]);
  for (const objective of ['nominal', 'worst-case'] as const) {
    it(`${objective}: same ideal networks, same parts, same losses at f0`, () => {
      const typed = snapMatch(parseSolveRequest({ source: 50, load: 12.5, frequencyHz: 100e6, objective, combinations: true }), buildStockIndex(STOCK), DEFAULT_SNAP_SETTINGS, { yieldSamples: 100 });
      const measured = snapMatch(
        parseSolveRequest({ source: 50, loadTouchstone: { fileName: 'flat.s1p', text: file }, frequencyHz: 100e6, objective, combinations: true }),
        buildStockIndex(STOCK),
        DEFAULT_SNAP_SETTINGS,
        { yieldSamples: 100 },
      );
      expect(typed.networks.length).toBeGreaterThan(0);
      expect(measured.networks.map((n) => n.elements)).toEqual(typed.networks.map((n) => n.elements));
      const fitsOf = (r: typeof typed) => r.networks.map((n) => n.fits.map((f) => ({ parts: f.elements.map((e) => e.parts), loss: f.loss, tpg: f.tpg })));
      expect(fitsOf(typed)[0].length).toBeGreaterThan(0);
      expect(fitsOf(measured)).toEqual(fitsOf(typed));
    });
  }
});

describe('sweeps and the band loss use the measured data', () => {
  const f0 = 100e6;
  const omega = angularFrequency(f0);
  // The Bowick low-pass network: shunt C 55.13 pF across the 50 ohm source, series L 34.46 nH.
  const q = Math.sqrt(3);
  const elements = [
    { position: 'shunt' as const, kind: 'capacitor' as const, value: q / (omega * 50), reactanceOhm: -50 / q },
    { position: 'series' as const, kind: 'inductor' as const, value: (12.5 * q) / omega, reactanceOhm: 12.5 * q },
  ];
  const ideal = idealLadder(elements.map((e) => (e.position === 'series' ? seriesElement(e.reactanceOhm, omega) : shuntElement(-1 / e.reactanceOhm, omega))));

  it('a file that samples the typed model on the sweep grid gives the typed sweep (to 1e-9: the file holds 12 significant digits)', () => {
    // The typed load 10 - j20 is R with the C that has -20 ohm at f0: X(f) = -20 f0/f (port-model.ts).
    const typed = parseSolveRequest({ source: 50, load: '10-j20', frequencyHz: f0 });
    const grid = sweepFrequencies(f0, null);
    const text = writeOnePortTouchstone({
      frequencyHz: grid,
      resistanceOhm: Array.from(grid, () => 10),
      reactanceOhm: Array.from(grid, (f) => (-20 * f0) / f),
      parameter: 'Z',
      version: '2.0',
    });
    const measured = parseSolveRequest({ source: 50, loadTouchstone: { text }, frequencyHz: f0 });
    const a = matchSweep(typed, elements, ideal);
    const b = matchSweep(measured, elements, ideal);
    expect(b.frequenciesHz).toEqual(a.frequenciesHz);
    for (let i = 0; i < a.idealTpg.length; i++) expect(Math.abs(b.idealTpg[i] - a.idealTpg[i])).toBeLessThan(1e-9);
  });

  it('a flat measured load sweeps as a constant port, not as the typed model, and stays inside the file', () => {
    // 12.5 ohm flat from 90 to 130 MHz: the sweep (f0 +- 20 %) is cut to 90..120 MHz.
    const text = zFile([[90, 12.5, 0], [130, 12.5, 0]]);
    const measured = parseSolveRequest({ source: 50, loadTouchstone: { text }, frequencyHz: f0 });
    const sweep = matchSweep(measured, elements, ideal);
    expect(sweep.frequenciesHz[0]).toBe(90e6);
    expect(sweep.frequenciesHz.at(-1)).toBe(120e6);
    const constant = sweepTpg(ideal, seriesEquivalentPort({ re: 50, im: 0 }, f0), constantPort({ re: 12.5, im: 0 }), Float64Array.from(sweep.frequenciesHz));
    sweep.idealTpg.forEach((tpg, i) => expect(tpg).toBeCloseTo(constant[i], 12));
    // A conjugate match: TPG 1 at f0 (middle of 90..120 MHz is not f0, so find it).
    const nearest = sweep.frequenciesHz.reduce((best, f, i) => (Math.abs(f - f0) < Math.abs(sweep.frequenciesHz[best] - f0) ? i : best), 0);
    expect(sweep.idealTpg[nearest]).toBeGreaterThan(0.999);
  });

  it('the band loss follows the file: a load that turns reactive away from f0 loses more across the band', () => {
    // Same 12.5 ohm at f0, but +-10 ohm of reactance at the band edges in the second file.
    const flat = zFile([[90, 12.5, 0], [100, 12.5, 0], [110, 12.5, 0]]);
    const turning = zFile([[90, 12.5, -10], [100, 12.5, 0], [110, 12.5, 10]]);
    const solve = (text: string) =>
      snapMatch(parseSolveRequest({ source: 50, loadTouchstone: { text }, frequencyHz: f0, bandwidthHz: 20e6, objective: 'band' }), buildStockIndex(STOCK), DEFAULT_SNAP_SETTINGS, {
        yieldSamples: 50,
      });
    const a = solve(flat).networks[0].fits[0];
    const b = solve(turning).networks[0].fits[0];
    expect(a.loss.bandDb).not.toBeNull();
    expect(b.loss.bandDb!).toBeGreaterThan(a.loss.bandDb! + 0.1);
  });

  it('the Smith chart trace is the file inside the sweep range, interpolated ends included', () => {
    const text = zFile([[85, 11, -5], [95, 12, -1], [105, 13, 1], [115, 14, 5], [125, 15, 9]]);
    const input = parseSolveRequest({ source: 50, loadTouchstone: { fileName: 'trace.s1p', text }, frequencyHz: f0 });
    const [trace] = measuredTraces(input);
    // Sweep 85..120 MHz (f0 +- 20 % cut to the file): points 85, 95, 105, 115 and the end at 120,
    // where R = 14 + 0.5 = 14.5 and X = 5 + 0.5*4 = 7 (hand).
    expect(trace.port).toBe('load');
    expect(trace.fileName).toBe('trace.s1p');
    expect(trace.frequenciesHz).toEqual([85e6, 95e6, 105e6, 115e6, 120e6]);
    expect(trace.impedances.at(-1)!.re).toBeCloseTo(14.5, 12);
    expect(trace.impedances.at(-1)!.im).toBeCloseTo(7, 12);
    expect(measuredTraces(parseSolveRequest({ source: 50, load: 12.5, frequencyHz: f0 }))).toEqual([]);
  });
});
