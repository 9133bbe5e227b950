/**
 * Writes seeds/measured/tarnwick-868-chip-antenna.s1p: the invented "measured" impedance of the small
 * chip antenna on Tarnwick Field Sensors' sub-GHz board (handbook product.md, demo scenario), as a
 * vector network analyser would save it: version 1 Touchstone, S11 in magnitude and angle, MHz,
 * 50 ohm reference, 780 to 960 MHz in 1 MHz steps. Run once with `npx tsx seeds/make-demo-antenna.ts`;
 * the output is committed, and the browser suite and the examples upload it.
 *
 * Everything is invented but shaped like a real electrically small antenna (facts of the trade, no
 * particular maker): a series R-L-C resonator that resonates above the band (so it is capacitive at
 * 868 MHz), radiation resistance rising as f^2 plus a loss resistance, a feed pad of 0.35 pF across
 * the terminals, and a little seeded measurement noise (about 0.2 % of |Z|) so it reads like a
 * measurement rather than a formula.
 */
import { writeFileSync, mkdirSync } from 'node:fs';
import { join } from 'node:path';
import { mulberry32 } from '../shared/engine/seeded-random.js';
import { writeOnePortTouchstone } from '../shared/touchstone/index.js';

const SEED = 868_2026;
const random = mulberry32(SEED);

/** Series resonator: resonance at 935 MHz with 38 nH. */
const L_H = 38e-9;
const RESONANCE_HZ = 935e6;
const C_H = 1 / ((2 * Math.PI * RESONANCE_HZ) ** 2 * L_H);
/** Radiation resistance at the resonance, ohm, scaling as f^2. */
const RADIATION_OHM = 7.5;
/** Conductor and ceramic loss, ohm. */
const LOSS_OHM = 2.2;
/** Feed pad capacitance across the terminals, F. */
const PAD_F = 0.35e-12;
/** Relative measurement noise (standard-ish spread of a uniform draw). */
const NOISE = 0.002;

/** The invented antenna impedance at `f` (ohm). */
export function demoAntennaImpedance(f: number): { re: number; im: number } {
  const w = 2 * Math.PI * f;
  const r = RADIATION_OHM * (f / RESONANCE_HZ) ** 2 + LOSS_OHM;
  const x = w * L_H - 1 / (w * C_H);
  // In parallel with the pad: Z = Zs / (1 + j w Cp Zs).
  const dRe = 1 - w * PAD_F * x;
  const dIm = w * PAD_F * r;
  const d = dRe * dRe + dIm * dIm;
  return { re: (r * dRe + x * dIm) / d, im: (x * dRe - r * dIm) / d };
}

export const DEMO_ANTENNA_FILE = join(import.meta.dirname, 'measured', 'tarnwick-868-chip-antenna.s1p');

function main(): void {
  const frequencyHz: number[] = [];
  const resistanceOhm: number[] = [];
  const reactanceOhm: number[] = [];
  for (let mhz = 780; mhz <= 960; mhz++) {
    const f = mhz * 1e6;
    const z = demoAntennaImpedance(f);
    const size = Math.hypot(z.re, z.im);
    frequencyHz.push(f);
    resistanceOhm.push(z.re + (random() - 0.5) * 2 * NOISE * size * 0.3);
    reactanceOhm.push(z.im + (random() - 0.5) * 2 * NOISE * size);
  }
  const text = writeOnePortTouchstone({
    frequencyHz,
    resistanceOhm,
    reactanceOhm,
    parameter: 'S',
    format: 'MA',
    frequencyUnit: 'MHz',
    commentLines: [
      'Tarnwick Field Sensors, soil node rev C, 868 MHz chip antenna at its feed (invented demo data)',
      'Measured S11 after port extension to the antenna pad, board in its enclosure',
    ],
  });
  mkdirSync(join(import.meta.dirname, 'measured'), { recursive: true });
  writeFileSync(DEMO_ANTENNA_FILE, text);
  const at = demoAntennaImpedance(868e6);
  console.log(`Wrote ${DEMO_ANTENNA_FILE}: ${frequencyHz.length} points; Z(868 MHz) about ${at.re.toFixed(2)} ${at.im < 0 ? '-' : '+'} j${Math.abs(at.im).toFixed(2)} ohm`);
}

if (process.argv[1] && import.meta.url.endsWith(process.argv[1].split('/').pop()!)) main();
