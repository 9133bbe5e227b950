/**
 * Writing Touchstone files: the exact text for cases worked out by hand, and a write-then-read
 * round trip of a lossy L network over a 1,001-point sweep that must give back the S-parameters
 * computed from the ABCD matrices to 1e-9 (relative).
 */
import { describe, expect, it } from 'vitest';
import { isEngineInputError } from '../../shared/engine/engine-input-error.js';
import {
  abcdToScattering,
  formatTouchstoneNumber,
  readOnePortTouchstone,
  readTwoPortTouchstone,
  writeOnePortTouchstone,
  writeTwoPortTouchstone,
} from '../../shared/touchstone/index.js';

const SERIES_50_OHM = Float64Array.from([1, 0, 50, 0, 0, 0, 1, 0]);

function dataLines(text: string): string[] {
  return text.split('\n').filter((line) => line !== '' && !line.startsWith('!') && !line.startsWith('#') && !line.startsWith('['));
}

describe('formatTouchstoneNumber', () => {
  it('writes 12 significant digits', () => {
    // 1/3 = 0.333333333333333..., 2/3 = 0.666666666666666... rounded to 12 digits.
    expect(formatTouchstoneNumber(1 / 3)).toBe('3.33333333333e-1');
    expect(formatTouchstoneNumber(2 / 3)).toBe('6.66666666667e-1');
    expect(formatTouchstoneNumber(868e6)).toBe('8.68000000000e+8');
    expect(formatTouchstoneNumber(-0.5)).toBe('-5.00000000000e-1');
  });
});

describe('writeTwoPortTouchstone', () => {
  const text = writeTwoPortTouchstone({
    frequencyHz: [868e6, 915e6],
    abcd: [SERIES_50_OHM, SERIES_50_OHM],
    commentLines: ['Match: Tarnwick sub-GHz antenna feed', 'series: 4.7 nH ±2 % (0402), shunt: 1.5 pF ±0.1 pF', 'Z = 12 − j35 Ω\nsecond line'],
  });
  const lines = text.split('\n');

  it('starts with the product line and the caller\'s lines, in ASCII', () => {
    expect(lines[0]).toBe('! Written by Shelfmatch');
    expect(lines[1]).toBe('! Match: Tarnwick sub-GHz antenna feed');
    expect(lines[2]).toBe('! series: 4.7 nH +/-2 % (0402), shunt: 1.5 pF +/-0.1 pF');
    expect(lines[3]).toBe('! Z = 12 ? j35 ohm'); // U+2212 minus sign has no ASCII mapping: "?"
    expect(lines[4]).toBe('! second line');
    expect(text).toMatch(/^[\x20-\x7e\n]*$/); // ASCII only (specification, General Syntax Rules, rule 2)
  });

  it('notes the data order and writes the version 1 option line', () => {
    expect(text).toContain('! Data order on each line (the fixed version 1 two-port order): frequency, S11, S21, S12, S22.');
    expect(lines.filter((line) => line.startsWith('#'))).toEqual(['# Hz S RI R 50']);
  });

  it('writes S11 = S22 = 1/3 and S21 = S12 = 2/3 for a series 50 ohm resistor', () => {
    // Hand values from touchstone-network-parameters.test.ts (series resistor), 12 digits each.
    const zero = '0.00000000000e+0';
    expect(dataLines(text)).toEqual([
      `8.68000000000e+8 3.33333333333e-1 ${zero} 6.66666666667e-1 ${zero} 6.66666666667e-1 ${zero} 3.33333333333e-1 ${zero}`,
      `9.15000000000e+8 3.33333333333e-1 ${zero} 6.66666666667e-1 ${zero} 6.66666666667e-1 ${zero} 3.33333333333e-1 ${zero}`,
    ]);
  });

  it('puts S21 before S12, as version 1 requires', () => {
    // A non-reciprocal matrix tells the two apart: A = 2, B = C = 0, D = 1 (an ideal 2:1 voltage
    // step-down, AD - BC = 2). By Table 4.2 by hand: Δ = 2 + 0 + 0 + 1 = 3, S11 = (2 - 1)/3 = 1/3,
    // S12 = 2 (2)/3 = 4/3, S21 = 2/3, S22 = (-2 + 1)/3 = -1/3. File order: S11 S21 S12 S22.
    const out = writeTwoPortTouchstone({ frequencyHz: [1e6], abcd: [[2, 0, 0, 0, 0, 0, 1, 0]] });
    const numbers = dataLines(out)[0].split(' ').map(Number);
    expect(numbers).toEqual([1e6, 0.333333333333, 0, 0.666666666667, 0, 1.33333333333, 0, -0.333333333333, 0]);
  });

  it('refuses bad input with a field and a reason', () => {
    const cases: [() => unknown, RegExp][] = [
      [() => writeTwoPortTouchstone({ frequencyHz: [], abcd: [] }), /at least one frequency/],
      [() => writeTwoPortTouchstone({ frequencyHz: [1, 2], abcd: [SERIES_50_OHM] }), /abcd has 1 entries but frequencyHz has 2/],
      [() => writeTwoPortTouchstone({ frequencyHz: [2, 1], abcd: [SERIES_50_OHM, SERIES_50_OHM] }), /Frequencies must increase/],
      [() => writeTwoPortTouchstone({ frequencyHz: [Number.NaN], abcd: [SERIES_50_OHM] }), /finite number of hertz/],
      [() => writeTwoPortTouchstone({ frequencyHz: [1], abcd: [[1, 0, Number.POSITIVE_INFINITY, 0, 0, 0, 1, 0]] }), /must be finite numbers/],
      [() => writeTwoPortTouchstone({ frequencyHz: [1], abcd: [[1, 0, 0]] }), /must be 8 numbers/],
      [() => writeTwoPortTouchstone({ frequencyHz: [1], abcd: [SERIES_50_OHM], referenceOhm: 0 }), /positive number of ohms/],
    ];
    for (const [write, says] of cases) {
      let caught: unknown;
      try {
        write();
      } catch (error) {
        caught = error;
      }
      expect(isEngineInputError(caught), String(caught)).toBe(true);
      expect((caught as Error).message).toMatch(says);
    }
  });
});

describe('two-port round trip: a lossy L network over 1,001 points', () => {
  // An invented 868 MHz L network: series inductor 12 nH with 0.4 ohm loss, then a shunt capacitor
  // 2.2 pF with a 2e-4 S loss conductance. ABCD of series Z then shunt Y, multiplied by hand:
  // [[1, Z], [0, 1]] [[1, 0], [Y, 1]] = [[1 + Z Y, Z], [Y, 1]].
  const f0Hz = 868e6;
  const count = 1001;
  const frequencyHz = new Float64Array(count);
  for (let i = 0; i < count; i++) frequencyHz[i] = 600e6 + (i * 600e6) / (count - 1);
  frequencyHz[Math.round(((f0Hz - 600e6) / 600e6) * (count - 1))] = f0Hz; // the sweep holds f0 itself
  const abcd = Array.from(frequencyHz, (f) => {
    const w = 2 * Math.PI * f;
    const zRe = 0.4;
    const zIm = w * 12e-9;
    const yRe = 2e-4;
    const yIm = w * 2.2e-12;
    return Float64Array.from([1 + zRe * yRe - zIm * yIm, zRe * yIm + zIm * yRe, zRe, zIm, yRe, yIm, 1, 0]);
  });
  const text = writeTwoPortTouchstone({ frequencyHz, abcd, commentLines: ['round-trip test'] });
  const read = readTwoPortTouchstone(text);

  it('reads back every frequency, f0 among them', () => {
    expect(read.frequencyHz.length).toBe(count);
    expect(Array.from(read.frequencyHz)).toContain(f0Hz);
    for (let i = 0; i < count; i++) expect(Math.abs(read.frequencyHz[i] - frequencyHz[i])).toBeLessThanOrEqual(1e-12 * frequencyHz[i]);
  });

  it('matches the S-parameters computed from ABCD to 1e-9 relative, element by element', () => {
    let worst = 0;
    for (let i = 0; i < count; i++) {
      const expected = abcdToScattering(abcd[i], 50);
      for (let e = 0; e < 4; e++) {
        const dRe = read.matrices[i][2 * e] - expected[2 * e];
        const dIm = read.matrices[i][2 * e + 1] - expected[2 * e + 1];
        const size = Math.hypot(expected[2 * e], expected[2 * e + 1]);
        worst = Math.max(worst, Math.hypot(dRe, dIm) / size);
      }
    }
    expect(worst).toBeLessThanOrEqual(1e-9);
  });
});

describe('writeOnePortTouchstone', () => {
  const z = { frequencyHz: [1e6], resistanceOhm: [100], reactanceOhm: [-100] };

  it('normalises Z and Y to R in version 1 and not in version 2.0', () => {
    // Z = 100 - j100 at R = 50: version 1 z = Z / R = 2 - j2; y = R / Z = 50 (100 + j100) / 20000
    // = 0.25 + j0.25. Version 2.0: Z = 100 - j100 ohm, Y = 1 / Z = (100 + j100) / 20000 = 0.005 + j0.005 S.
    const line = (text: string): number[] => dataLines(text)[0].split(' ').map(Number);
    expect(line(writeOnePortTouchstone({ ...z, parameter: 'Z', version: '1' }))).toEqual([1e6, 2, -2]);
    expect(line(writeOnePortTouchstone({ ...z, parameter: 'Y', version: '1' }))).toEqual([1e6, 0.25, 0.25]);
    expect(line(writeOnePortTouchstone({ ...z, parameter: 'Z', version: '2.0' }))).toEqual([1e6, 100, -100]);
    expect(line(writeOnePortTouchstone({ ...z, parameter: 'Y', version: '2.0' }))).toEqual([1e6, 0.005, 0.005]);
  });

  it('writes the version 2.0 keywords in the specification\'s order', () => {
    const text = writeOnePortTouchstone({ ...z, version: '2.0', frequencyUnit: 'MHz', format: 'MA' });
    const structure = text.split('\n').filter((l) => l.startsWith('[') || l.startsWith('#'));
    expect(structure).toEqual(['[Version] 2.0', '# MHz S MA R 50', '[Number of Ports] 1', '[Number of Frequencies] 1', '[Network Data]', '[End]']);
    const data = readOnePortTouchstone(text);
    expect(Math.abs(data.resistanceOhm[0] - 100)).toBeLessThan(1e-9);
    expect(Math.abs(data.reactanceOhm[0] + 100)).toBeLessThan(1e-9);
  });

  it('refuses what a format cannot hold', () => {
    expect(() => writeOnePortTouchstone({ frequencyHz: [1], resistanceOhm: [50], reactanceOhm: [0], format: 'DB' })).toThrow(/no dB form/); // S = 0
    expect(() => writeOnePortTouchstone({ frequencyHz: [1], resistanceOhm: [0], reactanceOhm: [0], parameter: 'Y' })).toThrow(/short circuit/);
    expect(() => writeOnePortTouchstone({ frequencyHz: [1, 2], resistanceOhm: [50], reactanceOhm: [0, 0] })).toThrow(/resistanceOhm has 1 entries/);
  });
});
