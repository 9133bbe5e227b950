import { ChangeDetectionStrategy, Component, input, output } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatChipsModule } from '@angular/material/chips';
import { MatIconModule } from '@angular/material/icon';
import { MatTooltipModule } from '@angular/material/tooltip';

import type { Fit, FitElement } from '../../../shared/api/matches.js';
import { formatValue } from '../../../shared/engine/index.js';
import { presentFlags } from './fit-flags.js';

/** `-10 log10 TPG` written for people: 0.962 -> "0.17 dB". */
function lossText(tpg: number): string {
  return `${(-10 * Math.log10(tpg)).toFixed(2)} dB`;
}

/**
 * The ranked stocked fits of one ideal network: per element the parts and how they are joined,
 * nominal and effective value at f0, f0/SRF and flags; per fit the losses, TPG, return loss, and
 * a button to choose it.
 */
@Component({
  selector: 'sm-fit-list',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatButtonModule, MatChipsModule, MatIconModule, MatTooltipModule],
  templateUrl: './fit-list.html',
  styleUrl: './fit-list.scss',
})
export class FitList {
  /** The fits, best first. */
  readonly fits = input.required<readonly Fit[]>();
  /** Rank of the chosen fit in this list, or null when the choice is elsewhere. */
  readonly chosenRank = input<number | null>(null);
  /** Names the network in button labels ("shunt at load, solution 1"). */
  readonly networkName = input.required<string>();
  /** Emits the rank of a fit the designer chooses. */
  readonly choose = output<number>();

  protected readonly presentFlags = presentFlags;
  protected readonly lossText = lossText;

  protected elementName(element: FitElement): string {
    return `${element.position === 'series' ? 'Series' : 'Shunt'} ${element.kind}`;
  }

  protected value(element: FitElement, valueSi: number): string {
    return formatValue(valueSi, element.kind === 'capacitor' ? 'capacitance' : 'inductance', { significantDigits: 3 });
  }

  protected arrangement(element: FitElement): string {
    if (element.arrangement === 'single') return 'single part';
    return `two in ${element.arrangement}`;
  }

  protected ratio(element: FitElement): string {
    return element.frequencyRatio === null ? 'SRF unknown' : `f0/SRF ${element.frequencyRatio.toFixed(2)}`;
  }

  protected db(value: number | null): string {
    return value === null ? '—' : `${value.toFixed(2)} dB`;
  }

  /**
   * The fit's yield within the loss budget, as the server reports it (`yield`, a share from 0 to 1,
   * and `yieldBudgetDb`; the snapper's fit report), written for people: "97.4 % within 0.5 dB".
   */
  protected yieldText(fit: Fit): string {
    const { yield: share, yieldBudgetDb: budget } = fit as Fit & { yield?: unknown; yieldBudgetDb?: unknown };
    if (typeof share !== 'number' || !Number.isFinite(share)) return '—';
    const within = typeof budget === 'number' && Number.isFinite(budget) ? ` within ${budget} dB` : '';
    return `${(share * 100).toFixed(1)} %${within}`;
  }

  /** Flags of the fit that no element shows already (e.g. a rating checked on the whole fit). */
  protected fitOnlyFlags(fit: Fit): string[] {
    const shown = new Set(fit.elements.flatMap((element) => element.flags));
    return fit.flags.filter((flag) => !shown.has(flag));
  }

  protected chooseFit(rank: number): void {
    this.choose.emit(rank);
  }
}
