/**
 * A saved match as the API shows it (shared/snapping/saved-match.ts): the stored inputs and fit,
 * plus the plots computed again from the parts snapshot (deterministic, so they match what was
 * saved) and what has changed in the stock since.
 */
import { QueryTypes, type Sequelize, type Transaction } from 'sequelize';
import { parseSolveRequest } from '../../../shared/engine/solve-request.js';
import { parseValue } from '../../../shared/engine/value-parse.js';
import { ladderOfParts } from '../../../shared/snapping/fit-report.js';
import { matchSweep, measuredTraces, smithPath } from '../../../shared/snapping/match-sweep.js';
import type { SavedMatchDetail, SavedMatchSummary, SavedRequestSummary, StockChange } from '../../../shared/snapping/saved-match.js';
import type { MeasuredPortInput, MeasuredPortReference, SolveRequest } from '../../../shared/api/matches.js';
import type { SnapPart } from '../../../shared/snapping/snap-part.js';
import type { SnappedFit } from '../../../shared/snapping/snapped-fit.js';
import { idealLadder } from '../../../shared/engine/ladder.js';
import { angularFrequency } from '../../../shared/engine/part-kind.js';
import { seriesElement, shuntElement } from '../../../shared/engine/l-network.js';
import type { Match, User } from '../../models/index.js';
import { PART_ROW_COLUMNS, presentPart, type PartRow } from '../stock/present-part.js';

/** The fit's elements as ladder input, parts taken from the snapshot by id. */
export function fitLadderInput(fit: SnappedFit, parts: readonly SnapPart[]) {
  const byId = new Map(parts.map((p) => [p.id, p]));
  return fit.elements.map((e) => ({
    position: e.position,
    arrangement: e.arrangement,
    parts: e.parts.flatMap((p) => Array.from({ length: p.quantity }, () => byId.get(p.partId)!)),
  }));
}

/** A measured port of a saved request as the list names it (no text). */
function portReference(port: MeasuredPortInput | null | undefined): MeasuredPortReference | null | undefined {
  return port ? { fileName: port.fileName ?? null, textChars: port.text.length } : port;
}

/** The saved request as the list shows it: measured files by name and size. */
function requestSummary(request: SolveRequest): SavedRequestSummary {
  const { loadTouchstone, sourceTouchstone, ...rest } = request;
  const summary: SavedRequestSummary = { ...rest };
  if (loadTouchstone !== undefined) summary.loadTouchstone = portReference(loadTouchstone);
  if (sourceTouchstone !== undefined) summary.sourceTouchstone = portReference(sourceTouchstone);
  return summary;
}

/** The list entry of a match. */
export function presentMatchSummary(match: Match, user: User | null): SavedMatchSummary {
  return {
    id: match.id,
    name: match.name,
    request: requestSummary(match.request),
    chosen: { placement: match.placement, solution: match.solution, rank: match.rank },
    objective: match.objective,
    createdAt: match.createdAt.toISOString(),
    createdBy: user ? { id: user.id, name: user.name, email: user.email } : null,
    // The saved request was read whole when it was saved; f0 alone needs no measured file read again.
    frequencyHz: parseValue(match.request.frequencyHz, 'frequency', { field: 'frequencyHz' }),
    partNumbers: match.fit.elements.flatMap((e) => e.parts.map((p) => `${p.partNumber} x${p.quantity}`)),
    totalDb: match.fit.loss.totalDb,
    worstCaseDb: match.fit.loss.worstCaseDb,
  };
}

const MODEL_FIELDS = ['kind', 'value', 'tolerance', 'srfHz', 'q', 'qFrequencyHz', 'esrOhm'] as const;

/** Parts of the snapshot whose stock entry is gone, changed its model, or no longer covers the fit. */
export async function stockChangesOf(sequelize: Sequelize, match: Match, transaction?: Transaction): Promise<StockChange[]> {
  if (match.partIds.length === 0) return [];
  const rows = await sequelize.query<PartRow>(`SELECT ${PART_ROW_COLUMNS} FROM parts WHERE id IN (:ids)`, {
    type: QueryTypes.SELECT,
    replacements: { ids: match.partIds },
    transaction,
  });
  const now = new Map(rows.map((r) => [r.id, presentPart(r)]));
  const quantity = parseSolveRequest(match.request).buildQuantity;
  const uses = new Map<number, number>();
  for (const e of match.fit.elements) for (const p of e.parts) uses.set(p.partId, (uses.get(p.partId) ?? 0) + p.quantity);
  const changes: StockChange[] = [];
  for (const saved of match.parts) {
    const current = now.get(saved.id);
    if (!current) changes.push({ partId: saved.id, partNumber: saved.partNumber, change: 'gone' });
    else if (MODEL_FIELDS.some((f) => JSON.stringify(current[f]) !== JSON.stringify(saved[f]))) changes.push({ partId: saved.id, partNumber: saved.partNumber, change: 'changed' });
    else if (current.available < (uses.get(saved.id) ?? 0) * quantity) changes.push({ partId: saved.id, partNumber: saved.partNumber, change: 'short' });
  }
  return changes;
}

/** The full answer of `GET /api/matches/:id`. */
export async function presentMatchDetail(sequelize: Sequelize, match: Match, user: User | null, transaction?: Transaction): Promise<SavedMatchDetail> {
  const input = parseSolveRequest(match.request);
  const fitLadder = ladderOfParts(fitLadderInput(match.fit, match.parts));
  const omega = angularFrequency(input.frequencyHz);
  const ideal = idealLadder(
    match.network.elements.map((e) => (e.position === 'series' ? seriesElement(e.reactanceOhm, omega) : shuntElement(-1 / e.reactanceOhm, omega))),
  );
  return {
    ...presentMatchSummary(match, user),
    request: match.request,
    network: { ...match.network, fits: [match.fit] },
    fit: match.fit,
    settings: match.settings,
    parts: match.parts,
    sweep: matchSweep(input, match.network.elements, fitLadder),
    smith: {
      ideal: smithPath(input.source, input.load, input.frequencyHz, ideal),
      fit: smithPath(input.source, input.load, input.frequencyHz, fitLadder),
      measured: measuredTraces(input),
    },
    stockChanges: await stockChangesOf(sequelize, match, transaction),
  };
}
