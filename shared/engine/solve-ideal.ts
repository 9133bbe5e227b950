/**
 * The ideal half of `POST /api/matches/solve`: the api.md `networks` (with `fits: []` until the
 * snapper fills them), `infeasible` and `cautions`, plus the extensions `alreadyMatched`, `notes`
 * and `cancellingRoutes`. Pure: a server route calls it with {@link parseSolveRequest}'s numbers.
 */
import type { CancellingRoute, MatchNetwork, NetworkElement, SolveResponse } from '../api/matches.js';
import { cautionsFor } from './cautions.js';
import { type Complex } from './complex.js';
import { type IdealElement, type IdealNetwork, solveLNetworks } from './l-network.js';
import { idealLadder } from './ladder.js';
import { powerCheck } from './power-check.js';
import { constantPort } from './port-model.js';
import { reactanceCancellingNetworks } from './reactance-cancelling.js';

/** What {@link solveIdeal} needs (a {@link SolveInput} fits). */
export interface IdealSolveInput {
  source: Complex;
  load: Complex;
  frequencyHz: number;
  powerW?: number | null;
}

function toApiElements(elements: readonly IdealElement[], stress: ({ peakVoltageV: number; rmsCurrentA: number } | undefined)[] = []): NetworkElement[] {
  return elements.map((e, i) => ({
    position: e.position,
    kind: e.kind,
    value: e.value,
    reactanceOhm: e.reactanceOhm,
    ...(stress[i] ? { stress: stress[i] } : {}),
  }));
}

/**
 * Stress on each element of an ideal network at f0 with available power `powerW`: peak voltage and
 * RMS current (power-check.ts; `Vs = sqrt(8 P Rs)`).
 */
export function idealElementStress(network: IdealNetwork, source: Complex, load: Complex, powerW: number): { peakVoltageV: number; rmsCurrentA: number }[] {
  const check = powerCheck(idealLadder(network.elements), constantPort(source, 'source'), constantPort(load, 'load'), network.frequencyHz, powerW);
  return check.parts.map((p) => ({ peakVoltageV: p.peakVoltageV, rmsCurrentA: p.rmsCurrentA }));
}

/**
 * Solves the ideal L networks for a request (rf-engine.md "Ideal L networks") and returns the api.md
 * response shape with empty `fits`.
 * @throws EngineInputError for bad ports, frequency or power
 */
export function solveIdeal(input: IdealSolveInput): SolveResponse {
  const solution = solveLNetworks(input.source, input.load, input.frequencyHz);
  const powerW = input.powerW ?? null;
  let maxPeakVoltageV: number | null = null;
  const networks: MatchNetwork[] = solution.networks.map((network) => {
    const stress = powerW === null ? [] : idealElementStress(network, input.source, input.load, powerW);
    for (const s of stress) maxPeakVoltageV = Math.max(maxPeakVoltageV ?? 0, s.peakVoltageV);
    return {
      placement: network.placement,
      solution: network.solution,
      response: network.response,
      nodeQ: network.nodeQ,
      dc: network.dc,
      elements: toApiElements(network.elements, stress),
      fits: [],
    };
  });
  const cancellingRoutes: CancellingRoute[] = reactanceCancellingNetworks(input.source, input.load, input.frequencyHz).map((route) => ({
    cancels: route.cancels.map((c) => ({ port: c.port, position: c.position })),
    parts: toApiElements(route.parts),
    merged: toApiElements(route.merged),
    equivalentTo: route.equivalentTo,
    response: route.response,
    dc: route.dc,
  }));
  return {
    networks,
    infeasible: solution.infeasible.map((i) => ({ placement: i.placement, reason: i.reason })),
    cautions: cautionsFor({ maxNodeQ: Math.max(0, ...solution.networks.map((n) => n.nodeQ)), powerW, maxPeakVoltageV }),
    alreadyMatched: solution.alreadyMatched,
    notes: solution.notes,
    cancellingRoutes,
  };
}
