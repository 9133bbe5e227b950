/**
 * Network-parameter conversions, checked on cases whose answers are derived by hand from circuit
 * facts (input impedance of the terminated network, voltage division), not from the formulas under
 * test; and two facts of the trade as properties: a lossless network's S-matrix is unitary
 * (|S11|^2 + |S21|^2 = 1), and a reciprocal one (AD - BC = 1) has S12 = S21.
 * Formulas under test: Pozar, Microwave Engineering, 4th ed., Table 4.2.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  abcdToScattering,
  admittanceToScattering,
  impedanceFromReflection,
  impedanceToScattering,
  reflectionFromImpedance,
  scatteringToAbcd,
} from '../../shared/touchstone/index.js';

const Z0 = 50;

/** Expects a 2x2 complex matrix (natural order 11, 12, 21, 22, re/im) to within `tolerance` per number. */
function expectMatrix(actual: ArrayLike<number>, expected: readonly number[], tolerance = 1e-15): void {
  expect(actual.length).toBe(8);
  for (let k = 0; k < 8; k++) expect(Math.abs(actual[k] - expected[k]), `entry ${k}: ${actual[k]} vs ${expected[k]}`).toBeLessThanOrEqual(tolerance);
}

describe('ABCD to S at 50 ohm (Pozar 4th ed., Table 4.2)', () => {
  it('a series 50 ohm resistor: S11 = S22 = 1/3, S21 = S12 = 2/3', () => {
    // By hand: port 2 terminated in 50 ohm, port 1 sees 50 + 50 = 100 ohm, so
    // S11 = (100 - 50) / (100 + 50) = 1/3. A source 2 V1+ behind 50 ohm drives 50 + 50 + 50 in
    // series, so V2 = 2 V1+ x 50/150 and S21 = V2 / V1+ = 2/3. The network is symmetric and reciprocal.
    expectMatrix(abcdToScattering([1, 0, 50, 0, 0, 0, 1, 0], Z0), [1 / 3, 0, 2 / 3, 0, 2 / 3, 0, 1 / 3, 0]);
  });

  it('a shunt 50 ohm resistor: S11 = S22 = -1/3, S21 = S12 = 2/3', () => {
    // By hand: port 1 sees 50 || 50 = 25 ohm, S11 = (25 - 50)/(25 + 50) = -1/3. Across a shunt
    // element V2 = V1 = V1+ (1 + S11), so S21 = 2/3.
    expectMatrix(abcdToScattering([1, 0, 0, 0, 1 / 50, 0, 1, 0], Z0), [-1 / 3, 0, 2 / 3, 0, 2 / 3, 0, -1 / 3, 0]);
  });

  it('a series reactance of +j50 ohm: S11 = 0.2 + j0.4, S21 = 0.8 - j0.4', () => {
    // By hand: Zin = 50 + j50, S11 = j50 / (100 + j50) = j50 (100 - j50) / 12500 = (2500 + j5000) / 12500
    //   = 0.2 + j0.4; S21 = 100 / (100 + j50) = 100 (100 - j50) / 12500 = 0.8 - j0.4.
    expectMatrix(abcdToScattering([1, 0, 0, 50, 0, 0, 1, 0], Z0), [0.2, 0.4, 0.8, -0.4, 0.8, -0.4, 0.2, 0.4], 1e-15);
  });

  it('a shunt susceptance of +j0.02 S (a capacitor): S11 = -0.2 - j0.4, S21 = 0.8 - j0.4', () => {
    // By hand: Zin = 50 || (1 / j0.02 = -j50) = -j2500 / (50 - j50) = -j50 / (1 - j) = -j50 (1 + j) / 2
    //   = 25 - j25. S11 = (-25 - j25) / (75 - j25) = (-1 - j)(3 + j) / 10 = (-2 - 4j) / 10 = -0.2 - j0.4.
    // Shunt element: S21 = 1 + S11 = 0.8 - j0.4.
    expectMatrix(abcdToScattering([1, 0, 0, 0, 0, 0.02, 1, 0], Z0), [-0.2, -0.4, 0.8, -0.4, 0.8, -0.4, -0.2, -0.4], 1e-15);
  });

  it('a quarter-wave 70.71 ohm line between 50 ohm ports: S11 = 1/3, S21 = -j 2 sqrt(2) / 3', () => {
    // Line ABCD at βl = 90° (Pozar 4th ed., Table 4.1): A = D = 0, B = j Zc, C = j / Zc, Zc = 50 sqrt 2.
    // By hand: a quarter-wave transformer shows Zin = Zc^2 / ZL = 5000 / 50 = 100 ohm (Pozar 4th ed.,
    // section 2.5), so S11 = (100 - 50)/(100 + 50) = 1/3. Lossless, so |S21| = sqrt(1 - 1/9) = 2 sqrt(2)/3
    // = 0.942809, and the 90° line delays by 90°: S21 = -j 0.942809.
    const zc = 50 * Math.SQRT2;
    const s = abcdToScattering([0, 0, 0, zc, 0, 1 / zc, 0, 0], Z0);
    expectMatrix(s, [1 / 3, 0, 0, -(2 * Math.SQRT2) / 3, 0, -(2 * Math.SQRT2) / 3, 1 / 3, 0], 1e-15);
  });

  it('refuses a matrix whose Δ = A + B/Z0 + C Z0 + D is zero', () => {
    expect(() => abcdToScattering([1, 0, 0, 0, 0, 0, -1, 0], Z0)).toThrow(/is zero/);
  });

  it('lossless networks give unitary S; reciprocal ones give S12 = S21 (facts of the trade)', () => {
    // Random lossless L networks: series jX then shunt jB, ABCD = [[1 + jX jB, jX], [jB, 1]]
    // = [[1 - X B, jX], [jB, 1]], with AD - BC = (1 - XB) - (jX)(jB) = 1 (reciprocal).
    fc.assert(
      fc.property(fc.double({ min: -1e4, max: 1e4, noNaN: true }), fc.double({ min: -1, max: 1, noNaN: true }), (x, b) => {
        const s = abcdToScattering([1 - x * b, 0, 0, x, 0, b, 1, 0], Z0);
        const power11 = s[0] ** 2 + s[1] ** 2;
        const power21 = s[4] ** 2 + s[5] ** 2;
        expect(Math.abs(power11 + power21 - 1)).toBeLessThan(1e-9);
        expect(Math.abs(s[2] - s[4]) + Math.abs(s[3] - s[5])).toBeLessThan(1e-12);
      }),
    );
  });
});

describe('S to ABCD (Pozar 4th ed., Table 4.2)', () => {
  it('takes the series 50 ohm resistor back to A = 1, B = 50, C = 0, D = 1', () => {
    // By hand with S11 = S22 = 1/3, S12 = S21 = 2/3, 2 S21 = 4/3, S12 S21 = 4/9:
    // A = ((4/3)(2/3) + 4/9) / (4/3) = (12/9) / (4/3) = 1; B = 50 ((4/3)^2 - 4/9) / (4/3) = 50 (12/9)(3/4) = 50;
    // C = ((2/3)^2 - 4/9) / 50 / (4/3) = 0; D = A by symmetry.
    expectMatrix(scatteringToAbcd([1 / 3, 0, 2 / 3, 0, 2 / 3, 0, 1 / 3, 0], Z0), [1, 0, 50, 0, 0, 0, 1, 0], 1e-13);
  });

  it('refuses S21 = 0', () => {
    expect(() => scatteringToAbcd([1, 0, 0, 0, 0, 0, 1, 0], Z0)).toThrow(/S21 is zero/);
  });
});

describe('Z and Y to S (Pozar 4th ed., Table 4.2)', () => {
  it('Z-matrix of a shunt 50 ohm resistor (every Zij = 50) gives the shunt result above', () => {
    // A shunt R between two ports: V1 = V2 = R (I1 + I2), so Z11 = Z12 = Z21 = Z22 = R. Expected as
    // worked out for the shunt resistor above: S11 = S22 = -1/3, S12 = S21 = 2/3.
    expectMatrix(impedanceToScattering([50, 0, 50, 0, 50, 0, 50, 0], Z0), [-1 / 3, 0, 2 / 3, 0, 2 / 3, 0, -1 / 3, 0]);
  });

  it('Y-matrix of a series 50 ohm resistor (Y11 = Y22 = 1/R, Y12 = Y21 = -1/R) gives the series result', () => {
    // A series R: I1 = (V1 - V2)/R = -I2. Expected as worked out above: S11 = 1/3, S21 = 2/3.
    expectMatrix(admittanceToScattering([0.02, 0, -0.02, 0, -0.02, 0, 0.02, 0], Z0), [1 / 3, 0, 2 / 3, 0, 2 / 3, 0, 1 / 3, 0], 1e-15);
  });
});

describe('one-port reflection and impedance (Pozar 4th ed., eq. 2.35)', () => {
  it('100 ohm against 50 ohm reflects 1/3, and back', () => {
    // (100 - 50) / (100 + 50) = 1/3; 50 (1 + 1/3) / (1 - 1/3) = 50 (4/3) / (2/3) = 100.
    const s = reflectionFromImpedance({ re: 100, im: 0 }, 50, { re: 0, im: 0 });
    expect(s.re).toBeCloseTo(1 / 3, 15);
    expect(s.im).toBe(0);
    const z = impedanceFromReflection({ re: 1 / 3, im: 0 }, 50, { re: 0, im: 0 });
    expect(Math.abs(z.re - 100)).toBeLessThan(1e-12);
  });

  it('50 + j50 ohm reflects 0.2 + j0.4 (the series +j50 case above, seen from port 1)', () => {
    const s = reflectionFromImpedance({ re: 50, im: 50 }, 50, { re: 0, im: 0 });
    expect(Math.abs(s.re - 0.2) + Math.abs(s.im - 0.4)).toBeLessThan(1e-15);
  });
});
