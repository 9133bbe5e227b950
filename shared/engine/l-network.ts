/**
 * Ideal (lossless, exact-value) L networks that conjugate-match a complex source to a complex load
 * at f0, so TPG = 1 there (handbook rf-engine.md, "Ideal L networks"; the closed form is the one in
 * D. M. Pozar, Microwave Engineering, 4th ed., section 5.1, written for a complex source).
 *
 * Elements are listed in ladder order, from the source to the load:
 * - `shunt-at-load`: source, series X, shunt B across the load, load;
 * - `shunt-at-source`: source, shunt B across the source, series X, load.
 */
import { type Complex } from './complex.js';
import { angularFrequency, type PartKind, type Placement, type Position, type ResponseClass } from './part-kind.js';
import { frequencyProblems, portProblems, throwIfProblems } from './port-limits.js';

/** One ideal element at f0. */
export interface IdealElement {
  position: Position;
  kind: PartKind;
  /** Capacitance in F or inductance in H at f0. */
  value: number;
  /** Reactance at f0, ohm (`-1/B` for a shunt element). */
  reactanceOhm: number;
  /** Susceptance at f0, siemens (`-1/X` for a series element). */
  susceptanceS: number;
}

/** What a network does at DC (rf-engine.md: shown for every network). */
export interface DcBehaviour {
  /** Whether DC passes from source to load (series inductor or no series element). */
  passes: boolean;
  /** Whether a shunt inductor puts a DC path to ground (it shorts any bias at its node). */
  shuntToGround: boolean;
}

/** One ideal L network. */
export interface IdealNetwork {
  placement: Placement;
  solution: 1 | 2;
  response: ResponseClass;
  /** Node Q: `|BL + B| / GL` (shunt-at-load) or `|Bs + B| / Gs` (shunt-at-source). */
  nodeQ: number;
  dc: DcBehaviour;
  /** Present elements, source to load; an element whose value is zero is left out. */
  elements: IdealElement[];
  /** Series reactance X, ohm (0 when absent). */
  seriesReactanceOhm: number;
  /** Shunt susceptance B, siemens (0 when absent). */
  shuntSusceptanceS: number;
  frequencyHz: number;
}

/** A placement that has no solution, and why. */
export interface InfeasiblePlacement {
  placement: Placement;
  reason: string;
}

/** Everything {@link solveLNetworks} finds. */
export interface LNetworkSolution {
  frequencyHz: number;
  /** Whether the source already sees a conjugate match (no network needed; `networks` is empty). */
  alreadyMatched: boolean;
  networks: IdealNetwork[];
  infeasible: InfeasiblePlacement[];
  /** Plain remarks, e.g. that two placements give the same one-element network. */
  notes: string[];
}

/** Below this fraction of its scale an element value counts as zero (one-element match). */
export const ZERO_ELEMENT_RELATIVE = 1e-9;
/** Below this fraction of its scale the discriminant's root counts as zero (one solution). */
export const DOUBLE_ROOT_RELATIVE = 1e-7;
/** Ports within this relative distance of a conjugate match count as matched. */
export const MATCHED_RELATIVE = 1e-9;

/**
 * The ideal element for a series reactance X at `omega`: X > 0 inductor `L = X/w`, X < 0 capacitor
 * `C = -1/(w X)` (rf-engine.md, "Element to part kind").
 */
export function seriesElement(reactanceOhm: number, omegaRadPerS: number): IdealElement {
  return reactanceOhm > 0
    ? { position: 'series', kind: 'inductor', value: reactanceOhm / omegaRadPerS, reactanceOhm, susceptanceS: -1 / reactanceOhm }
    : { position: 'series', kind: 'capacitor', value: -1 / (omegaRadPerS * reactanceOhm), reactanceOhm, susceptanceS: -1 / reactanceOhm };
}

/**
 * The ideal element for a shunt susceptance B at `omega`: B > 0 capacitor `C = B/w`, B < 0 inductor
 * `L = -1/(w B)` (rf-engine.md, "Element to part kind").
 */
export function shuntElement(susceptanceS: number, omegaRadPerS: number): IdealElement {
  return susceptanceS > 0
    ? { position: 'shunt', kind: 'capacitor', value: susceptanceS / omegaRadPerS, reactanceOhm: -1 / susceptanceS, susceptanceS }
    : { position: 'shunt', kind: 'inductor', value: -1 / (omegaRadPerS * susceptanceS), reactanceOhm: -1 / susceptanceS, susceptanceS };
}

/**
 * Response class (rf-engine.md): shunt C + series L low-pass, shunt L + series C high-pass, two of a
 * kind mixed. A lone series L or shunt C is low-pass, a lone series C or shunt L high-pass; more
 * elements (the reactance-cancelling route) are low-pass or high-pass only when every element is.
 */
export function responseClass(elements: readonly IdealElement[]): ResponseClass {
  const lowPass = (e: IdealElement) => (e.position === 'series') === (e.kind === 'inductor');
  if (elements.length === 0) return 'mixed';
  if (elements.every(lowPass)) return 'low-pass';
  if (elements.every((e) => !lowPass(e))) return 'high-pass';
  return 'mixed';
}

/**
 * DC behaviour (rf-engine.md): DC passes unless a series capacitor blocks it; a shunt inductor puts
 * a DC path to ground.
 */
export function dcBehaviour(elements: readonly IdealElement[]): DcBehaviour {
  return {
    passes: !elements.some((e) => e.position === 'series' && e.kind === 'capacitor'),
    shuntToGround: elements.some((e) => e.position === 'shunt' && e.kind === 'inductor'),
  };
}

/**
 * Loaded Q of a real-to-real L section: `Q = sqrt(Rhigh/Rlow - 1)` (rf-engine.md; C. Bowick,
 * RF Circuit Design, 2nd ed., chapter 4). The shunt reactance is `Rhigh/Q`, the series `Rlow Q`.
 */
export function realToRealQ(resistanceHighOhm: number, resistanceLowOhm: number): number {
  return Math.sqrt(resistanceHighOhm / resistanceLowOhm - 1);
}

/**
 * Whether the source already sees a conjugate match: `|ZL - conj(Zs)| <= 1e-9 (|Zs| + |ZL|)`.
 */
export function isConjugateMatched(source: Complex, load: Complex): boolean {
  const scale = Math.hypot(source.re, source.im) + Math.hypot(load.re, load.im);
  return Math.hypot(load.re - source.re, load.im + source.im) <= MATCHED_RELATIVE * scale;
}

function sameElements(a: readonly IdealElement[], b: readonly IdealElement[]): boolean {
  return (
    a.length === b.length &&
    a.every((e, i) => e.position === b[i].position && e.kind === b[i].kind && Math.abs(e.value / b[i].value - 1) <= 1e-9)
  );
}

const fmt = (x: number) => Number(x.toPrecision(4)).toString();

/**
 * One placement, solved with "far" port F (the one the series element faces) and "near" port N
 * (the one the shunt element is across): with `YN = GN + jBN`, feasible iff `RF GN <= 1`, then
 * `B = -BN ± sqrt(GN/RF - GN^2)` and `X = -XF + (BN + B) RF / GN` (rf-engine.md).
 */
function solvePlacement(placement: Placement, far: Complex, near: Complex, frequencyHz: number): IdealNetwork[] | string {
  const omega = angularFrequency(frequencyHz);
  const nearMagnitude2 = near.re * near.re + near.im * near.im;
  const gNear = near.re / nearMagnitude2;
  const bNear = -near.im / nearMagnitude2;
  const product = far.re * gNear;
  const nearName = placement === 'shunt-at-load' ? 'load' : 'source';
  const farName = placement === 'shunt-at-load' ? 'source' : 'load';
  const symbol = placement === 'shunt-at-load' ? 'Rs·GL' : 'RL·Gs';
  if (product > 1 + 1e-12) {
    return (
      `needs ${symbol} <= 1, but ${symbol} = ${fmt(product)}: the ${nearName}'s parallel resistance ` +
      `(1/G = ${fmt(1 / gNear)} Ω) is below the ${farName} resistance (${fmt(far.re)} Ω), and a shunt element ` +
      `across the ${nearName} cannot raise it`
    );
  }
  const root = Math.sqrt(Math.max(0, gNear / far.re - gNear * gNear));
  // At the feasibility boundary the two solutions coincide; rounding leaves a root of about
  // sqrt(eps) of its scale there, so anything below DOUBLE_ROOT_RELATIVE is one solution.
  const roots = root <= DOUBLE_ROOT_RELATIVE * Math.sqrt(gNear / far.re) ? [0] : [root, -root];
  const scaleB = 1 / far.re + Math.sqrt(gNear * gNear + bNear * bNear);
  const scaleX = Math.hypot(far.re, far.im) + Math.sqrt(nearMagnitude2);
  return roots.map((r, index) => {
    let b = -bNear + r;
    let x = -far.im + ((bNear + b) * far.re) / gNear;
    if (Math.abs(b) <= ZERO_ELEMENT_RELATIVE * scaleB) b = 0;
    if (Math.abs(x) <= ZERO_ELEMENT_RELATIVE * scaleX) x = 0;
    const series = x === 0 ? [] : [seriesElement(x, omega)];
    const shunt = b === 0 ? [] : [shuntElement(b, omega)];
    const elements = placement === 'shunt-at-load' ? [...series, ...shunt] : [...shunt, ...series];
    return {
      placement,
      solution: (index + 1) as 1 | 2,
      response: responseClass(elements),
      nodeQ: Math.abs(bNear + b) / gNear,
      dc: dcBehaviour(elements),
      elements,
      seriesReactanceOhm: x,
      shuntSusceptanceS: b,
      frequencyHz,
    };
  });
}

/**
 * Every ideal L network from `source` (Zs) to `load` (ZL) at `frequencyHz`: both placements, up to two
 * solutions each, infeasible placements with their reason, one-element networks where an element
 * comes out zero, and `alreadyMatched` when Zs = conj(ZL) (rf-engine.md, "Ideal L networks").
 * A network that is identical to one already listed (a one-element network both placements reach)
 * is listed once, with a note.
 * @param source Zs in ohm, `Rs > 0`
 * @param load ZL in ohm, `RL > 0`
 * @param frequencyHz f0 in Hz
 * @throws EngineInputError for R <= 0, non-finite or out-of-range input
 */
export function solveLNetworks(source: Complex, load: Complex, frequencyHz: number): LNetworkSolution {
  throwIfProblems([...portProblems(source, 'source'), ...portProblems(load, 'load'), ...frequencyProblems(frequencyHz, 'frequencyHz')]);
  const result: LNetworkSolution = { frequencyHz, alreadyMatched: false, networks: [], infeasible: [], notes: [] };
  if (isConjugateMatched(source, load)) {
    result.alreadyMatched = true;
    result.notes.push('The load is already the conjugate of the source: no network is needed.');
    return result;
  }
  const placements: [Placement, Complex, Complex][] = [
    ['shunt-at-load', source, load],
    ['shunt-at-source', load, source],
  ];
  for (const [placement, far, near] of placements) {
    const solved = solvePlacement(placement, far, near, frequencyHz);
    if (typeof solved === 'string') {
      result.infeasible.push({ placement, reason: solved });
      continue;
    }
    for (const network of solved) {
      const twin = result.networks.find((other) => sameElements(other.elements, network.elements));
      if (twin) {
        result.notes.push(
          `${network.placement} solution ${network.solution} is the same network as ${twin.placement} solution ${twin.solution}, so it is listed once.`,
        );
        continue;
      }
      result.networks.push(network);
    }
  }
  return result;
}
