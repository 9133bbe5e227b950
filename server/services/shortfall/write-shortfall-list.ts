/**
 * Writes the shortfall list of a build from its allocation: one line per short element of each
 * match (shared/shortfall: buy-to value, quantity with attrition, minimum SRF, tolerance within the
 * loss budget), lines of one part spec merged across matches, stored as a `draft` list with the
 * settings it was computed with. Nothing short, no list.
 */
import type { Transaction } from 'sequelize';
import { mergeShortfallLines, shortfallLinesForMatch, type ShortfallLineDraft } from '../../../shared/shortfall/shortfall-lines.js';
import { ShortfallLine, ShortfallList } from '../../models/index.js';
import type { Allocation, PlanToAllocate } from '../builds/allocate-stock.js';
import type { BuildSettings } from '../builds/build-settings.js';

/** The merged lines of an allocation, in match order then element order. */
export function shortfallDrafts(plans: readonly PlanToAllocate[], allocation: Allocation, settings: BuildSettings): ShortfallLineDraft[] {
  const drafts = plans.flatMap((plan, planIndex) => {
    const shorts = allocation.elements
      .filter((e) => e.planIndex === planIndex && e.short)
      .map((e) => ({ elementIndex: e.elementIndex, ...e.short! }));
    return shortfallLinesForMatch({ matchId: plan.matchId, matchName: plan.matchName, design: allocation.designs[planIndex] }, shorts, {
      ...settings,
      usableSrfFraction: plan.design.usableSrfFraction ?? settings.usableSrfFraction,
    });
  });
  return mergeShortfallLines(drafts, settings.attritionPercent);
}

/** Stores the list of `buildId` in `transaction`; returns how many lines it has. */
export async function writeShortfallList(
  transaction: Transaction,
  buildId: number,
  plans: readonly PlanToAllocate[],
  allocation: Allocation,
  settings: BuildSettings,
): Promise<number> {
  const lines = shortfallDrafts(plans, allocation, settings);
  if (lines.length === 0) return 0;
  const list = await ShortfallList.create(
    {
      buildId,
      status: 'draft',
      attritionPercent: settings.attritionPercent,
      lossBudgetDb: settings.lossBudgetDb,
      usableSrfFraction: settings.usableSrfFraction,
      sentTo: null,
      sentAt: null,
      lastMailId: null,
    },
    { transaction },
  );
  await ShortfallLine.bulkCreate(
    lines.map((line, ordinal) => ({
      listId: list.id,
      ordinal,
      kind: line.kind,
      idealValue: line.idealValue,
      buyValue: line.buyValue,
      series: line.series,
      quantity: line.quantity,
      shortQuantity: line.shortQuantity,
      minSrfHz: line.minSrfHz,
      toleranceKind: line.tolerance.mode,
      toleranceValue: line.tolerance.mode === 'relative' ? line.tolerance.fraction : line.tolerance.deltaSi,
      toleranceCode: line.toleranceCode,
      toleranceWithinBudget: line.toleranceWithinBudget,
      package: line.package ?? null,
      reason: line.reason,
      reasonText: line.reasonText,
      buyLossDb: line.buyLossDb,
      sources: line.sources,
    })),
    { transaction },
  );
  return lines.length;
}
