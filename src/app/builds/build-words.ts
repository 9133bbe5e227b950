/**
 * How the build and shortfall screens name statuses and reasons, and write buy-to specs, in the
 * product's own plain words (product.md "Naming").
 */
import type { BuildStatus, ShortfallLine, ShortfallReason, ShortfallStatus } from '../../../shared/api/builds.js';
import { formatValue } from '../../../shared/engine/value-format.js';
import { partValueText, toleranceText } from '../stock/part-notation.js';

/** A build status as the screens show it. */
export const BUILD_STATUS_WORDS: Readonly<Record<BuildStatus, string>> = {
  planned: 'Planned',
  reserved: 'Stock reserved',
  built: 'Built',
  cancelled: 'Cancelled',
};

/** A shortfall-list status as the screens show it. */
export const SHORTFALL_STATUS_WORDS: Readonly<Record<ShortfallStatus, string>> = {
  draft: 'Draft',
  sent: 'Sent',
  ordered: 'Ordered',
  received: 'Received',
};

/** A reason in a few words. */
export const REASON_WORDS: Readonly<Record<ShortfallReason, string>> = {
  'short-stock': 'Not enough stock',
  'over-budget': 'Over the loss budget',
};

/** The buy-to spec of a line: `6.8 pF E24 ±0.25 pF (C), SRF ≥ 1.74 GHz`. */
export function buySpecText(line: Pick<ShortfallLine, 'kind' | 'buyValue' | 'series' | 'tolerance' | 'toleranceCode' | 'minSrfHz'>): string {
  return `${partValueText(line.kind, line.buyValue)} ${line.series} ${toleranceText(line.kind, line.tolerance)} (${line.toleranceCode}), SRF ≥ ${formatValue(line.minSrfHz, 'frequency', { significantDigits: 3 })}`;
}

/** A loss in dB with two decimals, or a dash. */
export function lossDbText(lossDb: number | null): string {
  return lossDb === null ? '—' : `${lossDb.toFixed(2)} dB`;
}

/** {@link REASON_WORDS} as a function, for table cells whose rows the template cannot type. */
export function reasonWord(reason: ShortfallReason): string {
  return REASON_WORDS[reason];
}

/** {@link BUILD_STATUS_WORDS} as a function. */
export function buildStatusWord(status: BuildStatus): string {
  return BUILD_STATUS_WORDS[status];
}

/** {@link SHORTFALL_STATUS_WORDS} as a function. */
export function shortfallStatusWord(status: ShortfallStatus): string {
  return SHORTFALL_STATUS_WORDS[status];
}
