/**
 * Request and response shapes of `POST /api/matches/solve` (handbook api.md, "Matches"). Field names
 * are the contract; fields marked "extension" are additions the contract allows ("extend it, do
 * not break it"). Numbers are SI base units; value fields also accept strings with prefixes.
 */

/** What the snapper optimises. */
export type Objective = 'worst-case' | 'nominal' | 'band';

/** An impedance as a request may give it: `"12-j35"`, `50`, or `{re, im}` in ohm. */
export type ImpedanceInput = string | number | { re: number; im?: number };

/** A value as a request may give it: a number in SI units or a string such as `"868MHz"`. */
export type ValueInput = string | number;

/**
 * A measured one-port Touchstone file (version 1.x or 2.0; S, Y or Z data) as a port of a match
 * (extension): the match uses its impedance at f0, interpolated; sweeps, band loss and plots use
 * the measured data across the band.
 */
export interface MeasuredPortInput {
  /** The name the file was uploaded under, shown in messages and on the match. */
  fileName?: string | null;
  /** The whole file as text. */
  text: string;
}

/** A measured file as the saved-match list names it: its name and size; `GET /api/matches/:id` has its text. */
export interface MeasuredPortReference {
  fileName?: string | null;
  /** Characters of the file's text. */
  textChars: number;
}

/** `POST /api/matches/solve` body. */
export interface SolveRequest {
  /** Required unless `sourceTouchstone` is given. */
  source?: ImpedanceInput;
  /** Required unless `loadTouchstone` is given. */
  load?: ImpedanceInput;
  /** Extension: the source as a measured one-port file, in place of `source`. */
  sourceTouchstone?: MeasuredPortInput | null;
  /** Extension: the load as a measured one-port file, in place of `load`. */
  loadTouchstone?: MeasuredPortInput | null;
  frequencyHz: ValueInput;
  /** Band width centred on f0, Hz. */
  bandwidthHz?: ValueInput | null;
  /** Available power of the source, W. */
  powerW?: ValueInput | null;
  /** Default 1. */
  buildQuantity?: number;
  /** Allow two-part series or parallel elements; default false. */
  combinations?: boolean;
  /** Default `worst-case`. */
  objective?: Objective;
  /** Default 3. */
  fitsPerNetwork?: number;
  /** Limit the stock searched to one location. */
  location?: string | null;
  /** Overrides the organisation's usable fraction of SRF for this request. */
  usableSrfFraction?: number | null;
  /** Overrides the organisation's setting that excludes parts above their limit. */
  excludeAboveLimit?: boolean | null;
}

/** Where an element sits. */
export type ElementPosition = 'series' | 'shunt';
/** What a part is. */
export type ElementKind = 'capacitor' | 'inductor';
/** How a fit element's parts are joined. */
export type ElementArrangement = 'single' | 'series' | 'parallel';
/** Which side of the network the shunt element is on. */
export type NetworkPlacement = 'shunt-at-load' | 'shunt-at-source';
/** Response class of a network. */
export type NetworkResponseClass = 'low-pass' | 'high-pass' | 'mixed';

/** Stress on an ideal element at f0 when the request gave `powerW` (extension). */
export interface ElementStress {
  /** Peak voltage across the element, V. */
  peakVoltageV: number;
  /** RMS current through the element, A. */
  rmsCurrentA: number;
}

/** One ideal element at f0. */
export interface NetworkElement {
  position: ElementPosition;
  kind: ElementKind;
  /** F or H. */
  value: number;
  reactanceOhm: number;
  /** Extension: present when the request gave `powerW`. */
  stress?: ElementStress;
}

/** Flags on a fit element or a fit (rf-engine.md "Snapping": above limit, limit unknown, over rating, short stock; plus loss unknown). */
export type FitFlag = 'above-limit' | 'limit-unknown' | 'loss-unknown' | 'over-rating' | 'short-stock';

/** A stocked part used in a fit element. */
export interface FitPart {
  partNumber: string;
  /** Parts of this number per element (2 when one part is used twice). */
  quantity: number;
}

/** One element of a fit. */
export interface FitElement {
  position: ElementPosition;
  kind: ElementKind;
  arrangement: ElementArrangement;
  parts: FitPart[];
  /** C or L of the element from nominal part values, F or H. */
  nominalValue: number;
  /** What the element looks like at f0 with its parasitics, F or H. */
  effectiveValue: number;
  /** f0 / SRF (the largest over the element's parts); null when an SRF is unknown. */
  frequencyRatio: number | null;
  flags: FitFlag[];
}

/** The losses of a fit, dB, all >= 0 (rf-engine.md "Losses of a fit"). */
export interface FitLoss {
  valueErrorDb: number;
  dissipativeDb: number;
  totalDb: number;
  worstCaseDb: number;
  /** Null when no band was given. */
  bandDb: number | null;
}

/** One stocked fit of an ideal network. */
export interface Fit {
  rank: number;
  elements: FitElement[];
  loss: FitLoss;
  /** TPG at f0, nominal values, full models. */
  tpg: number;
  returnLossDb: number;
  flags: FitFlag[];
}

/** One ideal network with its fits. */
export interface MatchNetwork {
  placement: NetworkPlacement;
  solution: 1 | 2;
  response: NetworkResponseClass;
  nodeQ: number;
  dc: { passes: boolean; shuntToGround: boolean };
  /** Present elements in ladder order, source to load; an absent element is left out. */
  elements: NetworkElement[];
  fits: Fit[];
}

/** A placement with no solution. */
export interface InfeasibleNetwork {
  placement: NetworkPlacement;
  reason: string;
}

/** A network of the reactance-cancelling route (extension). */
export interface CancellingRoute {
  cancels: { port: 'source' | 'load'; position: ElementPosition }[];
  /** Every element as its own part, source to load. */
  parts: NetworkElement[];
  /** After merging neighbouring elements of one kind. */
  merged: NetworkElement[];
  /** The closed-form network the merged one equals, if any. */
  equivalentTo: { placement: NetworkPlacement; solution: 1 | 2 } | null;
  response: NetworkResponseClass;
  dc: { passes: boolean; shuntToGround: boolean };
}

/** `POST /api/matches/solve` answer. */
export interface SolveResponse {
  networks: MatchNetwork[];
  infeasible: InfeasibleNetwork[];
  /** Plain-language cautions shown near the result. */
  cautions: string[];
  /** Extension: the source already sees a conjugate match; `networks` is then empty. */
  alreadyMatched?: boolean;
  /** Extension: remarks such as a network listed once for two placements. */
  notes?: string[];
  /** Extension: the reactance-cancelling route's networks (three or four parts). */
  cancellingRoutes?: CancellingRoute[];
}
