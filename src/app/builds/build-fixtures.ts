/**
 * Invented builds and shortfall lists of the demo company for specs: Tarnwick's 868 MHz node, a
 * 6.8 pF shunt capacitor short. Values are the API's (SI units).
 */
import type { BuildResponse, ShortfallLine, ShortfallListResponse } from '../../../shared/api/builds.js';

/** A 6.8 pF line: 40 boards short, 42 to buy. */
export const CAPACITOR_LINE: ShortfallLine = {
  id: 71,
  kind: 'capacitor',
  idealValue: 6.5257e-12,
  buyValue: 6.8e-12,
  series: 'E24',
  quantity: 42,
  minSrfHz: 1.736e9,
  tolerance: { mode: 'absolute', deltaSi: 0.25e-12 },
  toleranceCode: 'C',
  toleranceWithinBudget: true,
  package: '0402',
  reason: 'short-stock',
  reasonText: 'not enough stock (TW-C0402-6P8: 10 of 50)',
  shortQuantity: 40,
  buyLossDb: 0.02,
  sources: [{ matchId: 3, matchName: '868 MHz antenna', position: 'shunt', idealValue: 6.5257e-12, shortQuantity: 40, frequencyHz: 868e6, buyLossDb: 0.02, buyWorstCaseDb: 0.3 }],
  receivedQuantity: 0,
};

/** A reserved build of 50 boards, short of 40 capacitors. */
export const RESERVED_BUILD: BuildResponse = {
  id: 5,
  status: 'reserved',
  name: 'NODE-868 rev C',
  quantity: 50,
  lines: [
    { matchId: 3, position: 'shunt', partNumber: 'TW-C0402-6P8', needed: 50, reserved: 10, kind: 'capacitor', location: 'main', movedFrom: null },
    { matchId: 3, position: 'series', partNumber: 'TW-L0402-10N', needed: 50, reserved: 50, kind: 'inductor', location: 'main', movedFrom: ['TW-L0402-11N'] },
  ],
  shortfall: { lines: [CAPACITOR_LINE] },
  matches: [{ matchId: 3, name: '868 MHz antenna', frequencyHz: 868e6 }],
  moves: [{ matchId: 3, position: 'series', from: ['TW-L0402-11N'], to: 'TW-L0402-10N', fromWorstCaseDb: 0.2, toWorstCaseDb: 0.3, message: 'TW-L0402-11N has 0 available for 50 wanted; moved 868 MHz antenna series TW-L0402-11N to TW-L0402-10N, worst case 0.30 dB instead of 0.20 dB' }],
  shortfallStatus: 'draft',
  createdAt: '2026-12-01T10:00:00.000Z',
  updatedAt: '2026-12-01T10:00:00.000Z',
  createdBy: { id: 2, name: 'Ilse Marrow' },
};

/** The build's shortfall list. */
export const SHORTFALL: ShortfallListResponse = {
  lines: [CAPACITOR_LINE],
  list: {
    id: 9,
    buildId: 5,
    buildName: 'NODE-868 rev C',
    status: 'draft',
    attritionPercent: 5,
    lossBudgetDb: 0.5,
    createdAt: '2026-12-01T10:00:00.000Z',
    updatedAt: '2026-12-01T10:00:00.000Z',
    sentTo: null,
    sentAt: null,
  },
};
