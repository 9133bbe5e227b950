/**
 * Models of real parts, exactly as rf-engine.md "Part models" defines them, so every number in the
 * product agrees:
 * - capacitor: C in series with ESL and ESR, `ESL = 1 / ((2 pi SRF)^2 C)`;
 * - inductor: (L in series with R) in parallel with `Cp = 1 / ((2 pi SRF)^2 L)`;
 * - no SRF: no parasitic reactance, flagged "limit unknown";
 * - loss: ESR wins; else from Q at fq (inductor `R = 2 pi fq L / Q`, capacitor
 *   `R = 1 / (2 pi fq C Q)`), constant over frequency; else lossless, flagged "loss unknown";
 * - tolerance moves C or L only: ESL, Cp and R stay as computed from the nominal value.
 *
 * The impedance functions take plain numbers and write into `out`, so the snapper and the sweeps
 * call them in hot loops without allocating.
 */
import { type Complex } from './complex.js';
import { EngineInputError, type EngineInputProblem, quoteValue } from './engine-input-error.js';
import { angularFrequency, type Arrangement, type PartKind, type Position } from './part-kind.js';
import { EXACT, type Tolerance, toleranceDeltaSi } from './tolerance-codes.js';

/** A part as a stock list describes it (SI units; null or absent means "not given"). */
export interface PartSpec {
  kind: PartKind;
  /** Nominal capacitance (F) or inductance (H). */
  valueSi: number;
  tolerance?: Tolerance;
  srfHz?: number | null;
  esrOhm?: number | null;
  q?: number | null;
  qFrequencyHz?: number | null;
  /** DC voltage rating, V (capacitors). */
  voltageRatingV?: number | null;
  /** DC current rating, A (inductors). */
  currentRatingA?: number | null;
  partNumber?: string | null;
}

/** A part ready for evaluation: every model number computed once, from the nominal value. */
export interface PartModel {
  readonly kind: PartKind;
  /** Nominal C (F) or L (H). */
  readonly nominalSi: number;
  /** Capacitor ESL, H (0 for an inductor or when SRF is unknown). */
  readonly eslH: number;
  /** Inductor Cp, F (0 for a capacitor or when SRF is unknown). */
  readonly cpF: number;
  /** Series loss resistance, ohm (ESR, or from Q; 0 when unknown). */
  readonly lossOhm: number;
  readonly tolerance: Tolerance;
  /** The ± amount of the tolerance at the nominal value, F or H. */
  readonly toleranceSi: number;
  readonly srfHz: number | null;
  /** Whether SRF was given (else the part is flagged "limit unknown"). */
  readonly limitKnown: boolean;
  /** Whether ESR or Q was given (else the loss from part Q is unknown). */
  readonly lossKnown: boolean;
  readonly voltageRatingV: number | null;
  readonly currentRatingA: number | null;
  readonly partNumber: string | null;
}

/** Default usable fraction of SRF (a common rule of thumb; an organisation setting). */
export const DEFAULT_USABLE_SRF_FRACTION = 0.5;

const given = (x: number | null | undefined): x is number => x !== null && x !== undefined;

function specProblems(spec: PartSpec, field: string): EngineInputProblem[] {
  const problems: EngineInputProblem[] = [];
  const check = (name: string, value: unknown, ok: boolean, rule: string) => {
    if (!ok) problems.push({ field: `${field}.${name}`, value, message: `${field}.${name}: ${quoteValue(value)} ${rule}` });
  };
  const positive = (x: number) => Number.isFinite(x) && x > 0;
  check('kind', spec.kind, spec.kind === 'capacitor' || spec.kind === 'inductor', 'must be "capacitor" or "inductor"');
  check('valueSi', spec.valueSi, positive(spec.valueSi), 'must be a finite value greater than 0');
  if (given(spec.srfHz)) check('srfHz', spec.srfHz, positive(spec.srfHz), 'must be a finite frequency greater than 0');
  if (given(spec.esrOhm)) check('esrOhm', spec.esrOhm, Number.isFinite(spec.esrOhm) && spec.esrOhm >= 0, 'must be a finite resistance >= 0');
  if (given(spec.q)) {
    check('q', spec.q, positive(spec.q), 'must be a finite number greater than 0');
    check('qFrequencyHz', spec.qFrequencyHz, given(spec.qFrequencyHz) && positive(spec.qFrequencyHz), 'must be given (> 0) with q');
  }
  const tolerance = spec.tolerance ?? EXACT;
  const amount = tolerance.mode === 'relative' ? tolerance.fraction : tolerance.deltaSi;
  check('tolerance', tolerance, Number.isFinite(amount) && amount >= 0, 'must be a finite amount >= 0');
  return problems;
}

/**
 * Builds a part model from its spec (rf-engine.md "Part models"): ESL or Cp from SRF, loss from ESR
 * (wins) or from Q at fq, flags for unknown limit and unknown loss.
 * @throws EngineInputError naming `field.<property>` for a bad spec
 */
export function partModel(spec: PartSpec, field = 'part'): PartModel {
  const problems = specProblems(spec, field);
  if (problems.length > 0) throw EngineInputError.fromProblems(problems);
  const value = spec.valueSi;
  const limitKnown = given(spec.srfHz);
  const omegaSrf = limitKnown ? angularFrequency(spec.srfHz as number) : 0;
  const parasitic = limitKnown ? 1 / (omegaSrf * omegaSrf * value) : 0;
  let lossOhm = 0;
  let lossKnown = true;
  if (given(spec.esrOhm)) lossOhm = spec.esrOhm;
  else if (given(spec.q) && given(spec.qFrequencyHz)) {
    const omegaQ = angularFrequency(spec.qFrequencyHz);
    lossOhm = spec.kind === 'inductor' ? (omegaQ * value) / spec.q : 1 / (omegaQ * value * spec.q);
  } else lossKnown = false;
  const tolerance = spec.tolerance ?? EXACT;
  return {
    kind: spec.kind,
    nominalSi: value,
    eslH: spec.kind === 'capacitor' ? parasitic : 0,
    cpF: spec.kind === 'inductor' ? parasitic : 0,
    lossOhm,
    tolerance,
    toleranceSi: toleranceDeltaSi(tolerance, value),
    srfHz: limitKnown ? (spec.srfHz as number) : null,
    limitKnown,
    lossKnown,
    voltageRatingV: spec.voltageRatingV ?? null,
    currentRatingA: spec.currentRatingA ?? null,
    partNumber: spec.partNumber ?? null,
  };
}

/** An exact, lossless part without parasitics (for ideal networks). */
export function idealPart(kind: PartKind, valueSi: number): PartModel {
  return partModel({ kind, valueSi }, 'idealPart');
}

/**
 * Capacitor impedance `Z = ESR + j (w ESL - 1/(w C))` (series C, ESL, ESR; rf-engine.md).
 * @param capacitanceF C, F; @param eslH ESL, H; @param esrOhm ESR, ohm; @param omegaRadPerS w = 2 pi f
 */
export function capacitorImpedance(capacitanceF: number, eslH: number, esrOhm: number, omegaRadPerS: number, out: Complex): Complex {
  out.re = esrOhm;
  out.im = omegaRadPerS * eslH - 1 / (omegaRadPerS * capacitanceF);
  return out;
}

/**
 * Inductor impedance `Z = 1 / (1/(R + j w L) + j w Cp)` ((L + R) parallel Cp; rf-engine.md);
 * `Z = R + j w L` when Cp = 0.
 * @param inductanceH L, H; @param lossOhm R, ohm; @param cpF Cp, F; @param omegaRadPerS w = 2 pi f
 */
export function inductorImpedance(inductanceH: number, lossOhm: number, cpF: number, omegaRadPerS: number, out: Complex): Complex {
  const x = omegaRadPerS * inductanceH;
  if (cpF === 0) {
    out.re = lossOhm;
    out.im = x;
    return out;
  }
  const d = lossOhm * lossOhm + x * x;
  const g = lossOhm / d;
  const b = omegaRadPerS * cpF - x / d;
  const dd = g * g + b * b;
  out.re = g / dd;
  out.im = -b / dd;
  return out;
}

/**
 * Impedance of one part at `omega` with C or L = `valueSi` (tolerance moves only this; ESL, Cp and
 * R stay nominal). `lossless` drops the loss resistance but keeps parasitic reactance (the
 * `valueError` model of rf-engine.md).
 */
export function partImpedance(part: PartModel, omegaRadPerS: number, out: Complex, valueSi = part.nominalSi, lossless = false): Complex {
  const loss = lossless ? 0 : part.lossOhm;
  return part.kind === 'capacitor'
    ? capacitorImpedance(valueSi, part.eslH, loss, omegaRadPerS, out)
    : inductorImpedance(valueSi, loss, part.cpF, omegaRadPerS, out);
}

/** {@link elementImpedance} at a frequency in Hz, nominal values, full models. */
export function elementImpedanceAt(element: ElementModel, frequencyHz: number, out: Complex = { re: 0, im: 0 }): Complex {
  return elementImpedance(element, angularFrequency(frequencyHz), out);
}

/** {@link partImpedance} at a frequency in Hz, nominal value, full model. */
export function partImpedanceAt(part: PartModel, frequencyHz: number, out: Complex = { re: 0, im: 0 }): Complex {
  return partImpedance(part, angularFrequency(frequencyHz), out);
}

/**
 * Two parts as one element (rf-engine.md): in series impedances add, `Z = Z1 + Z2`; in parallel
 * admittances add, `Z = Z1 Z2 / (Z1 + Z2)`. `single` returns Z1.
 */
export function combineTwoParts(arrangement: Arrangement, z1Re: number, z1Im: number, z2Re: number, z2Im: number, out: Complex): Complex {
  if (arrangement === 'single') {
    out.re = z1Re;
    out.im = z1Im;
  } else if (arrangement === 'series') {
    out.re = z1Re + z2Re;
    out.im = z1Im + z2Im;
  } else {
    const nRe = z1Re * z2Re - z1Im * z2Im;
    const nIm = z1Re * z2Im + z1Im * z2Re;
    const sRe = z1Re + z2Re;
    const sIm = z1Im + z2Im;
    const d = sRe * sRe + sIm * sIm;
    out.re = (nRe * sRe + nIm * sIm) / d;
    out.im = (nIm * sRe - nRe * sIm) / d;
  }
  return out;
}

/** One element of a ladder: one part, or two parts of one kind in series or in parallel. */
export interface ElementModel {
  readonly position: Position;
  readonly arrangement: Arrangement;
  readonly parts: readonly PartModel[];
}

/**
 * Builds an element; `single` takes one part, `series` and `parallel` two of the same kind.
 * @throws EngineInputError when the count or kinds do not fit the arrangement
 */
export function elementModel(position: Position, arrangement: Arrangement, parts: readonly PartModel[], field = 'element'): ElementModel {
  const wanted = arrangement === 'single' ? 1 : 2;
  if (parts.length !== wanted) {
    throw new EngineInputError(field, parts.length, `${field}: a ${arrangement} element needs ${wanted} part(s), got ${parts.length}`);
  }
  if (parts.some((p) => p.kind !== parts[0].kind)) {
    throw new EngineInputError(field, parts.map((p) => p.kind), `${field}: the two parts of one element must be of one kind`);
  }
  return { position, arrangement, parts };
}

const scratchA: Complex = { re: 0, im: 0 };

/**
 * Impedance of an element at `omega`: its parts' impedances combined by {@link combineTwoParts}.
 * `values` (optional) holds the C or L of each part, read from `values[valueOffset + i]`.
 */
export function elementImpedance(
  element: ElementModel,
  omegaRadPerS: number,
  out: Complex,
  values: ArrayLike<number> | null = null,
  valueOffset = 0,
  lossless = false,
): Complex {
  const parts = element.parts;
  const first = parts[0];
  partImpedance(first, omegaRadPerS, out, values ? values[valueOffset] : first.nominalSi, lossless);
  if (parts.length === 1) return out;
  const second = parts[1];
  partImpedance(second, omegaRadPerS, scratchA, values ? values[valueOffset + 1] : second.nominalSi, lossless);
  return combineTwoParts(element.arrangement, out.re, out.im, scratchA.re, scratchA.im, out);
}

/**
 * Effective value at `omega` from a reactance (what the part looks like at f): capacitor
 * `C = -1/(w X)`, inductor `L = X/w`. Near SRF this departs from the nominal value; past SRF the
 * sign flips (the part no longer behaves as its kind).
 */
export function effectiveValue(kind: PartKind, reactanceOhm: number, omegaRadPerS: number): number {
  return kind === 'capacitor' ? -1 / (omegaRadPerS * reactanceOhm) : reactanceOhm / omegaRadPerS;
}

/** Where a frequency sits against a part's limit (rf-engine.md, "Frequency limit"). */
export type FrequencyStatus = 'within-limit' | 'above-limit' | 'at-or-above-srf' | 'limit-unknown';

/**
 * Frequency status: `limit-unknown` without SRF; `at-or-above-srf` when f >= SRF (never used as its
 * kind); `above-limit` when f > usableFraction SRF; else `within-limit`.
 */
export function frequencyStatus(part: PartModel, frequencyHz: number, usableFraction = DEFAULT_USABLE_SRF_FRACTION): FrequencyStatus {
  if (part.srfHz === null) return 'limit-unknown';
  if (frequencyHz >= part.srfHz) return 'at-or-above-srf';
  if (frequencyHz > usableFraction * part.srfHz) return 'above-limit';
  return 'within-limit';
}
