/**
 * Impedance at f0 from measured data: linear in Re Z and Im Z between neighbouring points, refused
 * outside the file's range. Data: specification Example 9 (Touchstone File Format Specification
 * Version 2.0, IBIS Open Forum, 2009; from memory, see touchstone-read.test.ts), whose impedances
 * are worked out by hand in touchstone-read.test.ts:
 *   100 MHz: 74.0691 - j5.17942 ohm, 200 MHz: 55.6310 - j22.4764 ohm, 500 MHz: 0.0130893 - j0.749886 ohm.
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { isEngineInputError } from '../../shared/engine/engine-input-error.js';
import { impedanceAtFrequency, readOnePortTouchstone } from '../../shared/touchstone/index.js';

const data = readOnePortTouchstone(readFileSync(new URL('../fixtures/touchstone/spec-example-9-v1-one-port-z-ma.s1p', import.meta.url), 'utf8'));

function errorAt(frequencyHz: number, samples = data): Error {
  try {
    impedanceAtFrequency(samples, frequencyHz);
  } catch (error) {
    return error as Error;
  }
  throw new Error(`no error at ${frequencyHz} Hz`);
}

describe('impedanceAtFrequency', () => {
  it('is linear between neighbours', () => {
    // 150 MHz is halfway: Re = (74.0691 + 55.6310)/2 = 64.85005, Im = (-5.17942 - 22.4764)/2 = -13.82791.
    const mid = impedanceAtFrequency(data, 150e6);
    expect(mid.re).toBeCloseTo(64.85005, 3);
    expect(mid.im).toBeCloseTo(-13.82791, 3);
    // 125 MHz is a quarter of the way: Re = 74.0691 + 0.25 (55.6310 - 74.0691) = 74.0691 - 4.609525 = 69.459575.
    expect(impedanceAtFrequency(data, 125e6).re).toBeCloseTo(69.459575, 3);
  });

  it('is exact at the measured points, the ends included', () => {
    for (let i = 0; i < data.frequencyHz.length; i++) {
      const z = impedanceAtFrequency(data, data.frequencyHz[i]);
      expect(z.re).toBe(data.resistanceOhm[i]);
      expect(z.im).toBe(data.reactanceOhm[i]);
    }
    expect(impedanceAtFrequency(data, 500e6).im).toBeCloseTo(-0.749886, 5);
  });

  it('refuses a frequency outside the file, naming the range', () => {
    for (const f of [99e6, 500.001e6, 0]) {
      const error = errorAt(f);
      expect(isEngineInputError(error)).toBe(true);
      expect(error.message).toMatch(/is outside the measured data \(100 MHz to 500 MHz\)/);
    }
  });

  it('refuses anything but the one frequency of a single-point file, and NaN', () => {
    const single = readOnePortTouchstone('# MHz S MA R 50\n2.000 0.894 -12.136\n');
    expect(impedanceAtFrequency(single, 2e6).re).toBe(single.resistanceOhm[0]);
    expect(errorAt(2.1e6, single).message).toMatch(/outside the measured data \(only 2 MHz\)/);
    expect(errorAt(Number.NaN).message).toMatch(/finite number of hertz/);
  });

  it('meets a typed 868 MHz at a file point written as 0.868 GHz', () => {
    // 0.868 x 1e9 need not be exactly the double nearest 868e6; the edge tolerance (1e-12) covers that.
    const ghz = readOnePortTouchstone('# GHz S RI R 50\n0.868 0.2 0.4\n0.915 0 0\n');
    const z = impedanceAtFrequency(ghz, 868e6);
    expect(z.re).toBeCloseTo(50, 9); // S = 0.2 + j0.4 is 50 + j50 ohm (worked out in touchstone-read.test.ts)
    expect(z.im).toBeCloseTo(50, 9);
  });
});
