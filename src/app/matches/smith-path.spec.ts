import {
  matchTarget,
  normalisedImpedance,
  reactanceAt,
  reactanceCircle,
  reflectionOf,
  resistanceCircle,
  smithPath,
} from './smith-path.js';

// Expected values below are worked by hand from Gamma = (z - 1)/(z + 1) (P. H. Smith, Electronics,
// 1939) and z = Z/Z0; the arithmetic is written beside each check.
const CLOSE = 9;

describe('smithPath', () => {
  it('moves 50 + j0 along the r = 1 circle to 1 + j1 for a series +j50 Ω, Z0 = 50 Ω', () => {
    const path = smithPath({ re: 50, im: 0 }, [{ position: 'series', reactanceOhm: 50 }], 50);
    expect(path.arcs.length).toBe(1);
    expect(path.arcs[0].impedances.length).toBe(30);
    // z = 1 + j50/50 = 1 + j1
    expect(path.end.re).toBeCloseTo(1, CLOSE);
    expect(path.end.im).toBeCloseTo(1, CLOSE);
    // Gamma = j1 / (2 + j1) = j(2 - j)/5 = (1 + 2j)/5 = 0.2 + j0.4
    const last = path.arcs[0].reflections.at(-1)!;
    expect(last.re).toBeCloseTo(0.2, CLOSE);
    expect(last.im).toBeCloseTo(0.4, CLOSE);
    // A series element keeps the resistance: every point stays on r = 1.
    for (const z of path.arcs[0].impedances) expect(z.re).toBeCloseTo(1, CLOSE);
  });

  it('moves 50 + j0 along the g = 1 circle to 0.5 - j0.5 for a shunt capacitor of -j50 Ω', () => {
    // Shunt X = -50 Ω: Y = 1/(jX) = +j0.02 S, b = 0.02 * 50 = 1, y = 1 + j1, z = 1/(1 + j) = 0.5 - j0.5.
    const path = smithPath({ re: 50, im: 0 }, [{ position: 'shunt', reactanceOhm: -50 }], 50);
    expect(path.end.re).toBeCloseTo(0.5, CLOSE);
    expect(path.end.im).toBeCloseTo(-0.5, CLOSE);
    // Gamma = (-0.5 - j0.5)/(1.5 - j0.5) = (-0.5 - j0.5)(1.5 + j0.5)/2.5 = (-0.5 - j1)/2.5 = -0.2 - j0.4
    const last = path.arcs[0].reflections.at(-1)!;
    expect(last.re).toBeCloseTo(-0.2, CLOSE);
    expect(last.im).toBeCloseTo(-0.4, CLOSE);
    // A shunt element keeps the conductance: Re(1/z) stays 1 at every point.
    for (const z of path.arcs[0].impedances) expect(z.re / (z.re * z.re + z.im * z.im)).toBeCloseTo(1, CLOSE);
  });

  it('walks the elements from the load toward the source and ends at the centre for a 200 Ω to 50 Ω L section', () => {
    // Real-to-real L section (a fact of the trade: Q = sqrt(Rhigh/Rlow - 1) = sqrt(3)); shunt across
    // the 200 Ω load with X = -200/sqrt(3), series X = +50 sqrt(3) toward the source. By hand, Z0 = 50:
    // yL = 0.25, b = 50 sqrt(3)/200 = 0.4330, y = 0.25 + j0.4330, z = (0.25 - j0.4330)/0.25 = 1 - j1.732;
    // then + j1.732 gives z = 1.
    const q = Math.sqrt(3);
    const path = smithPath(
      { re: 200, im: 0 },
      [
        { position: 'series', reactanceOhm: 50 * q },
        { position: 'shunt', reactanceOhm: -200 / q },
      ],
      50,
    );
    expect(path.arcs.map((arc) => arc.position)).toEqual(['shunt', 'series']);
    const afterShunt = path.arcs[0].impedances.at(-1)!;
    expect(afterShunt.re).toBeCloseTo(1, CLOSE);
    expect(afterShunt.im).toBeCloseTo(-q, CLOSE);
    expect(path.end.re).toBeCloseTo(1, CLOSE);
    expect(path.end.im).toBeCloseTo(0, CLOSE);
    expect(Math.hypot(path.arcs[1].reflections.at(-1)!.re, path.arcs[1].reflections.at(-1)!.im)).toBeCloseTo(0, CLOSE);
    // Each arc starts where the previous one ended.
    expect(path.arcs[1].impedances[0]).toEqual(afterShunt);
  });

  it('normalises to the reference given: 50 Ω against 25 Ω is z = 2, Gamma = 1/3', () => {
    const path = smithPath({ re: 50, im: 0 }, [], 25);
    expect(path.load).toEqual({ re: 2, im: 0 });
    expect(reflectionOf(path.load).re).toBeCloseTo(1 / 3, CLOSE);
    expect(normalisedImpedance({ re: 12, im: -35 }, 50)).toEqual({ re: 0.24, im: -0.7 });
  });

  it('puts the target at conj(Zs)/Z0', () => {
    expect(matchTarget({ re: 25, im: 10 }, 50)).toEqual({ re: 0.5, im: -0.2 });
  });

  it('refuses a reference that is not a positive resistance', () => {
    expect(() => smithPath({ re: 50, im: 0 }, [], 0)).toThrow(/reference resistance/);
    expect(() => smithPath({ re: 50, im: 0 }, [], 50, 1)).toThrow(/pointsPerElement/);
  });
});

describe('Smith chart grid', () => {
  it('has the r = 1 circle through the centre and through 1 + j1', () => {
    const circle = resistanceCircle(1);
    expect(circle).toEqual({ centre: { re: 0.5, im: 0 }, radius: 0.5 });
    // Gamma(1 + j1) = 0.2 + j0.4: |(0.2 - 0.5, 0.4)| = |(-0.3, 0.4)| = 0.5
    const g = reflectionOf({ re: 1, im: 1 });
    expect(Math.hypot(g.re - circle.centre.re, g.im - circle.centre.im)).toBeCloseTo(circle.radius, CLOSE);
  });

  it('has the x = +1 circle centred at (1, 1) through Gamma(j1) = j', () => {
    const circle = reactanceCircle(1);
    expect(circle).toEqual({ centre: { re: 1, im: 1 }, radius: 1 });
    // Gamma(j1) = (j - 1)/(j + 1) = (j - 1)(1 - j)/2 = j
    const g = reflectionOf({ re: 0, im: 1 });
    expect(g.re).toBeCloseTo(0, CLOSE);
    expect(g.im).toBeCloseTo(1, CLOSE);
    expect(Math.hypot(g.re - 1, g.im - 1)).toBeCloseTo(1, CLOSE);
  });
});

describe('reactanceAt', () => {
  it('gives X = -1/(2 pi f C) and X = 2 pi f L', () => {
    // 1 pF at 1 GHz: -1/(2 pi 1e9 1e-12) = -1000/(2 pi) = -159.155 Ω; 10 nH at 1 GHz: 2 pi 10 = 62.832 Ω
    expect(reactanceAt('capacitor', 1e-12, 1e9)).toBeCloseTo(-159.155, 3);
    expect(reactanceAt('inductor', 10e-9, 1e9)).toBeCloseTo(62.832, 3);
  });
});
