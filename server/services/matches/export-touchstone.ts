/**
 * A saved match as a Touchstone 2-port file: the fitted network with full part models (or the ideal
 * one), ABCD matrices from the engine's cascade converted to S at 50 ohm by the Touchstone writer.
 * Port 1 is the source side. The sweep always holds f0 itself as a point.
 */
import { parseSolveRequest } from '../../../shared/engine/solve-request.js';
import { idealLadder, ladderAbcd, type Ladder } from '../../../shared/engine/ladder.js';
import { createAbcd } from '../../../shared/engine/abcd.js';
import { angularFrequency } from '../../../shared/engine/part-kind.js';
import { seriesElement, shuntElement } from '../../../shared/engine/l-network.js';
import { formatValue } from '../../../shared/engine/value-format.js';
import { ladderOfParts } from '../../../shared/snapping/fit-report.js';
import { writeTwoPortTouchstone } from '../../../shared/touchstone/index.js';
import type { Match } from '../../models/index.js';
import { fitLadderInput } from './present-match.js';

/** Points of the exported sweep (odd, so f0 is the middle point). */
export const TOUCHSTONE_POINTS = 201;
/** Half-width of the sweep around f0 when no band is given, as a fraction of f0. */
const DEFAULT_HALF_SPAN = 0.2;

/** Which network of the match to write. */
export type TouchstoneNetwork = 'fit' | 'ideal';

/**
 * Frequencies of the export: `TOUCHSTONE_POINTS` linear points over f0 ± max(band, 20 % of f0)
 * (clipped above 0), with the middle point set to f0 exactly.
 */
export function touchstoneFrequencies(f0: number, bandwidthHz?: number): Float64Array {
  const half = Math.max((bandwidthHz ?? 0), DEFAULT_HALF_SPAN * f0);
  const lo = Math.max(f0 - half, f0 * 0.01);
  const hi = f0 + half;
  const out = new Float64Array(TOUCHSTONE_POINTS);
  const mid = (TOUCHSTONE_POINTS - 1) / 2;
  for (let i = 0; i < TOUCHSTONE_POINTS; i++) out[i] = i < mid ? lo + ((f0 - lo) * i) / mid : f0 + ((hi - f0) * (i - mid)) / mid;
  out[mid] = f0;
  return out;
}

/** The Touchstone text and a file name for `match`. */
export function matchTouchstone(match: Match, network: TouchstoneNetwork): { fileName: string; text: string } {
  const input = parseSolveRequest(match.request);
  const omega0 = angularFrequency(input.frequencyHz);
  let ladder: Ladder;
  const comments = [`Match "${match.name}" (id ${match.id}), ${match.network.placement} solution ${match.network.solution}, f0 = ${formatValue(input.frequencyHz, 'frequency')}`];
  if (network === 'ideal') {
    ladder = idealLadder(
      match.network.elements.map((e) => (e.position === 'series' ? seriesElement(e.reactanceOhm, omega0) : shuntElement(-1 / e.reactanceOhm, omega0))),
    );
    comments.push('Ideal network: lossless elements with the values at f0.');
    for (const e of match.network.elements) comments.push(`${e.position} ${e.kind} ${formatValue(e.value, e.kind === 'capacitor' ? 'capacitance' : 'inductance')}`);
  } else {
    ladder = ladderOfParts(fitLadderInput(match.fit, match.parts));
    comments.push('Fitted network with full part models (ESL/ESR of capacitors, Cp/R of inductors, from SRF and Q or ESR).');
    const byId = new Map(match.parts.map((p) => [p.id, p]));
    for (const e of match.fit.elements) {
      const parts = e.parts.map((p) => {
        const part = byId.get(p.partId);
        const value = part ? formatValue(part.value, part.kind === 'capacitor' ? 'capacitance' : 'inductance') : '?';
        return `${p.partNumber} ${value}${p.quantity > 1 ? ` x${p.quantity}` : ''}`;
      });
      comments.push(`${e.position} ${e.kind} (${e.arrangement}): ${parts.join(' + ')}`);
    }
  }
  comments.push('Port 1 faces the source, port 2 the load.');
  const frequencyHz = touchstoneFrequencies(input.frequencyHz, input.bandwidthHz ?? undefined);
  const abcd = Array.from(frequencyHz, (f) => ladderAbcd(ladder, angularFrequency(f), createAbcd()));
  const text = writeTwoPortTouchstone({ frequencyHz, abcd, commentLines: comments });
  const slug = match.name.toLowerCase().replace(/[^a-z0-9]+/g, '-').replace(/^-|-$/g, '').slice(0, 60) || 'match';
  return { fileName: `${slug}-${network}.s2p`, text };
}
