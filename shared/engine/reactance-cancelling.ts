/**
 * The reactance-cancelling route (rf-engine.md, "Beyond the closed form"): cancel each complex
 * port's reactance with one element (in series: `-X`; or in shunt: `-B`, which leaves `1/G`), match
 * the now real resistances with a real-to-real L section, then merge neighbouring elements of one
 * kind (series L + L: `L1 + L2`; series C + C: `1/(1/C1 + 1/C2)`; shunt C || C: `C1 + C2`;
 * shunt L || L: `1/(1/L1 + 1/L2)`). The unmerged three-part network is kept as well, because it can
 * sometimes be built from stock when the merged two-part one cannot.
 */
import { type Complex } from './complex.js';
import { dcBehaviour, type DcBehaviour, type IdealElement, isConjugateMatched, responseClass, seriesElement, shuntElement, solveLNetworks } from './l-network.js';
import { angularFrequency, type Placement, type Position, type ResponseClass } from './part-kind.js';
import { frequencyProblems, portProblems, throwIfProblems } from './port-limits.js';

/** A port's reactance is cancelled only when |X| exceeds this share of R (else it is real already). */
export const REAL_PORT_RELATIVE = 1e-9;

/** The route offers networks of at least this many parts; smaller ones are the closed form's. */
export const MIN_ROUTE_PARTS = 3;

/** One cancelling step. */
export interface CancellingStep {
  port: 'source' | 'load';
  position: Position;
  element: IdealElement;
}

/** One network of the route. */
export interface CancellingNetwork {
  /** The cancelling elements, source side first. */
  cancels: CancellingStep[];
  /** Which real-to-real L section follows; null when the resistances are equal after cancelling. */
  realToReal: { placement: Placement; solution: 1 | 2 } | null;
  /** Every element as its own part, source to load (3 parts for one complex port, 4 for two). */
  parts: IdealElement[];
  /** After merging neighbouring elements of one kind. */
  merged: IdealElement[];
  /** The closed-form network the merged one equals, when it has two elements or fewer. */
  equivalentTo: { placement: Placement; solution: 1 | 2 } | null;
  response: ResponseClass;
  dc: DcBehaviour;
  frequencyHz: number;
}

interface PortOption {
  step: CancellingStep | null;
  /** The port resistance after cancelling, ohm. */
  resistanceOhm: number;
}

function cancelOptions(port: 'source' | 'load', z: Complex, omega: number): PortOption[] {
  if (Math.abs(z.im) <= REAL_PORT_RELATIVE * z.re) return [{ step: null, resistanceOhm: z.re }];
  const m2 = z.re * z.re + z.im * z.im;
  const b = -z.im / m2;
  return [
    { step: { port, position: 'series', element: seriesElement(-z.im, omega) }, resistanceOhm: z.re },
    { step: { port, position: 'shunt', element: shuntElement(-b, omega) }, resistanceOhm: m2 / z.re },
  ];
}

/** Merges neighbours of one position and kind (series: reactances add; shunt: susceptances add). */
export function mergeElements(elements: readonly IdealElement[], omegaRadPerS: number): IdealElement[] {
  const merged: IdealElement[] = [];
  for (const element of elements) {
    const previous = merged[merged.length - 1];
    if (previous && previous.position === element.position && previous.kind === element.kind) {
      merged[merged.length - 1] =
        element.position === 'series'
          ? seriesElement(previous.reactanceOhm + element.reactanceOhm, omegaRadPerS)
          : shuntElement(previous.susceptanceS + element.susceptanceS, omegaRadPerS);
    } else merged.push(element);
  }
  return merged;
}

function sameElements(a: readonly IdealElement[], b: readonly IdealElement[]): boolean {
  return a.length === b.length && a.every((e, i) => e.position === b[i].position && e.kind === b[i].kind && Math.abs(e.value / b[i].value - 1) <= 1e-9);
}

/**
 * Every network of the reactance-cancelling route from `source` to `load` at `frequencyHz`: for each
 * complex port, a series or a shunt cancelling element; then each real-to-real L solution
 * (`Q = sqrt(Rhigh/Rlow - 1)`, shunt across the higher resistance). Only networks of three or more
 * parts are listed; empty when both ports are real (the route then is the closed form) or already
 * matched.
 * @throws EngineInputError for R <= 0, non-finite or out-of-range input
 */
export function reactanceCancellingNetworks(source: Complex, load: Complex, frequencyHz: number): CancellingNetwork[] {
  throwIfProblems([...portProblems(source, 'source'), ...portProblems(load, 'load'), ...frequencyProblems(frequencyHz, 'frequencyHz')]);
  if (isConjugateMatched(source, load)) return [];
  const omega = angularFrequency(frequencyHz);
  const sourceOptions = cancelOptions('source', source, omega);
  const loadOptions = cancelOptions('load', load, omega);
  if (sourceOptions[0].step === null && loadOptions[0].step === null) return [];
  const closedForm = solveLNetworks(source, load, frequencyHz).networks;
  const result: CancellingNetwork[] = [];
  for (const s of sourceOptions) {
    for (const l of loadOptions) {
      const inner = solveLNetworks({ re: s.resistanceOhm, im: 0 }, { re: l.resistanceOhm, im: 0 }, frequencyHz);
      const sections = inner.alreadyMatched ? [null] : inner.networks;
      for (const section of sections) {
        const parts = [...(s.step ? [s.step.element] : []), ...(section ? section.elements : []), ...(l.step ? [l.step.element] : [])];
        // Fewer than three parts (resistances already equal after cancelling) adds nothing the
        // closed form does not already list.
        if (parts.length < MIN_ROUTE_PARTS) continue;
        const merged = mergeElements(parts, omega);
        const twin = merged.length <= 2 ? closedForm.find((n) => sameElements(n.elements, merged)) : undefined;
        result.push({
          cancels: [s.step, l.step].filter((step): step is CancellingStep => step !== null),
          realToReal: section ? { placement: section.placement, solution: section.solution } : null,
          parts,
          merged,
          equivalentTo: twin ? { placement: twin.placement, solution: twin.solution } : null,
          response: responseClass(parts),
          dc: dcBehaviour(parts),
          frequencyHz,
        });
      }
    }
  }
  return result;
}
