/**
 * Part models and ports, checked against the formulas of rf-engine.md "Part models" evaluated with
 * mathjs's complex type (an independent complex arithmetic), and against circuit facts.
 */
import fc from 'fast-check';
import { complex as mComplex, add, divide, multiply, type Complex as MathComplex } from 'mathjs';
import { describe, expect, it } from 'vitest';
import {
  combineTwoParts,
  EngineInputError,
  effectiveValue,
  elementImpedance,
  elementModel,
  frequencyStatus,
  partImpedance,
  partModel,
  portImpedance,
  seriesEquivalentPort,
  tablePort,
} from '../../shared/engine/index.js';

const w = (f: number) => 2 * Math.PI * f;
const out = () => ({ re: 0, im: 0 });
const j = mComplex(0, 1);

/** Capacitor per rf-engine.md: ESR + j w ESL + 1/(j w C), ESL = 1/((2 pi SRF)^2 C), by mathjs. */
function capacitorByMathjs(c: number, srf: number, esr: number, f: number, cActual = c): MathComplex {
  const esl = 1 / (w(srf) ** 2 * c);
  return add(add(mComplex(esr, 0), multiply(j, w(f) * esl)), divide(1, multiply(j, w(f) * cActual))) as MathComplex;
}

/** Inductor per rf-engine.md: (R + j w L) parallel (1/(j w Cp)), Cp = 1/((2 pi SRF)^2 L), by mathjs. */
function inductorByMathjs(l: number, srf: number, r: number, f: number, lActual = l): MathComplex {
  const cp = 1 / (w(srf) ** 2 * l);
  const branch = add(mComplex(r, 0), multiply(j, w(f) * lActual)) as MathComplex;
  const y = add(divide(1, branch), multiply(j, w(f) * cp)) as MathComplex;
  return divide(1, y) as MathComplex;
}

const close = (actual: { re: number; im: number }, expected: MathComplex, tolerance = 1e-10) => {
  const scale = Math.hypot(expected.re, expected.im);
  expect(Math.hypot(actual.re - expected.re, actual.im - expected.im)).toBeLessThanOrEqual(tolerance * scale);
};

const logUniform = (lo: number, hi: number) => fc.double({ min: Math.log(lo), max: Math.log(hi), noNaN: true }).map(Math.exp);

describe('capacitor model', () => {
  it('matches C + ESL + ESR with ESL from SRF, over random values (mathjs reference)', () => {
    fc.assert(
      fc.property(logUniform(0.1e-12, 100e-9), logUniform(1e7, 3e10), logUniform(1e-3, 5), logUniform(1e5, 2e10), (c, srf, esr, f) => {
        const part = partModel({ kind: 'capacitor', valueSi: c, srfHz: srf, esrOhm: esr });
        close(partImpedance(part, w(f), out()), capacitorByMathjs(c, srf, esr, f));
      }),
      { numRuns: 500 },
    );
  });

  it('resonates at its SRF (reactance zero) and is capacitive below it', () => {
    const part = partModel({ kind: 'capacitor', valueSi: 10e-12, srfHz: 2e9 });
    const atSrf = partImpedance(part, w(2e9), out());
    expect(Math.abs(atSrf.im)).toBeLessThan(1e-9 * (1 / (w(2e9) * 10e-12)));
    expect(partImpedance(part, w(1e9), out()).im).toBeLessThan(0);
    expect(partImpedance(part, w(3e9), out()).im).toBeGreaterThan(0);
    // Effective capacitance below SRF: C / (1 - (f/SRF)^2), a textbook consequence of the series model.
    const x = partImpedance(part, w(1e9), out()).im;
    expect(Math.abs(effectiveValue('capacitor', x, w(1e9)) / (10e-12 / (1 - 0.25)) - 1)).toBeLessThan(1e-12);
  });

  it('loss: ESR wins over Q; from Q at fq, R = 1/(2 pi fq C Q) so Q at fq is recovered', () => {
    const fromQ = partModel({ kind: 'capacitor', valueSi: 4.7e-12, q: 80, qFrequencyHz: 500e6 });
    expect(fromQ.lossOhm).toBeCloseTo(1 / (w(500e6) * 4.7e-12 * 80), 12);
    const z = partImpedance(fromQ, w(500e6), out());
    expect(-z.im / z.re).toBeCloseTo(80, 9);
    expect(partModel({ kind: 'capacitor', valueSi: 4.7e-12, q: 80, qFrequencyHz: 500e6, esrOhm: 0.2 }).lossOhm).toBe(0.2);
    // Constant over frequency.
    expect(partImpedance(fromQ, w(2e9), out()).re).toBe(fromQ.lossOhm);
  });

  it('no SRF: no parasitics and "limit unknown"; no ESR or Q: lossless and "loss unknown"', () => {
    const part = partModel({ kind: 'capacitor', valueSi: 1e-12 });
    expect(part).toMatchObject({ eslH: 0, cpF: 0, lossOhm: 0, limitKnown: false, lossKnown: false, srfHz: null });
    expect(frequencyStatus(part, 1e9)).toBe('limit-unknown');
  });

  it('tolerance moves C only: ESL stays at its nominal-value figure', () => {
    const c = 10e-12;
    const part = partModel({ kind: 'capacitor', valueSi: c, srfHz: 3e9, esrOhm: 0.1, tolerance: { mode: 'relative', fraction: 0.05 } });
    expect(part.toleranceSi).toBeCloseTo(0.5e-12, 24);
    close(partImpedance(part, w(1e9), out(), 1.05 * c), capacitorByMathjs(c, 3e9, 0.1, 1e9, 1.05 * c));
    // The dropped-loss model keeps the parasitic reactance.
    const lossless = partImpedance(part, w(1e9), out(), c, true);
    expect(lossless.re).toBe(0);
    expect(lossless.im).toBeCloseTo(capacitorByMathjs(c, 3e9, 0, 1e9).im, 9);
  });
});

describe('inductor model', () => {
  it('matches (L + R) parallel Cp with Cp from SRF, over random values (mathjs reference)', () => {
    fc.assert(
      fc.property(logUniform(0.5e-9, 10e-6), logUniform(1e7, 2e10), logUniform(1e-3, 10), logUniform(1e5, 2e10), (l, srf, r, f) => {
        const part = partModel({ kind: 'inductor', valueSi: l, srfHz: srf, esrOhm: r });
        close(partImpedance(part, w(f), out()), inductorByMathjs(l, srf, r, f), 1e-9);
      }),
      { numRuns: 500 },
    );
  });

  it('loss from Q: R = 2 pi fq L / Q; tolerance moves L only (Cp stays nominal)', () => {
    const l = 12e-9;
    const part = partModel({ kind: 'inductor', valueSi: l, q: 40, qFrequencyHz: 250e6, srfHz: 4e9 });
    expect(part.lossOhm).toBeCloseTo((w(250e6) * l) / 40, 12);
    expect(part.cpF).toBeCloseTo(1 / (w(4e9) ** 2 * l), 25);
    close(partImpedance(part, w(1e9), out(), 0.95 * l), inductorByMathjs(l, 4e9, part.lossOhm, 1e9, 0.95 * l), 1e-9);
  });

  it('behaves as an inductor below SRF and as a capacitor above it', () => {
    const part = partModel({ kind: 'inductor', valueSi: 10e-9, srfHz: 3e9, esrOhm: 0.5 });
    expect(partImpedance(part, w(1e9), out()).im).toBeGreaterThan(0);
    expect(partImpedance(part, w(6e9), out()).im).toBeLessThan(0);
    expect(frequencyStatus(part, 1e9)).toBe('within-limit');
    expect(frequencyStatus(part, 2e9)).toBe('above-limit');
    expect(frequencyStatus(part, 3e9)).toBe('at-or-above-srf');
    expect(frequencyStatus(part, 2e9, 0.7)).toBe('within-limit');
  });
});

describe('two-part elements', () => {
  it('series adds impedances, parallel adds admittances (mathjs reference)', () => {
    const a = partModel({ kind: 'capacitor', valueSi: 2.2e-12, srfHz: 8e9, esrOhm: 0.3 });
    const b = partModel({ kind: 'capacitor', valueSi: 3.3e-12, srfHz: 6e9, esrOhm: 0.2 });
    const f = 1.5e9;
    const za = capacitorByMathjs(2.2e-12, 8e9, 0.3, f);
    const zb = capacitorByMathjs(3.3e-12, 6e9, 0.2, f);
    close(elementImpedance(elementModel('series', 'series', [a, b]), w(f), out()), add(za, zb) as MathComplex);
    close(elementImpedance(elementModel('shunt', 'parallel', [a, b]), w(f), out()), divide(multiply(za, zb), add(za, zb)) as MathComplex);
    close(combineTwoParts('single', 1, 2, 3, 4, out()), mComplex(1, 2));
  });

  it('refuses a wrong part count or mixed kinds', () => {
    const c = partModel({ kind: 'capacitor', valueSi: 1e-12 });
    const l = partModel({ kind: 'inductor', valueSi: 1e-9 });
    expect(() => elementModel('series', 'single', [c, c])).toThrow(EngineInputError);
    expect(() => elementModel('series', 'parallel', [c, l])).toThrow(/one kind/);
  });
});

describe('bad part specs', () => {
  it.each([
    [{ kind: 'capacitor', valueSi: 0 }, /valueSi/],
    [{ kind: 'capacitor', valueSi: -1e-12 }, /valueSi/],
    [{ kind: 'inductor', valueSi: Number.NaN }, /valueSi/],
    [{ kind: 'inductor', valueSi: 1e-9, srfHz: 0 }, /srfHz/],
    [{ kind: 'inductor', valueSi: 1e-9, srfHz: Number.POSITIVE_INFINITY }, /srfHz/],
    [{ kind: 'inductor', valueSi: 1e-9, esrOhm: -0.1 }, /esrOhm/],
    [{ kind: 'inductor', valueSi: 1e-9, q: 30 }, /qFrequencyHz/],
    [{ kind: 'resistor', valueSi: 1 }, /kind/],
  ])('%j', (spec, reason) => {
    expect(() => partModel(spec as never, 'parts.0')).toThrow(reason);
  });
});

describe('ports', () => {
  it('series-equivalent: X scales as f for X > 0 (an L) and as 1/f for X < 0 (a C)', () => {
    const inductive = seriesEquivalentPort({ re: 20, im: 40 }, 1e9);
    const capacitive = seriesEquivalentPort({ re: 20, im: -40 }, 1e9);
    expect(portImpedance(inductive, 2e9, out())).toEqual({ re: 20, im: 80 });
    expect(portImpedance(capacitive, 2e9, out())).toEqual({ re: 20, im: -20 });
    expect(portImpedance(capacitive, 1e9, out())).toEqual({ re: 20, im: -40 });
  });

  it('table: linear between points, end values outside', () => {
    const port = tablePort([1e9, 2e9], [10, 30], [-40, 0]);
    expect(portImpedance(port, 1.5e9, out())).toEqual({ re: 20, im: -20 });
    expect(portImpedance(port, 0.5e9, out())).toEqual({ re: 10, im: -40 });
    expect(portImpedance(port, 3e9, out())).toEqual({ re: 30, im: 0 });
    expect(() => tablePort([2e9, 1e9], [1, 1], [0, 0])).toThrow(/rise strictly/);
    expect(() => tablePort([1e9], [0], [0])).toThrow(/greater than 0/);
  });
});
