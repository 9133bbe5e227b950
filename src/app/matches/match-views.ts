import { ChangeDetectionStrategy, Component, computed, inject, input } from '@angular/core';
import { map } from 'rxjs';

import type { Fit, MatchNetwork } from '../../../shared/api/matches.js';
import type { SolveInput } from '../../../shared/engine/index.js';
import { FitParts } from './fit-parts.js';
import { placementName } from './network-card.js';
import { answerOf, latestAnswer } from './request-state.js';
import type { MatchSweep } from './saved-match.js';
import { SmithChart } from './smith-chart.js';
import { type SmithElement, reactanceAt } from './smith-path.js';
import { type TpgCurve, curveFromTpg, fitTpgCurve, idealTpgCurve, sweepRange } from './tpg-sweep.js';
import { measuredTrace } from '../../../shared/touchstone/measured-port.js';
import type { MeasuredTraceView } from './smith-chart.js';
import { TpgPlot } from './tpg-plot.js';

/**
 * The response plot and the Smith chart of one ideal network and, when one is chosen, its fit. The
 * ideal curve is swept here with the engine; the fit's curve comes from a saved match's sweep, or is
 * swept here from its stocked parts' models (looked up in the stock list).
 */
@Component({
  selector: 'sm-match-views',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [SmithChart, TpgPlot],
  template: `
    <h3 class="views-title">{{ heading() }}</h3>
    <div class="views">
      <sm-tpg-plot
        [ideal]="idealCurve()"
        [fit]="fitCurve()"
        [fitNote]="fitNote()"
        [frequencyHz]="solveInput().frequencyHz"
        [bandwidthHz]="solveInput().bandwidthHz"
      />
      <sm-smith-chart
        [source]="solveInput().source"
        [load]="solveInput().load"
        [idealElements]="idealElements()"
        [fitElements]="fitElements()"
        [measured]="measuredTraces()"
      />
    </div>
  `,
  styles: `
    :host { display: block; }
    .views-title { margin: 0 0 12px; font: var(--mat-sys-title-medium); }
    .views {
      display: grid;
      grid-template-columns: repeat(auto-fit, minmax(min(100%, 420px), 1fr));
      gap: 24px;
      align-items: start;
    }
  `,
})
export class MatchViews {
  /** The network drawn. */
  readonly network = input.required<MatchNetwork>();
  /** Its chosen fit, or null. */
  readonly fit = input<Fit | null>(null);
  /** The request as numbers (ports, f0, band). */
  readonly solveInput = input.required<SolveInput>();
  /** A saved match's sweep for this fit, when reopening one. */
  readonly savedSweep = input<MatchSweep | null>(null);

  private readonly fitParts = inject(FitParts);

  protected readonly heading = computed(() => {
    const network = this.network();
    const name = `${placementName(network.placement)}, solution ${network.solution}`;
    const fit = this.fit();
    return fit ? `Response of ${name} and its fit ${fit.rank}` : `Response of ${name}`;
  });

  protected readonly idealCurve = computed<TpgCurve>(() => {
    const saved = this.savedSweep();
    if (saved?.idealTpg) return curveFromTpg(saved.frequenciesHz, saved.idealTpg);
    return idealTpgCurve(this.network().elements, this.solveInput());
  });

  /** The fit's curve swept from its stocked parts, when there is no saved sweep. */
  private readonly sweptFit = latestAnswer(
    computed(() => (this.savedSweep()?.fitTpg ? undefined : (this.fit() ?? undefined))),
    (fit) => {
      const ports = this.solveInput();
      return this.fitParts.partsOf(fit).pipe(map((parts) => fitTpgCurve(fit, parts, ports)));
    },
  );

  protected readonly fitCurve = computed<TpgCurve | null>(() => {
    const saved = this.savedSweep();
    if (saved?.fitTpg) return curveFromTpg(saved.frequenciesHz, saved.fitTpg);
    return this.fit() ? (answerOf(this.sweptFit()) ?? null) : null;
  });

  protected readonly fitNote = computed(() => {
    if (!this.fit()) return 'Choose a fit to compare it with the ideal network.';
    if (this.sweptFit().status === 'failed') return 'The fit’s curve cannot be drawn: one of its parts is no longer in the stock list.';
    return 'Sweeping the fit with its parts’ models…';
  });

  /** Each measured port's impedance over the plotted range, for the Smith chart. */
  protected readonly measuredTraces = computed<MeasuredTraceView[]>(() => {
    const input = this.solveInput();
    const { startHz, stopHz } = sweepRange(input.frequencyHz, input.bandwidthHz, [input.sourceMeasured, input.loadMeasured]);
    const traces: MeasuredTraceView[] = [];
    for (const [port, measured] of [['load', input.loadMeasured], ['source', input.sourceMeasured]] as const) {
      if (!measured) continue;
      const trace = measuredTrace(measured, startHz, stopHz);
      traces.push({ port, fileName: measured.fileName, impedances: trace.impedances, startHz: trace.frequenciesHz[0], stopHz: trace.frequenciesHz.at(-1)! });
    }
    return traces;
  });

  protected readonly idealElements = computed<SmithElement[]>(() =>
    this.network().elements.map((e) => ({ position: e.position, reactanceOhm: e.reactanceOhm })),
  );

  /** The fit's elements at f0, from their effective values (parasitics included, loss left out). */
  protected readonly fitElements = computed<SmithElement[] | null>(() => {
    const fit = this.fit();
    if (!fit) return null;
    const f0 = this.solveInput().frequencyHz;
    return fit.elements.map((e) => ({ position: e.position, reactanceOhm: reactanceAt(e.kind, e.effectiveValue, f0) }));
  });
}
