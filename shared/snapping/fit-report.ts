/**
 * From a ranked fit to what the product shows (rf-engine.md "Snapping": "Every fit reports, per
 * element, its parts, arrangement, nominal and effective value at f0, f0/SRF, and its flags ...
 * and its losses"): the engine ladder of the chosen parts, the losses of losses.ts, TPG and return
 * loss at f0, the power check when a power is given, and the yield within the loss budget.
 */
import type { FitFlag } from '../api/matches.js';
import { returnLossDb } from '../engine/abcd.js';
import { createLadder, type Ladder, ladderResponse } from '../engine/ladder.js';
import { type Band, fitLosses } from '../engine/losses.js';
import { monteCarloYield } from '../engine/monte-carlo.js';
import { angularFrequency, type Position } from '../engine/part-kind.js';
import { type ElementModel, elementImpedance, elementModel, effectiveValue, frequencyStatus, type PartModel } from '../engine/part-model.js';
import type { PortModel } from '../engine/port-model.js';
import { powerCheck } from '../engine/power-check.js';
import type { FitCandidate } from './fit-collector.js';
import type { KindCandidates } from './kind-candidates.js';
import { ARRANGEMENT_NAMES, type SnapOption } from './snap-option.js';
import { COST_STEPS_PER_UNIT, snapPartModel, type SnapPart } from './snap-part.js';
import type { SnapProblem } from './snap-problem.js';
import type { SnappedFit, SnappedFitElement } from './snapped-fit.js';

/** Flags in the order the product lists them. */
export const FLAG_ORDER: readonly FitFlag[] = ['above-limit', 'limit-unknown', 'loss-unknown', 'over-rating', 'short-stock'];

/** Everything a report needs besides the fit. */
export interface ReportContext {
  source: PortModel;
  load: PortModel;
  frequencyHz: number;
  band: Band | null;
  powerW: number | null;
  usableSrfFraction: number;
  buildQuantity: number;
  /** Loss budget for the yield, dB. */
  budgetDb: number;
  yieldSamples: number;
}

/** One element of a fit with the stocked parts in its places. */
export interface FitElementParts {
  position: Position;
  option: SnapOption;
  candidates: KindCandidates;
  /** The part in each place (one for a single part, two for a pair). */
  parts: SnapPart[];
}

/** The fit's elements in ladder order (source to load), each with its chosen parts. */
export function fitElementParts(problem: SnapProblem, fit: FitCandidate): FitElementParts[] {
  const shunt: FitElementParts | null = fit.shunt
    ? { position: 'shunt', option: fit.shunt, candidates: problem.shunt!, parts: fit.shuntMembers!.map((k) => problem.shunt!.members.parts[k]) }
    : null;
  const series: FitElementParts | null = fit.series
    ? { position: 'series', option: fit.series, candidates: problem.series!, parts: fit.seriesMembers!.map((k) => problem.series!.members.parts[k]) }
    : null;
  const ordered = problem.placement === 'shunt-at-source' ? [shunt, series] : [series, shunt];
  return ordered.filter((e): e is FitElementParts => e !== null);
}

/** The engine ladder of elements made of stocked parts (each part's own model, so its ratings count). */
export function ladderOfParts(elements: readonly { position: Position; arrangement: 'single' | 'series' | 'parallel'; parts: readonly SnapPart[] }[]): Ladder {
  const models: ElementModel[] = elements.map((e, i) =>
    elementModel(e.position, e.arrangement, e.parts.map(snapPartModel), `element ${i + 1}`),
  );
  return createLadder(models);
}

/**
 * The ladder of a fit from its candidates' models (every part of a model shares it), for scoring
 * losses without building part models again; ratings are those of each model's first part, so use
 * {@link ladderOfParts} where ratings matter (the power check).
 */
export function fitModelLadder(problem: SnapProblem, fit: FitCandidate): Ladder {
  const element = (position: Position, c: KindCandidates, o: SnapOption): ElementModel =>
    elementModel(position, ARRANGEMENT_NAMES[o.arrangement], o.second < 0 ? [c.models[o.first]] : [c.models[o.first], c.models[o.second]]);
  const shunt = fit.shunt ? element('shunt', problem.shunt!, fit.shunt) : null;
  const series = fit.series ? element('series', problem.series!, fit.series) : null;
  const ordered = problem.placement === 'shunt-at-source' ? [shunt, series] : [series, shunt];
  return createLadder(ordered.filter((e): e is ElementModel => e !== null));
}

/**
 * Nominal C or L of an element from its parts' nominal values: series capacitors and parallel
 * inductors `1/(1/a + 1/b)`, parallel capacitors and series inductors `a + b`.
 */
export function nominalElementValue(kind: 'capacitor' | 'inductor', arrangement: 'single' | 'series' | 'parallel', values: readonly number[]): number {
  if (arrangement === 'single') return values[0];
  const adds = (kind === 'capacitor') === (arrangement === 'parallel');
  return adds ? values[0] + values[1] : 1 / (1 / values[0] + 1 / values[1]);
}

function sortedFlags(flags: Set<FitFlag>): FitFlag[] {
  return FLAG_ORDER.filter((f) => flags.has(f));
}

/** Cost per build as an exact decimal string from whole 1/10,000 steps. */
function formatCost(steps: number): string {
  const whole = Math.floor(steps / COST_STEPS_PER_UNIT);
  const rest = String(steps % COST_STEPS_PER_UNIT).padStart(4, '0').replace(/0+$/, '');
  return rest ? `${whole}.${rest}` : String(whole);
}

/**
 * The api.md fit for a ranked candidate, with its losses (valueError, dissipative, total, worst case
 * over all 2^k tolerance corners, band), TPG and return loss at f0, flags per element and per fit,
 * and the seeded Monte Carlo yield within the budget (monte-carlo.ts states its assumption).
 */
export function reportFit(problem: SnapProblem, fit: FitCandidate, rank: number, objectiveDb: number, context: ReportContext): SnappedFit {
  const elements = fitElementParts(problem, fit);
  const ladder = ladderOfParts(elements.map((e) => ({ position: e.position, arrangement: ARRANGEMENT_NAMES[e.option.arrangement], parts: e.parts })));
  const losses = fitLosses(ladder, context.source, context.load, context.frequencyHz, context.band);
  const response = ladderResponse(ladder, context.source, context.load, context.frequencyHz);
  const power = context.powerW === null ? null : powerCheck(ladder, context.source, context.load, context.frequencyHz, context.powerW);
  const yieldResult = monteCarloYield(ladder, context.source, context.load, context.frequencyHz, { budgetDb: context.budgetDb, samples: context.yieldSamples });
  const omega = angularFrequency(context.frequencyHz);
  // Uses of each part across the whole fit (a part in both elements needs stock for both).
  const uses = new Map<SnapPart, number>();
  for (const e of elements) for (const p of e.parts) uses.set(p, (uses.get(p) ?? 0) + 1);
  const fitFlags = new Set<FitFlag>();
  const z = { re: 0, im: 0 };
  const reported: SnappedFitElement[] = elements.map((e, elementIndex) => {
    const flags = new Set<FitFlag>();
    const models: PartModel[] = ladder.elements[elementIndex].parts as PartModel[];
    for (const model of models) {
      const status = frequencyStatus(model, context.frequencyHz, context.usableSrfFraction);
      if (status === 'above-limit') flags.add('above-limit');
      if (status === 'limit-unknown') flags.add('limit-unknown');
      if (!model.lossKnown) flags.add('loss-unknown');
    }
    for (const p of e.parts) if ((uses.get(p) ?? 0) * context.buildQuantity > p.available) flags.add('short-stock');
    if (power?.parts.some((s) => s.elementIndex === elementIndex && s.overRating)) flags.add('over-rating');
    for (const f of flags) fitFlags.add(f);
    elementImpedance(ladder.elements[elementIndex], omega, z);
    const distinct = [...new Set(e.parts)];
    const ratios = models.map((m) => (m.srfHz === null ? null : context.frequencyHz / m.srfHz));
    return {
      position: e.position,
      kind: e.candidates.kind,
      arrangement: ARRANGEMENT_NAMES[e.option.arrangement],
      parts: distinct.map((p) => ({
        partNumber: p.partNumber,
        quantity: e.parts.filter((x) => x === p).length,
        partId: p.id,
        location: p.location,
        available: p.available,
        unitCost: p.unitCost,
      })),
      nominalValue: nominalElementValue(e.candidates.kind, ARRANGEMENT_NAMES[e.option.arrangement], e.parts.map((p) => p.value)),
      // A shunt element's effective value comes from its reactance as well: X = -1/B for the element.
      effectiveValue: effectiveValue(e.candidates.kind, z.im, omega),
      frequencyRatio: ratios.some((r) => r === null) ? null : Math.max(...(ratios as number[])),
      flags: sortedFlags(flags),
    };
  });
  return {
    rank,
    elements: reported,
    loss: {
      valueErrorDb: losses.valueErrorDb,
      dissipativeDb: losses.dissipativeDb,
      totalDb: losses.totalDb,
      worstCaseDb: losses.worstCaseDb,
      bandDb: losses.bandDb,
    },
    tpg: losses.tpg,
    returnLossDb: returnLossDb(response.gammaMagnitude),
    flags: sortedFlags(fitFlags),
    yield: yieldResult.yieldFraction,
    yieldBudgetDb: context.budgetDb,
    yieldSamples: yieldResult.samples,
    objectiveDb: objectiveDb,
    stockCover: fit.stockCover,
    costPerBuild: fit.unknownCostParts > 0 ? null : formatCost(fit.cost),
  };
}
