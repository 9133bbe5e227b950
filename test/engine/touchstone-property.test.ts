/**
 * Property test: random impedances written as one-port files in every parameter (S, Y, Z), format
 * (RI, MA, DB), syntax (version 1, version 2.0), frequency unit and reference read back to a
 * relative 1e-9 of |Z|.
 *
 * Why the bounds: the writer keeps 12 significant digits, so each number is off by at most 5e-13
 * relative; turning S back into Z, `Z = R (1 + S)/(1 - S)`, magnifies an error dS by
 * `2 / (|1 - S| |1 + S|)`, which grows without bound as |Z| / R goes to 0 or infinity. With
 * |Z| / R kept between 0.01 and 100 the worst case (an MA angle near 180 degrees at |Z| / R = 0.01)
 * stays near 5e-10. Angles span the passive half plane, -90 to +90 degrees.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  type DataFormat,
  type FrequencyUnit,
  type NetworkParameter,
  readOnePortTouchstone,
  writeOnePortTouchstone,
} from '../../shared/touchstone/index.js';

const point = fc.record({
  log10Ratio: fc.double({ min: -2, max: 2, noNaN: true }),
  angleRad: fc.double({ min: -Math.PI / 2, max: Math.PI / 2, noNaN: true }),
});

const file = fc.record({
  parameter: fc.constantFrom<NetworkParameter>('S', 'Y', 'Z'),
  format: fc.constantFrom<DataFormat>('RI', 'MA', 'DB'),
  version: fc.constantFrom<'1' | '2.0'>('1', '2.0'),
  frequencyUnit: fc.constantFrom<FrequencyUnit>('Hz', 'kHz', 'MHz', 'GHz'),
  referenceOhm: fc.double({ min: 1, max: 1000, noNaN: true }),
  startHz: fc.double({ min: 1e3, max: 1e10, noNaN: true }),
  points: fc.array(point, { minLength: 1, maxLength: 12 }),
});

describe('one-port write then read', () => {
  it('gives back every impedance to 1e-9 relative', () => {
    fc.assert(
      fc.property(file, (f) => {
        const count = f.points.length;
        const frequencyHz = Array.from({ length: count }, (_, i) => f.startHz * (1 + 0.01 * i));
        const resistanceOhm = f.points.map((p) => f.referenceOhm * 10 ** p.log10Ratio * Math.cos(p.angleRad));
        const reactanceOhm = f.points.map((p) => f.referenceOhm * 10 ** p.log10Ratio * Math.sin(p.angleRad));
        // Z = R (to within underflow) makes S = 0, which has no dB form: the writer refuses it
        // (tested in touchstone-write.test.ts), so such draws are skipped here.
        fc.pre(!(f.parameter === 'S' && f.format === 'DB' && resistanceOhm.some((r, i) => Math.hypot(r - f.referenceOhm, reactanceOhm[i]) < 1e-9 * f.referenceOhm)));
        const text = writeOnePortTouchstone({ frequencyHz, resistanceOhm, reactanceOhm, ...f });
        const read = readOnePortTouchstone(text);
        expect(read.parameter).toBe(f.parameter);
        expect(read.format).toBe(f.format);
        expect(read.version).toBe(f.version);
        expect(read.frequencyHz.length).toBe(count);
        for (let i = 0; i < count; i++) {
          expect(Math.abs(read.frequencyHz[i] - frequencyHz[i])).toBeLessThanOrEqual(1e-11 * frequencyHz[i]);
          const size = Math.hypot(resistanceOhm[i], reactanceOhm[i]);
          const error = Math.hypot(read.resistanceOhm[i] - resistanceOhm[i], read.reactanceOhm[i] - reactanceOhm[i]);
          expect(error / size).toBeLessThanOrEqual(1e-9);
        }
      }),
      { numRuns: 500 },
    );
  });
});
