import { ChangeDetectionStrategy, Component, computed, input, output } from '@angular/core';
import { MatIconModule } from '@angular/material/icon';

import type { Fit, MatchNetwork, SolveResponse } from '../../../shared/api/matches.js';
import { type SolveInput, formatImpedance, formatValue } from '../../../shared/engine/index.js';
import { presentFlags } from './fit-flags.js';
import { MatchViews } from './match-views.js';
import { NetworkCard, placementName } from './network-card.js';
import type { ChosenFit, MatchSweep } from './saved-match.js';

/**
 * What a solve found: the cautions, the ideal networks side by side with their fits, the placements
 * that have no solution and why, and the plot and Smith chart of the chosen fit's network.
 */
@Component({
  selector: 'sm-match-results',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatIconModule, MatchViews, NetworkCard],
  templateUrl: './match-results.html',
  styleUrl: './match-results.scss',
})
export class MatchResults {
  /** The solve answer. */
  readonly solution = input.required<SolveResponse>();
  /** The request as numbers. */
  readonly solveInput = input.required<SolveInput>();
  /** The chosen fit, or null. */
  readonly chosen = input<ChosenFit | null>(null);
  /** A saved match's sweep, when it belongs to the chosen fit. */
  readonly savedSweep = input<MatchSweep | null>(null);
  /** Emits a fit the designer chooses. */
  readonly choose = output<ChosenFit>();

  protected readonly placementName = placementName;

  /** What each flag on the fits of this answer means, once per flag (the chips' tooltips need a pointer). */
  protected readonly flagLegend = computed(() => {
    const flags: string[] = [];
    for (const network of this.solution().networks) {
      for (const fit of network.fits) {
        flags.push(...fit.flags);
        for (const element of fit.elements) flags.push(...element.flags);
      }
    }
    return presentFlags(flags);
  });

  protected readonly summary = computed(() => {
    const { source, load, frequencyHz } = this.solveInput();
    const count = this.solution().networks.length;
    return (
      `${count} ideal network${count === 1 ? '' : 's'} from ${formatImpedance(source.re, source.im)} to ` +
      `${formatImpedance(load.re, load.im)} at ${formatValue(frequencyHz, 'frequency')}`
    );
  });

  /** The network the plots show: the chosen fit's, else the first. */
  protected readonly viewedNetwork = computed<MatchNetwork | null>(() => {
    const networks = this.solution().networks;
    const chosen = this.chosen();
    return (
      networks.find((n) => chosen && n.placement === chosen.placement && n.solution === chosen.solution) ?? networks[0] ?? null
    );
  });

  protected readonly chosenFit = computed<Fit | null>(() => {
    const chosen = this.chosen();
    const network = this.viewedNetwork();
    if (!chosen || !network || network.placement !== chosen.placement || network.solution !== chosen.solution) return null;
    return network.fits.find((fit) => fit.rank === chosen.rank) ?? null;
  });

  protected chooseFit(choice: ChosenFit): void {
    this.choose.emit(choice);
  }
}
