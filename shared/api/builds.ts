/**
 * Request and response shapes of the build and shortfall-list routes (handbook api.md, "Builds and
 * shortfall lists"). The fields api.md names are the contract; fields marked "extension" are
 * additions the contract allows ("extend it, do not break it"). Numbers are SI base units.
 */
import type { Tolerance } from '../engine/tolerance-codes.js';
import type { ElementKind, ElementPosition } from './matches.js';

/** Where a build is in its life: `planned` holds nothing, `reserved` holds stock, `built` consumed it, `cancelled` released it. */
export type BuildStatus = 'planned' | 'reserved' | 'built' | 'cancelled';

/** Every build status, in lifecycle order. */
export const BUILD_STATUSES: readonly BuildStatus[] = ['planned', 'reserved', 'built', 'cancelled'];

/** Where a shortfall list is in purchasing's hands. */
export type ShortfallStatus = 'draft' | 'sent' | 'ordered' | 'received';

/** Every shortfall-list status, in order. */
export const SHORTFALL_STATUSES: readonly ShortfallStatus[] = ['draft', 'sent', 'ordered', 'received'];

/**
 * Why an element became a shortfall line:
 * - `short-stock`: fewer available than the build needs, and no other stocked part keeps the worst case within the loss budget;
 * - `over-budget`: the chosen fit's worst-case loss is above the budget and replacing this element's parts brings it back.
 */
export type ShortfallReason = 'short-stock' | 'over-budget';

/** Most saved matches one board may carry (`POST /api/builds` refuses more). */
export const MAX_MATCHES_PER_BUILD = 50;

/** `POST /api/builds` body. */
export interface CreateBuildRequest {
  name: string;
  /** Boards to build, a whole number >= 1. */
  quantity: number;
  /** The saved matches one board carries (1 to {@link MAX_MATCHES_PER_BUILD}; a match may be listed once), first served first. */
  matchIds: number[];
  /** Extension: `false` creates a `planned` build that holds nothing until `POST /api/builds/:id/reserve`. Default true. */
  reserve?: boolean;
}

/** One part of one element of one match: what the build needs and what is held for it. */
export interface BuildLine {
  matchId: number;
  position: ElementPosition;
  /** The part held (or wanted); null when the element has no stocked part at all. */
  partNumber: string | null;
  /** Parts needed: boards x parts of this number per board. */
  needed: number;
  /** Parts held for the build (consumed once built, 0 once cancelled). */
  reserved: number;
  /** Extension: the element's kind. */
  kind: ElementKind;
  /** Extension: the part's location. */
  location: string | null;
  /** Extension: the saved fit's part numbers for this element when the allocation moved it to another part. */
  movedFrom: string[] | null;
}

/** Extension: an element the allocation moved from its chosen parts to its next-best stocked part. */
export interface BuildMove {
  matchId: number;
  position: ElementPosition;
  from: string[];
  to: string;
  /** Worst-case loss of the match with the chosen parts, dB; null when the chosen part is not in stock at all. */
  fromWorstCaseDb: number | null;
  /** Worst-case loss with the part moved to, dB. */
  toWorstCaseDb: number;
  /** Plain words, e.g. "TW-C0402-2P2 is short; moved to TW-C0402-2P4, worst case 0.21 dB instead of 0.18 dB". */
  message: string;
}

/** One match a shortfall line serves (extension). */
export interface ShortfallSource {
  matchId: number;
  matchName: string;
  position: ElementPosition;
  idealValue: number;
  /** Parts this match is short, before the attrition allowance. */
  shortQuantity: number;
  /** Design frequency of the match, Hz. */
  frequencyHz: number;
  /** Loss at f0 of the match with the buy-to value (nominal, ideal part), dB; null when the ports could not be read. */
  buyLossDb: number | null;
  /** Worst-case loss over tolerance corners with the buy-to value at `tolerance`, dB; null as above. */
  buyWorstCaseDb: number | null;
}

/** One line of a shortfall list: a part to buy, to a spec. */
export interface ShortfallLine {
  kind: ElementKind;
  /** The ideal element value, F or H (the first match's when lines merged). */
  idealValue: number;
  /** The nearest standard value in `series` by log distance, F or H. */
  buyValue: number;
  /** The preferred E-series for this kind (organisation setting). */
  series: string;
  /** Parts to buy: the shortfall plus the attrition allowance, rounded up. */
  quantity: number;
  /** f0 / usable fraction of SRF, Hz (the highest over merged matches). */
  minSrfHz: number;
  /** The loosest IEC 60062 tolerance that keeps the worst case within the loss budget (the tightest over merged matches). */
  tolerance: Tolerance;
  package?: string | null;
  reason: ShortfallReason;
  /** Extension: the line's id, for receiving. */
  id: number;
  /** Extension: IEC 60062 letter of `tolerance`. */
  toleranceCode: string;
  /** Extension: whether even `tolerance` keeps every merged match within the budget (false: the tightest standard letter is not enough). */
  toleranceWithinBudget: boolean;
  /** Extension: parts short before the allowance. */
  shortQuantity: number;
  /** Extension: the worst `buyLossDb` over the merged matches (the loss the design would have with the buy-to value). */
  buyLossDb: number | null;
  /** Extension: plain words for `reason`. */
  reasonText: string;
  /** Extension: the matches this line serves. */
  sources: ShortfallSource[];
  /** Extension: parts received so far. */
  receivedQuantity: number;
}

/** Extension: the list's own fields beside its lines. */
export interface ShortfallListInfo {
  id: number;
  buildId: number;
  buildName: string;
  status: ShortfallStatus;
  /** Attrition allowance applied, percent. */
  attritionPercent: number;
  /** Worst-case loss budget the tolerances keep, dB. */
  lossBudgetDb: number;
  /** ISO 8601 times. */
  createdAt: string;
  updatedAt: string;
  /** Last address it was e-mailed to. */
  sentTo: string | null;
  sentAt: string | null;
}

/** `GET /api/builds/:id/shortfall` answer (an empty `lines` when nothing is short; `list` is null then). */
export interface ShortfallListResponse {
  lines: ShortfallLine[];
  /** Extension. */
  list: ShortfallListInfo | null;
}

/** `POST /api/builds`, `GET /api/builds/:id` answer. */
export interface BuildResponse {
  id: number;
  status: BuildStatus;
  lines: BuildLine[];
  shortfall: { lines: ShortfallLine[] };
  /** Extension. */
  name: string;
  /** Extension: boards. */
  quantity: number;
  /** Extension: the matches, in the order given. */
  matches: { matchId: number; name: string; frequencyHz: number }[];
  /** Extension: elements moved to their next-best part (empty when none). */
  moves: BuildMove[];
  /** Extension. */
  shortfallStatus: ShortfallStatus | null;
  createdAt: string;
  updatedAt: string;
  createdBy: { id: number; name: string } | null;
}

/** One row of `GET /api/builds`. */
export interface BuildSummary {
  id: number;
  name: string;
  quantity: number;
  status: BuildStatus;
  matchCount: number;
  /** Lines on its shortfall list (0 when nothing is short). */
  shortfallLines: number;
  shortfallStatus: ShortfallStatus | null;
  createdAt: string;
  updatedAt: string;
}

/** `GET /api/builds` answer, newest first. */
export interface BuildListResponse {
  items: BuildSummary[];
  total: number;
}

/** Extension: `PATCH /api/builds/:id` body: move a build on (`built` by stores or admin; `cancelled` by designer or admin). */
export interface BuildStatusChange {
  status: 'built' | 'cancelled';
}

/** `POST /api/builds/:id/shortfall/send` body. */
export interface SendShortfallRequest {
  to: string;
}

/** `POST /api/builds/:id/shortfall/send` answer. */
export interface SendShortfallResponse {
  outboxId: number;
  to: string[];
  status: ShortfallStatus;
}

/** Extension: `PATCH /api/builds/:id/shortfall` body (purchasing or admin). */
export interface ShortfallStatusChange {
  status: ShortfallStatus;
}

/** One line of a receipt: parts that arrived for a shortfall line. */
export interface ReceiveLine {
  lineId: number;
  /** Parts that arrived (>= 1). */
  quantity: number;
  /** The stock code they go in under: an existing part (quantity added) or a new one (created to the line's spec). */
  partNumber: string;
  /** Default `main`. */
  location?: string;
  /** SRF of the parts received, Hz or a string (`"6GHz"`), from their data sheet; a new part only. */
  srfHz?: number | string | null;
}

/** Extension: `POST /api/builds/:id/shortfall/receive` body (purchasing, stores or admin). */
export interface ReceiveShortfallRequest {
  lines: ReceiveLine[];
}

/** `POST /api/builds/:id/shortfall/receive` answer: the stock import it went in as, and the list after. */
export interface ReceiveShortfallResponse {
  importId: number;
  created: number;
  updated: number;
  list: ShortfallListResponse;
}

/** Extension: one row of `GET /api/shortfall` (purchasing's list of lists). */
export interface ShortfallListSummary {
  id: number;
  buildId: number;
  buildName: string;
  buildStatus: BuildStatus;
  status: ShortfallStatus;
  lineCount: number;
  /** Parts to buy over all lines. */
  quantity: number;
  receivedQuantity: number;
  sentTo: string | null;
  createdAt: string;
  updatedAt: string;
}

/** Extension: `GET /api/shortfall` answer, newest first. */
export interface ShortfallListsResponse {
  items: ShortfallListSummary[];
  total: number;
}
