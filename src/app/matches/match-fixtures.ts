/**
 * Invented answers of the match routes for specs (product.md demo: Tarnwick Field Sensors, an 868 MHz
 * chip antenna of 12 - j35 Ω fed from 50 Ω). The ideal element values are those of the closed form
 * for these ports; the fits, part numbers and losses are made up to exercise the screen.
 */
import type { Fit, SolveResponse } from '../../../shared/api/matches.js';
import type { PartItem } from '../../../shared/api/stock.js';
import type { SavedMatchSummary } from './saved-match.js';

/** The best fit of the low-pass network: a 6.8 pF shunt capacitor and a 10 nH series inductor. */
export const LOW_PASS_BEST: Fit = {
  rank: 1,
  elements: [
    {
      position: 'shunt',
      kind: 'capacitor',
      arrangement: 'single',
      parts: [{ partNumber: 'TW-C0402-6P8', quantity: 1 }],
      nominalValue: 6.8e-12,
      effectiveValue: 6.91e-12,
      frequencyRatio: 0.18,
      flags: [],
    },
    {
      position: 'series',
      kind: 'inductor',
      arrangement: 'single',
      parts: [{ partNumber: 'TW-L0402-10N', quantity: 1 }],
      nominalValue: 10e-9,
      effectiveValue: 10.6e-9,
      frequencyRatio: 0.27,
      flags: ['limit-unknown'],
    },
  ],
  loss: { valueErrorDb: 0.04, dissipativeDb: 0.21, totalDb: 0.25, worstCaseDb: 0.61, bandDb: null },
  tpg: 0.944,
  returnLossDb: 21.4,
  flags: ['limit-unknown'],
  // Fields of the snapper's fit report beyond api.md's list.
  ...{ yield: 0.974, yieldBudgetDb: 0.5 },
};

/** A second fit: two capacitors in parallel, one inductor above its limit and short of stock. */
export const LOW_PASS_SECOND: Fit = {
  rank: 2,
  elements: [
    {
      position: 'shunt',
      kind: 'capacitor',
      arrangement: 'parallel',
      parts: [{ partNumber: 'TW-C0402-3P3', quantity: 2 }],
      nominalValue: 6.6e-12,
      effectiveValue: 6.7e-12,
      frequencyRatio: 0.14,
      flags: [],
    },
    {
      position: 'series',
      kind: 'inductor',
      arrangement: 'single',
      parts: [{ partNumber: 'TW-L0402-10N-B', quantity: 1 }],
      nominalValue: 10e-9,
      effectiveValue: 11.9e-9,
      frequencyRatio: 0.62,
      flags: ['above-limit', 'short-stock'],
    },
  ],
  loss: { valueErrorDb: 0.09, dissipativeDb: 0.3, totalDb: 0.39, worstCaseDb: 0.93, bandDb: null },
  tpg: 0.914,
  returnLossDb: 16.2,
  flags: ['above-limit', 'short-stock'],
};

/** A solve answer with one network that has fits, one that has none, and an infeasible placement. */
export const SOLVED: SolveResponse = {
  networks: [
    {
      placement: 'shunt-at-source',
      solution: 1,
      response: 'low-pass',
      nodeQ: 1.7795,
      dc: { passes: true, shuntToGround: false },
      elements: [
        { position: 'shunt', kind: 'capacitor', value: 6.5258e-12, reactanceOhm: -28.0976 },
        { position: 'series', kind: 'inductor', value: 1.0333e-8, reactanceOhm: 56.3542 },
      ],
      fits: [LOW_PASS_BEST, LOW_PASS_SECOND],
    },
    {
      placement: 'shunt-at-load',
      solution: 2,
      response: 'high-pass',
      nodeQ: 1.1321,
      dc: { passes: false, shuntToGround: true },
      elements: [
        { position: 'series', kind: 'capacitor', value: 3.2392e-12, reactanceOhm: -56.6054 },
        { position: 'shunt', kind: 'inductor', value: 5.1665e-9, reactanceOhm: 28.1773 },
      ],
      fits: [],
    },
  ],
  infeasible: [{ placement: 'shunt-at-load', reason: 'needs Rs·GL <= 1 (invented for the screen test)' }],
  cautions: [
    'Treat every network here as a starting point: measure it on a vector network analyser.',
    'A transmitter using this match must meet the radio regulations where it operates.',
  ],
};

/** Stocked parts of the fits above, as `GET /api/parts` lists them. */
export const STOCKED_PARTS: PartItem[] = [
  part(1, 'TW-C0402-6P8', 'capacitor', 6.8e-12, 4.8e9, 0.35),
  part(2, 'TW-L0402-10N', 'inductor', 10e-9, 3.2e9, null, 40, 868e6),
  part(3, 'TW-C0402-3P3', 'capacitor', 3.3e-12, 6.1e9, 0.4),
  part(4, 'TW-L0402-10N-B', 'inductor', 10e-9, 1.4e9, null, 30, 868e6),
];

function part(
  id: number,
  partNumber: string,
  kind: 'capacitor' | 'inductor',
  value: number,
  srfHz: number,
  esrOhm: number | null,
  q: number | null = null,
  qFrequencyHz: number | null = null,
): PartItem {
  return {
    id,
    partNumber,
    kind,
    value,
    tolerance: { mode: 'relative', fraction: 0.05 },
    srfHz,
    q,
    qFrequencyHz,
    esrOhm,
    quantity: 4000,
    reserved: 0,
    available: 4000,
    package: '0402',
    voltageRating: kind === 'capacitor' ? 50 : null,
    currentRating: kind === 'inductor' ? 0.3 : null,
    location: 'Shelf A',
    series: 'E24',
    unitCost: '0.0120',
    manufacturerPart: null,
    description: null,
  };
}

/** One saved match as the list routes give it: the demo antenna, saved by the demo designer. */
export const SAVED_MATCH_SUMMARY: SavedMatchSummary = {
  id: 11,
  name: 'Soil node 868 MHz chip antenna',
  request: { source: '50', load: '12-j35', frequencyHz: '868MHz' },
  chosen: { placement: 'shunt-at-source', solution: 1, rank: 1 },
  objective: 'worst-case',
  createdAt: '2026-11-30T09:15:00Z',
  createdBy: { id: 7, name: 'Dev Okafor', email: 'designer@tarnwick.example' },
  frequencyHz: 868e6,
  partNumbers: ['TW-C0402-6P8 x1', 'TW-L0402-10N x1'],
  totalDb: 0.25,
  worstCaseDb: 0.61,
};
