/**
 * The reference search: every option of the shunt element against every option of the series
 * element, each fit evaluated and ranked exactly as the fast search does (same option arithmetic,
 * same collector). O(n^2) pairs of options (O(n^4) parts with combinations): only for tests, the
 * benchmark's side-by-side runs, and small stock lists.
 */
import { type CollectorLimit, FitCollector, type FitCandidate } from './fit-collector.js';
import { allOptions, optionTier, type SnapOption } from './snap-option.js';
import { fitTpgAtF0, type SnapProblem } from './snap-problem.js';

/** Every fit of `problem` ranked; the best `capacity` returned (within `limit` when given). */
export function searchExhaustive(problem: SnapProblem, capacity: number, limit: CollectorLimit | null = null): FitCandidate[] {
  const collector = new FitCollector(problem, capacity, limit);
  if ((problem.shunt && problem.shunt.count === 0) || (problem.series && problem.series.count === 0)) return [];
  const absent: (SnapOption | null)[] = [null];
  const shuntOptions: (SnapOption | null)[] = problem.shunt ? allOptions(problem.shunt, problem.combinations) : absent;
  const seriesOptions: (SnapOption | null)[] = problem.series ? allOptions(problem.series, problem.combinations) : absent;
  for (const shunt of shuntOptions) {
    const shuntTier = shunt ? optionTier(problem.shunt!, shunt) : 0;
    for (const series of seriesOptions) {
      if (!shunt && !series) continue;
      const tier = Math.max(shuntTier, series ? optionTier(problem.series!, series) : 0);
      const tpg = fitTpgAtF0(
        problem,
        shunt ? shunt.arrangement : -1,
        shunt ? shunt.first : -1,
        shunt ? shunt.second : -1,
        series ? series.arrangement : -1,
        series ? series.first : -1,
        series ? series.second : -1,
      );
      collector.offer(
        shunt ? shunt.arrangement : -1,
        shunt ? shunt.first : -1,
        shunt ? shunt.second : -1,
        series ? series.arrangement : -1,
        series ? series.first : -1,
        series ? series.second : -1,
        tpg,
        tier,
      );
    }
  }
  return collector.entries;
}
