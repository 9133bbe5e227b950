/**
 * Writes seeds/demo-stock.csv: the invented stores of Tarnwick Field Sensors (handbook product.md),
 * a few hundred 0402/0603 chip capacitors and inductors. Run once with `npx tsx seeds/make-demo-stock.ts`;
 * the output is committed and the seeder loads it through the stock importer.
 *
 * Everything is invented but shaped like real parts (facts of the trade, no particular maker):
 * - C0G chip capacitors: SRF from a package ESL (about 0.18 nH for 0402, 0.35 nH for 0603), so SRF
 *   falls with C as `1 / (2 pi sqrt(ESL C))`: roughly 12 GHz at 1 pF, 1.2 GHz at 100 pF (0402);
 *   small values get an absolute tolerance (IEC 60062 B/C/D), larger ones 2 % or 5 %; ESR a few
 *   tenths of an ohm.
 * - 0402/0603 wirewound and multilayer inductors: SRF from a self-capacitance that grows slowly with
 *   L, about 19 GHz at 1 nH down to about 1 GHz at 120 nH (0402); Q 25..60 at 250/500/800 MHz for
 *   wirewound, 8..14 at 100 MHz for multilayer; current ratings falling with L.
 * - Quantities from 0 (about one part in ten is out of stock) to a few thousand; locations `main`
 *   and `lab`; unit costs in cents with four decimals.
 */
import { writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { mulberry32 } from '../shared/engine/seeded-random.js';
import { eSeriesValues, type ESeriesName } from '../shared/engine/e-series.js';

/** Fixed seed: the file is the same on every run. */
const SEED = 20261202;
const random = mulberry32(SEED);

/** Package inductance of a C0G chip capacitor, H (fact of the trade, typical order of magnitude). */
const CAPACITOR_ESL_H = { '0402': 0.18e-9, '0603': 0.35e-9 } as const;
/** Highest SRF the demo lists; above it the maker would not have measured, so it is left blank. */
const MAX_LISTED_SRF_HZ = 25e9;

const HEADER =
  'part_number,kind,value,tolerance,srf,q,q_freq,esr,quantity,package,voltage_rating,current_rating,location,series,unit_cost,manufacturer_part,description';

interface DemoPart {
  partNumber: string;
  kind: 'C' | 'L';
  value: string;
  tolerance: string;
  srf: string;
  q: string;
  qFreq: string;
  esr: string;
  quantity: number;
  pkg: string;
  voltage: string;
  current: string;
  series: string;
  unitCost: string;
  manufacturerPart: string;
  description: string;
}

function pick<T>(items: readonly T[]): T {
  return items[Math.floor(random() * items.length)];
}

function between(low: number, high: number): number {
  return low + (high - low) * random();
}

/** A stock count: about one in ten is zero, the rest spread over a few decades. */
function quantity(): number {
  if (random() < 0.1) return 0;
  return Math.round(10 ** between(0.7, 3.6));
}

/** 3 significant digits, as a datasheet would print it. */
function sig3(x: number): number {
  return Number(x.toPrecision(3));
}

/** IEC 60062 style code: 4.7 -> 4P7 (pF) or 4N7 (nH), 1 -> 1P0, 10 -> 10P, 100 -> 100P. */
function valueCode(mantissaTimesUnit: number, letter: 'P' | 'N'): string {
  const text = String(Number(mantissaTimesUnit.toPrecision(3)));
  if (text.includes('.')) return text.replace('.', letter);
  return mantissaTimesUnit < 10 ? `${text}${letter}0` : `${text}${letter}`;
}

/** A frequency as a datasheet prints it: `5.04GHz`, `461MHz`. */
function frequencyText(hz: number): string {
  return hz >= 1e9 ? `${sig3(hz / 1e9)}GHz` : `${sig3(hz / 1e6)}MHz`;
}

/** Values of a series from `low` to `high` (in pF or nH), inclusive. */
function seriesRange(name: ESeriesName, low: number, high: number): number[] {
  const out: number[] = [];
  for (let exponent = -1; exponent <= 3; exponent += 1) {
    for (const m of eSeriesValues(name)) {
      const v = Number(`${m}e${exponent}`);
      if (v >= low * 0.999 && v <= high * 1.001) out.push(v);
    }
  }
  return out;
}

function capacitor(pF: number, pkg: '0402' | '0603', series: string): DemoPart {
  const farad = pF * 1e-12;
  const srfHz = 1 / (2 * Math.PI * Math.sqrt(CAPACITOR_ESL_H[pkg] * farad));
  const tolerance = pF < 0.5 ? '±0.05pF' : pF < 1 ? 'B' : pF < 5 ? pick(['B', 'C']) : pF < 10 ? pick(['C', 'D']) : pick(['J', 'J', 'G']);
  // Q is quoted at 1 GHz only where that is well below the SRF; the others list ESR.
  const useQ = random() < 0.4 && srfHz > 3e9;
  // ESR at about 1 GHz falls with C (larger electrodes): about 0.4 ohm at 1 pF, 0.12 ohm at 100 pF.
  const esrOhm = sig3((0.08 + 0.35 / Math.sqrt(pF)) * between(0.8, 1.2));
  const qAt1GHz = Math.round(1 / (2 * Math.PI * 1e9 * farad * esrOhm));
  const code = valueCode(pF, 'P');
  return {
    partNumber: `TW-C${pkg}-${code}`,
    kind: 'C',
    value: `${sig3(pF)}pF`,
    tolerance,
    srf: srfHz > MAX_LISTED_SRF_HZ ? '' : frequencyText(srfHz),
    q: useQ ? String(Math.min(qAt1GHz, 2000)) : '',
    qFreq: useQ ? '1GHz' : '',
    esr: useQ ? '' : String(esrOhm),
    quantity: quantity(),
    pkg,
    voltage: pkg === '0402' ? (pF > 47 ? '25V' : '50V') : pF > 220 ? '50V' : '100V',
    current: '',
    series,
    unitCost: (pkg === '0402' ? between(0.004, 0.02) : between(0.008, 0.035)).toFixed(4),
    manufacturerPart: `NXC${pkg === '0402' ? '15' : '18'}-${code}-C0G`,
    description: `${pkg} C0G chip capacitor`,
  };
}

type InductorFamily = 'wirewound' | 'multilayer';

function inductor(nH: number, pkg: '0402' | '0603', family: InductorFamily, series: string): DemoPart {
  const henry = nH * 1e-9;
  // Self-capacitance growing slowly with L: 0.07 pF + 1.1 fF per nH (0402), a little more for 0603.
  const cpF = (pkg === '0402' ? 0.07e-12 : 0.09e-12) + nH * (pkg === '0402' ? 1.1e-15 : 1.3e-15) + (family === 'multilayer' ? 0.03e-12 : 0);
  const srfHz = 1 / (2 * Math.PI * Math.sqrt(henry * cpF));
  const qFreqHz = family === 'multilayer' ? 100e6 : nH < 4 ? 800e6 : nH < 40 ? 500e6 : 250e6;
  const q = family === 'multilayer' ? Math.round(between(8, 14)) : Math.round(between(25, 45) + (pkg === '0603' ? 12 : 0));
  const currentA = sig3(Math.max(0.05, (family === 'wirewound' ? 1.2 : 0.6) * nH ** -0.35 * (pkg === '0603' ? 1.4 : 1)));
  const tolerance = nH < 10 ? pick(['±0.2nH', '±0.3nH', '0.1nH']) : pick(['J', 'J', 'G', '2%']);
  const code = valueCode(nH, 'N');
  const tech = family === 'wirewound' ? 'W' : 'M';
  return {
    partNumber: `TW-L${pkg}${tech}-${code}`,
    kind: 'L',
    value: `${sig3(nH)}nH`,
    tolerance,
    srf: srfHz > MAX_LISTED_SRF_HZ ? '' : frequencyText(srfHz),
    q: String(q),
    qFreq: `${qFreqHz / 1e6}MHz`,
    esr: '',
    quantity: quantity(),
    pkg,
    voltage: '',
    current: currentA >= 1 ? `${currentA}A` : `${Math.round(currentA * 1000)}mA`,
    series,
    unitCost: (family === 'wirewound' ? between(0.04, 0.22) : between(0.01, 0.05)).toFixed(4),
    manufacturerPart: `NX${tech}L${pkg === '0402' ? '15' : '18'}-${code}`,
    description: `${pkg} ${family} chip inductor`,
  };
}

function build(): DemoPart[] {
  const parts: DemoPart[] = [];
  for (let tenths = 1; tenths <= 9; tenths += 1) parts.push(capacitor(tenths / 10, '0402', ''));
  for (const pF of seriesRange('E24', 1, 100)) parts.push(capacitor(pF, '0402', 'E24'));
  for (const pF of seriesRange('E12', 1, 1000)) parts.push(capacitor(pF, '0603', 'E12'));
  for (const nH of seriesRange('E24', 1, 120)) parts.push(inductor(nH, '0402', 'wirewound', 'E24'));
  for (const nH of seriesRange('E12', 1, 100)) parts.push(inductor(nH, '0402', 'multilayer', 'E12'));
  for (const nH of seriesRange('E12', 1.8, 270)) parts.push(inductor(nH, '0603', 'wirewound', 'E12'));
  return parts;
}

function cell(text: string): string {
  return /[",\n]/.test(text) ? `"${text.replace(/"/g, '""')}"` : text;
}

function line(part: DemoPart, location: string, qty = part.quantity): string {
  return [
    part.partNumber, part.kind, part.value, part.tolerance, part.srf, part.q, part.qFreq, part.esr, String(qty), part.pkg,
    part.voltage, part.current, location, part.series, part.unitCost, part.manufacturerPart, part.description,
  ]
    .map(cell)
    .join(',');
}

const parts = build();
const lines = [HEADER, ...parts.map((p) => line(p, 'main'))];
// The lab keeps a small drawer of the values the 868/915 MHz and 2.45 GHz boards use most.
for (const part of parts) {
  if (part.pkg === '0402' && random() < 0.35) lines.push(line(part, 'lab', Math.round(between(0, 60))));
}
const out = join(import.meta.dirname, 'demo-stock.csv');
writeFileSync(out, lines.join('\n') + '\n');
console.log(`Wrote ${lines.length - 1} rows to ${out}`);
