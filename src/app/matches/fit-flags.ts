/**
 * How the workspace names and colours the flags of a fit (rf-engine.md "Snapping": above limit,
 * limit unknown, over rating, short stock; plus the engine's loss unknown).
 */
import type { FitFlag } from '../../../shared/api/matches.js';

/** How serious a flag is: `alert` needs action before building, `caution` needs a look. */
export type FlagTone = 'alert' | 'caution' | 'note';

/** What the workspace shows for one flag. */
export interface FlagPresentation {
  label: string;
  /** One sentence on what it means, for the chip's tooltip and screen readers. */
  meaning: string;
  tone: FlagTone;
}

/** Every flag the API sends, in the order chips are shown. */
export const FLAG_PRESENTATION: Readonly<Record<FitFlag, FlagPresentation>> = {
  'over-rating': {
    label: 'Over rating',
    meaning: 'At the given RF power a part sees more voltage or current than its (DC) rating.',
    tone: 'alert',
  },
  'short-stock': {
    label: 'Short stock',
    meaning: 'Stores do not have enough of a part for the build quantity.',
    tone: 'alert',
  },
  'above-limit': {
    label: 'Above limit',
    meaning: 'A part is used above the usable fraction of its SRF, so its value drifts with frequency.',
    tone: 'caution',
  },
  'limit-unknown': {
    label: 'Limit unknown',
    meaning: 'The stock list gives no SRF for a part, so its frequency limit is not known.',
    tone: 'caution',
  },
  'loss-unknown': {
    label: 'Loss unknown',
    meaning: 'The stock list gives neither ESR nor Q for a part, so its loss is not counted.',
    tone: 'note',
  },
};

const FLAG_ORDER = Object.keys(FLAG_PRESENTATION) as FitFlag[];

/** The flags to show, known ones first in {@link FLAG_ORDER}, each once; unknown ones as they came. */
export function presentFlags(flags: readonly string[]): (FlagPresentation & { flag: string })[] {
  const unique = [...new Set(flags)];
  const known = FLAG_ORDER.filter((flag) => unique.includes(flag)).map((flag) => ({ flag, ...FLAG_PRESENTATION[flag] }));
  const unknown = unique
    .filter((flag) => !(flag in FLAG_PRESENTATION))
    .map((flag) => ({ flag, label: flag.replace(/-/g, ' '), meaning: flag, tone: 'note' as FlagTone }));
  return [...known, ...unknown];
}
