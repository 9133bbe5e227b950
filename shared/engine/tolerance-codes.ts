/**
 * Tolerances of parts: relative (`5 %`, letter J) or absolute (`±0.1 pF`, letter B), the IEC 60062
 * letter codes, and parsing of the stock list's `tolerance` column.
 */
import { EngineInputError, quoteValue } from './engine-input-error.js';
import type { PartKind } from './part-kind.js';
import { parseValue } from './value-parse.js';

/** A part tolerance: a fraction of the value, or an absolute amount in F or H. */
export type Tolerance =
  | { mode: 'relative'; fraction: number }
  | { mode: 'absolute'; deltaSi: number };

/** The tolerance of an exact (ideal) part. */
export const EXACT: Tolerance = Object.freeze({ mode: 'relative', fraction: 0 });

/** IEC 60062 tolerance letters as the handbook uses them (B, C, D absolute in pF: small capacitors). */
export type ToleranceLetter = 'B' | 'C' | 'D' | 'F' | 'G' | 'J' | 'K' | 'M';

/**
 * IEC 60062 tolerance letters: B ±0.1 pF, C ±0.25 pF, D ±0.5 pF, F ±1 %, G ±2 %, J ±5 %, K ±10 %,
 * M ±20 %. (IEC 60062 gives B, C, D in pF for capacitors below 10 pF, the range where RF chip
 * capacitors use them.)
 */
export const TOLERANCE_LETTERS: Readonly<Record<ToleranceLetter, Tolerance>> = Object.freeze({
  B: { mode: 'absolute', deltaSi: 0.1e-12 },
  C: { mode: 'absolute', deltaSi: 0.25e-12 },
  D: { mode: 'absolute', deltaSi: 0.5e-12 },
  F: { mode: 'relative', fraction: 0.01 },
  G: { mode: 'relative', fraction: 0.02 },
  J: { mode: 'relative', fraction: 0.05 },
  K: { mode: 'relative', fraction: 0.1 },
  M: { mode: 'relative', fraction: 0.2 },
});

/** Largest relative tolerance accepted (±100 % would let a part vanish). */
export const MAX_RELATIVE_TOLERANCE = 0.5;

/**
 * The ± amount of a tolerance at a nominal value, in F or H: `fraction * nominal` or `deltaSi`.
 * An absolute tolerance applies as is (handbook rf-engine.md, worstCase).
 */
export function toleranceDeltaSi(tolerance: Tolerance, nominalSi: number): number {
  return tolerance.mode === 'relative' ? tolerance.fraction * nominalSi : tolerance.deltaSi;
}

const EXAMPLE = {
  capacitor: '"5%", "±5 %", "J", "0.1pF", "±0.25 pF" or "C"',
  inductor: '"5%", "±2 %", "J", "±0.2 nH" or "0.3nH"',
} as const;

function fail(field: string, value: unknown, kind: PartKind, reason: string): never {
  throw new EngineInputError(field, value, `${field}: ${quoteValue(value)} ${reason}; write it like ${EXAMPLE[kind]}`);
}

/**
 * Parses a tolerance: `5%`, `±5 %`, `+/-5%`, a letter (IEC 60062), or an absolute amount with a
 * unit that fits the kind (`0.1pF`, `±0.25 pF`, `±0.2 nH`). B, C, D are capacitance amounts in pF
 * and are refused for an inductor, where they would have no meaning.
 * @throws EngineInputError quoting the input and showing accepted forms
 */
export function parseTolerance(input: unknown, kind: PartKind, field = 'tolerance'): Tolerance {
  if (typeof input !== 'string') fail(field, input, kind, 'is not a tolerance');
  const text = input.trim().replace(/^(±|\+\/-|\+-)\s*/, '');
  if (text === '') fail(field, input, kind, 'is empty');
  const letter = text.toUpperCase();
  if (letter.length === 1 && letter in TOLERANCE_LETTERS) {
    const tolerance = TOLERANCE_LETTERS[letter as ToleranceLetter];
    if (kind === 'inductor' && tolerance.mode === 'absolute') {
      fail(field, input, kind, `is an IEC 60062 capacitance tolerance (±${tolerance.deltaSi * 1e12} pF), not one for an inductor`);
    }
    return tolerance;
  }
  const percent = /^(\d+\.?\d*|\.\d+)\s*%$/.exec(text);
  if (percent) {
    const fraction = Number(percent[1]) / 100;
    if (fraction > MAX_RELATIVE_TOLERANCE) fail(field, input, kind, `is more than ±${MAX_RELATIVE_TOLERANCE * 100} %`);
    return { mode: 'relative', fraction };
  }
  if (!/[a-zA-Zµμ]/.test(text)) fail(field, input, kind, 'has no % sign or unit, so it could be a fraction or an amount');
  let deltaSi: number;
  try {
    deltaSi = parseValue(text, kind === 'capacitor' ? 'capacitance' : 'inductance', { field, sign: 'non-negative' });
  } catch {
    fail(field, input, kind, 'is not a tolerance');
  }
  return { mode: 'absolute', deltaSi };
}

/** Shows a tolerance as text that {@link parseTolerance} reads back (`±5 %`, `±0.1 pF`). */
export function formatTolerance(tolerance: Tolerance, kind: PartKind): string {
  if (tolerance.mode === 'relative') return `±${Number((tolerance.fraction * 100).toPrecision(6))} %`;
  const scale = kind === 'capacitor' ? 1e12 : 1e9;
  return `±${Number((tolerance.deltaSi * scale).toPrecision(6))} ${kind === 'capacitor' ? 'pF' : 'nH'}`;
}
