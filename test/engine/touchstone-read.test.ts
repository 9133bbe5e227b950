/**
 * Reading Touchstone files: the specification's own published examples, and our own small files
 * for the formats it gives no one-port example of.
 *
 * Source of the `spec-example-*` fixtures: Touchstone File Format Specification Version 2.0, IBIS
 * Open Forum, ratified 24 April 2009, examples numbered as in that document. The texts were typed
 * in from public transcriptions of the examples, checked against memory of the document (the PDF
 * was not at hand): treat the example numbers as "from memory".
 *
 * Every expected value is worked out by hand in the comment beside it (trigonometric values from
 * tables to 6 or 7 digits), never taken from this code's output; tolerances match the hand
 * precision.
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { readOnePortTouchstone, readTwoPortTouchstone } from '../../shared/touchstone/index.js';

const fixture = (name: string): string => readFileSync(new URL(`../fixtures/touchstone/${name}`, import.meta.url), 'utf8');

/** `|actual - expected| <= relative * |expected|` (or absolute when expected is 0). */
function expectClose(actual: number, expected: number, relative: number): void {
  const bound = relative * Math.max(Math.abs(expected), 1e-300);
  expect(Math.abs(actual - expected), `${actual} vs ${expected}`).toBeLessThanOrEqual(expected === 0 ? relative : bound);
}

describe('specification Example 8 (Version 1.0): 1-port S-parameters, MA, one point', () => {
  // "# MHz S MA R 50", "2.000 0.894 -12.136".
  const data = readOnePortTouchstone(fixture('spec-example-8-v1-one-port-s-ma.s1p'));

  it('reads the header, the frequency and the comments', () => {
    expect(data.version).toBe('1');
    expect(data.parameter).toBe('S');
    expect(data.format).toBe('MA');
    expect(data.frequencyUnit).toBe('MHz');
    expect(data.referenceOhm).toBe(50);
    expect(Array.from(data.frequencyHz)).toEqual([2e6]); // 2.000 MHz
    expect(data.comments).toEqual(['Example 8 (Version 1.0):', '1-port S-parameter file, single frequency point', 'freq magS11 angS11']);
    expect(Array.from(data.dataLine)).toEqual([5]);
  });

  it('turns S = 0.894 at -12.136 degrees into Z at 50 ohm', () => {
    // By hand: cos 12.136° = 0.977651, sin 12.136° = 0.210233, so
    // S = 0.894 (0.977651 - j 0.210233) = 0.874020 - j 0.187948.
    // 1 + S = 1.874020 - j 0.187948; 1 - S = 0.125980 + j 0.187948; |1 - S|^2 = 0.015871 + 0.035325 = 0.051196.
    // (1 + S) conj(1 - S) = (1.874020 - j 0.187948)(0.125980 - j 0.187948)
    //   = (0.236089 - 0.035324) + j(-0.352216 - 0.023678) = 0.200765 - j 0.375894.
    // Z = 50 (0.200765 - j 0.375894) / 0.051196 = 196.08 - j 367.11 ohm.
    expectClose(data.resistanceOhm[0], 196.08, 2e-4);
    expectClose(data.reactanceOhm[0], -367.11, 2e-4);
  });
});

describe('our DB rewrite of Example 8', () => {
  it('gives the same impedance as the MA original', () => {
    // -0.97325 dB: 10^(-0.97325/20) = 10^(-0.0486625) = 0.894000 (log10 0.894 = -0.048662), so the
    // same S and Z as Example 8 above, to the 5 digits the dB value was written with.
    const db = readOnePortTouchstone(fixture('own-one-port-s-db.s1p'));
    expect(db.format).toBe('DB');
    expectClose(db.resistanceOhm[0], 196.08, 3e-4);
    expectClose(db.reactanceOhm[0], -367.11, 3e-4);
  });
});

describe('specification Examples 9 (Version 1.0) and 10 (Version 2.0): the same 1-port Z-data', () => {
  // Example 9: "# MHz Z MA R 75", data normalised to 75 ohm: 0.99 -4, 0.80 -22, 0.707 -45, 0.40 -62, 0.01 -89.
  // Example 10: "[Version] 2.0", "# MHz Z MA", "[Reference] 20.0", data in ohm: 74.25 -4, 60 -22,
  // 53.025 -45, 30 -62, 0.75 -89, i.e. each magnitude of Example 9 times 75 (0.99 x 75 = 74.25,
  // 0.80 x 75 = 60, 0.707 x 75 = 53.025, 0.40 x 75 = 30, 0.01 x 75 = 0.75). So version 1 Z-data are
  // normalised to R and version 2.0 Z-data are not, and [Reference] 20 must not rescale them.
  // Impedances by hand, Z = |Z| (cos a + j sin a):
  //   100 MHz: 74.25 (0.997564 - j 0.069756) = 74.0691 - j 5.17942
  //   200 MHz: 60 (0.927184 - j 0.374607) = 55.6310 - j 22.4764
  //   300 MHz: 53.025 (0.707107 - j 0.707107) = 37.4943 - j 37.4943
  //   400 MHz: 30 (0.469472 - j 0.882948) = 14.0842 - j 26.4884
  //   500 MHz: 0.75 (0.0174524 - j 0.999848) = 0.0130893 - j 0.749886
  const expectedRe = [74.0691, 55.631, 37.4943, 14.0842, 0.0130893];
  const expectedIm = [-5.17942, -22.4764, -37.4943, -26.4884, -0.749886];
  const v1 = readOnePortTouchstone(fixture('spec-example-9-v1-one-port-z-ma.s1p'));
  const v2 = readOnePortTouchstone(fixture('spec-example-10-v2-one-port-z-ma.s1p'));

  it('reads five frequencies in MHz as hertz', () => {
    for (const data of [v1, v2]) expect(Array.from(data.frequencyHz)).toEqual([1e8, 2e8, 3e8, 4e8, 5e8]);
  });

  it('de-normalises version 1 Z-data by R 75', () => {
    expect(v1.version).toBe('1');
    expect(v1.referenceOhm).toBe(75);
    for (let i = 0; i < 5; i++) {
      expectClose(v1.resistanceOhm[i], expectedRe[i], 1e-5);
      expectClose(v1.reactanceOhm[i], expectedIm[i], 1e-5);
    }
  });

  it('takes version 2.0 Z-data as ohms, whatever [Reference] says', () => {
    expect(v2.version).toBe('2.0');
    expect(v2.parameter).toBe('Z');
    expect(v2.referenceOhm).toBe(20);
    for (let i = 0; i < 5; i++) {
      expectClose(v2.resistanceOhm[i], expectedRe[i], 1e-5);
      expectClose(v2.reactanceOhm[i], expectedIm[i], 1e-5);
    }
  });
});

describe('our Y-data files, version 1 (normalised) and version 2.0 (siemens)', () => {
  // Version 1, "# khz ri r 100 y": y = 0.5 + j0.5 means Y = y / 100 = 0.005 (1 + j) S, so
  // Z = 1 / Y = 200 / (1 + j) = 200 (1 - j) / 2 = 100 - j100 ohm; y = 0.25 - j0.25 means
  // Y = 0.0025 (1 - j) S and Z = 400 / (1 - j) = 200 + j200 ohm. Frequencies 1000 and 2000 kHz.
  // Version 2.0 writes the same Y in siemens (0.005 0.005, 0.0025 -0.0025) with [Reference] 20,
  // which must not matter for Y-data.
  for (const name of ['own-one-port-y-ri-v1.s1p', 'own-one-port-y-ri-v2.s1p']) {
    it(`reads ${name} as 100 - j100 and 200 + j200 ohm at 1 and 2 MHz`, () => {
      const data = readOnePortTouchstone(fixture(name));
      expect(data.parameter).toBe('Y');
      expect(data.format).toBe('RI');
      expect(Array.from(data.frequencyHz)).toEqual([1e6, 2e6]);
      expectClose(data.resistanceOhm[0], 100, 1e-12);
      expectClose(data.reactanceOhm[0], -100, 1e-12);
      expectClose(data.resistanceOhm[1], 200, 1e-12);
      expectClose(data.reactanceOhm[1], 200, 1e-12);
    });
  }

  it('keeps comments from every place in the file, in order', () => {
    const data = readOnePortTouchstone(fixture('own-one-port-y-ri-v1.s1p'));
    expect(data.comments).toEqual([
      'Own fixture: invented chip-antenna admittance, version 1, normalised to R = 100 ohm',
      'fields in an odd order and lower case: the specification allows both',
      'freq  Re(y11) Im(y11)',
      'tab-separated, y = 0.5 + j0.5',
      'trailing comment',
    ]);
    expect(Array.from(data.dataLine)).toEqual([5, 6]);
  });
});

describe('our S-data file in RI with the default unit (GHz) and reference (50 ohm)', () => {
  it('reads S = 0.2 + j0.4, 0 and -1/3 as 50 + j50, 50 and 25 ohm', () => {
    // Z = 50 (1 + S)/(1 - S). S = 0.2 + j0.4: (1.2 + j0.4)(0.8 + j0.4) / (0.8^2 + 0.4^2)
    //   = (0.96 - 0.16 + j(0.48 + 0.32)) / 0.8 = 1 + j1, so Z = 50 + j50.
    // S = 0: Z = 50. S = -1/3: Z = 50 (2/3) / (4/3) = 25 (the file has 12 digits of 1/3).
    const data = readOnePortTouchstone(fixture('own-one-port-s-ri.s1p'));
    expect(data.frequencyUnit).toBe('GHz');
    expect(data.referenceOhm).toBe(50);
    expect(Array.from(data.frequencyHz)).toEqual([0.868e9, 0.915e9, 2.45e9]);
    expectClose(data.resistanceOhm[0], 50, 1e-12);
    expectClose(data.reactanceOhm[0], 50, 1e-12);
    expectClose(data.resistanceOhm[1], 50, 1e-12);
    expect(data.reactanceOhm[1]).toBe(0);
    expectClose(data.resistanceOhm[2], 25, 1e-11);
  });

  it('reads CR LF and bare CR line endings and a byte-order mark alike', () => {
    const lines = ['\uFEFF! crlf', '# GHz S RI R 50', '0.868 0.2 0.4', '0.915 0 0'];
    for (const eol of ['\r\n', '\r', '\n']) {
      const data = readOnePortTouchstone(lines.join(eol));
      expect(Array.from(data.frequencyHz)).toEqual([0.868e9, 0.915e9]);
      expectClose(data.reactanceOhm[0], 50, 1e-12); // as above: S = 0.2 + j0.4 is 50 + j50 ohm
      expect(Array.from(data.dataLine)).toEqual([3, 4]);
    }
  });

  it('accepts a version 1.1 option line with one R value per port and exponent forms', () => {
    // "R 75" in version 1.1 form (one value for one port); S = 0 means Z = R = 75 ohm.
    const data = readOnePortTouchstone('# Hz s ma r 75\n8.68E+8 0.0 0.0\n9.15e8 0 0\n');
    expect(data.referenceOhm).toBe(75);
    expect(Array.from(data.frequencyHz)).toEqual([868e6, 915e6]);
    expect(data.resistanceOhm[0]).toBe(75);
  });
});

describe('two-port files (used to read back what the writer wrote)', () => {
  it('specification Example 13 (Version 1.0): 2-port S in RI, three points, order N11 N21 N12 N22', () => {
    const data = readTwoPortTouchstone(fixture('spec-example-13-v1-two-port-s-ri.s2p'));
    expect(data.parameter).toBe('S');
    expect(Array.from(data.frequencyHz)).toEqual([1e9, 2e9, 10e9]);
    // Line "2.0000 0.3517 -0.3054 -0.0096 -0.0298 -0.0096 -0.0298 0.3517 -0.3054":
    // S11 = 0.3517 - j0.3054, S21 = S12 = -0.0096 - j0.0298, S22 = S11 (natural order 11, 12, 21, 22).
    expect(Array.from(data.matrices[1])).toEqual([0.3517, -0.3054, -0.0096, -0.0298, -0.0096, -0.0298, 0.3517, -0.3054]);
    expect(data.referenceOhm).toEqual([50, 50]);
  });

  it('specification Example 17 (Version 2.0): 21_12 order, per-port [Reference], noise data skipped', () => {
    const data = readTwoPortTouchstone(fixture('spec-example-17-v2-two-port-s-ma-noise.s2p'));
    expect(data.version).toBe('2.0');
    expect(data.frequencyUnit).toBe('GHz'); // "#" alone: GHz, S, MA, R 50
    expect(data.format).toBe('MA');
    expect(data.referenceOhm).toEqual([50, 25]);
    expect(Array.from(data.frequencyHz)).toEqual([2e9, 22e9]);
    expect(data.noiseLinesSkipped).toBe(2);
    // "2 .95 -26 3.57 157 .04 76 .66 -14" in 21_12 order: S11 = 0.95∠-26°, S21 = 3.57∠157°,
    // S12 = 0.04∠76°, S22 = 0.66∠-14°. By hand (cos, sin from tables):
    //   S21 = 3.57 (-0.920505 + j 0.390731) = -3.28620 + j 1.39491
    //   S12 = 0.04 (0.241922 + j 0.970296) = 0.00967688 + j 0.0388118
    //   S11 = 0.95 (0.898794 - j 0.438371) = 0.853854 - j 0.416453
    const m = data.matrices[0];
    expectClose(m[0], 0.853854, 1e-5);
    expectClose(m[1], -0.416453, 1e-5);
    expectClose(m[2], 0.00967688, 1e-5);
    expectClose(m[3], 0.0388118, 1e-5);
    expectClose(m[4], -3.2862, 1e-5);
    expectClose(m[5], 1.39491, 1e-5);
  });

  it('specification Example 18 (Version 1.0): noise lines start where the frequency falls back', () => {
    // Network data at 2 and 22 GHz, then noise data at 4 and 18 GHz (4 <= 22 starts the noise block).
    const data = readTwoPortTouchstone(fixture('spec-example-18-v1-two-port-s-ma-noise.s2p'));
    expect(Array.from(data.frequencyHz)).toEqual([2e9, 22e9]);
    expect(data.noiseLinesSkipped).toBe(2);
    // Version 1 order N11 N21 N12 N22: the second pair 3.57∠157° is S21, real part -3.28620 (as above).
    expectClose(data.matrices[0][4], -3.2862, 1e-5);
  });

  it('a version 2.0 12_21 file puts the second pair in S12', () => {
    const text = ['[Version] 2.0', '# Hz S RI R 50', '[Number of Ports] 2', '[Two-Port Data Order] 12_21', '[Number of Frequencies] 1', '[Network Data]', '1 0.1 0 0.2 0 0.3 0 0.4 0', '[End]'].join('\n');
    expect(Array.from(readTwoPortTouchstone(text).matrices[0])).toEqual([0.1, 0, 0.2, 0, 0.3, 0, 0.4, 0]);
  });

  it('a version 2.0 Lower-format file fills S12 from S21', () => {
    const text = ['[Version] 2.0', '# Hz S RI R 50', '[Number of Ports] 2', '[Two-Port Data Order] 12_21', '[Number of Frequencies] 1', '[Matrix Format] Lower', '[Network Data]', '1 0.1 0 0.3 0 0.4 0', '[End]'].join('\n');
    expect(Array.from(readTwoPortTouchstone(text).matrices[0])).toEqual([0.1, 0, 0.3, 0, 0.3, 0, 0.4, 0]);
  });

  it('reads [Reference] values that continue on the next line', () => {
    // The specification allows the [Reference] arguments to span lines (its Example 6 does so).
    const text = ['[Version] 2.0', '# GHz S MA', '[Number of Ports] 2', '[Two-Port Data Order] 12_21', '[Reference] 50', '25', '[Number of Frequencies] 1', '[Network Data]', '1 0 0 1 0 1 0 0 0', '[End]'].join('\n');
    expect(readTwoPortTouchstone(text).referenceOhm).toEqual([50, 25]);
  });

  it('de-normalises version 1 two-port Z-data by R', () => {
    // "# Hz Z RI R 50" with z11 = 1: Z11 = 1 x 50 = 50 ohm.
    const data = readTwoPortTouchstone('# Hz Z RI R 50\n1 1 0 1 0 1 0 1 0\n');
    expect(Array.from(data.matrices[0])).toEqual([50, 0, 50, 0, 50, 0, 50, 0]);
  });
});
