/**
 * Shared set-up of the build and shortfall suites: a sub-GHz radio match of the demo scenario
 * (Tarnwick's 868 MHz node: a 50 ohm radio into a chip antenna measured as 12 - j35 ohm), worked
 * out by hand, and a small stock list that carries its parts.
 *
 * The ideal network, by hand (rf-engine.md "shunt-at-source", source 50 ohm, ZL = 12 - j35 ohm):
 *   Gs = 1/50 = 0.02 S, Bs = 0; RL Gs = 0.24 <= 1, feasible.
 *   B = +sqrt(Gs/RL - Gs^2) = sqrt(0.0016667 - 0.0004) = sqrt(0.0012667) = 0.035590 S (a shunt capacitor);
 *   X = -XL + (Bs + B) RL / Gs = 35 + 0.035590 x 600 = 56.354 ohm (a series inductor).
 *   w = 2 pi 868 MHz = 5.4538e9 rad/s; C = B/w = 6.5257 pF; L = X/w = 10.333 nH.
 */
import type { PlannedMatchDesign } from '../../server/models/build-match.js';
import { FULL_HEADER, csvFile } from '../fixtures/stock/stock-upload.js';

/** The ideal values above. */
export const SUB_GHZ_SHUNT_C_F = 6.5257e-12;
export const SUB_GHZ_SERIES_L_H = 10.333e-9;

/** The 868 MHz match built from `capacitor` (shunt) and `inductor` (series), one of each per board. */
export function subGhzDesign(capacitor = 'TW-C0402-6P8', inductor = 'TW-L0402-10N', perBoard = { capacitor: 1, inductor: 1 }): PlannedMatchDesign {
  return {
    source: { re: 50, im: 0 },
    load: { re: 12, im: -35 },
    frequencyHz: 868e6,
    elements: [
      { position: 'shunt', kind: 'capacitor', idealValue: SUB_GHZ_SHUNT_C_F, arrangement: perBoard.capacitor === 2 ? 'parallel' : 'single', parts: [{ partNumber: capacitor, perBoard: perBoard.capacitor }] },
      { position: 'series', kind: 'inductor', idealValue: SUB_GHZ_SERIES_L_H, arrangement: 'single', parts: [{ partNumber: inductor, perBoard: perBoard.inductor }] },
    ],
    location: null,
    usableSrfFraction: null,
    excludeAboveLimit: null,
  };
}

/** A stock row in the import schema with the fields these suites vary. */
export function stockRow(partNumber: string, kind: 'C' | 'L', value: string, tolerance: string, srf: string, esr: string, quantity: number, pkg = '0402'): string {
  return `${partNumber},${kind},${value},${tolerance},${srf},,,${esr},${quantity},${pkg},${kind === 'C' ? '50V' : ''},${kind === 'L' ? '300mA' : ''},main,,0.02,,`;
}

/** A stock file of `rows`. */
export function stockFile(...rows: string[]): string {
  return csvFile(FULL_HEADER, ...rows);
}
