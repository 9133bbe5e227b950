import { ChangeDetectionStrategy, Component, computed, input, output } from '@angular/core';
import { MatCardModule } from '@angular/material/card';
import { MatIconModule } from '@angular/material/icon';

import type { MatchNetwork, NetworkElement } from '../../../shared/api/matches.js';
import { formatValue } from '../../../shared/engine/index.js';
import { FitList } from './fit-list.js';
import { NetworkSchematic, type SchematicElement } from './network-schematic.js';
import type { ChosenFit } from './saved-match.js';

/** `shunt-at-load` -> "Shunt at load". */
export function placementName(placement: string): string {
  const words = placement.replace(/-/g, ' ');
  return words.charAt(0).toUpperCase() + words.slice(1);
}

/** An ideal element's value in engineering notation (`2.7 pF`). */
export function elementValue(element: Pick<NetworkElement, 'kind' | 'value'>, significantDigits = 3): string {
  return formatValue(element.value, element.kind === 'capacitor' ? 'capacitance' : 'inductance', { significantDigits });
}

/**
 * One ideal L network as a card: its schematic, response class, DC behaviour, node Q, the ideal
 * element values (and stresses when a power was given), and its ranked stocked fits.
 */
@Component({
  selector: 'sm-network-card',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatCardModule, MatIconModule, FitList, NetworkSchematic],
  host: {
    'data-testid': 'network-card',
    '[attr.data-placement]': 'network().placement',
    '[attr.data-solution]': 'network().solution',
    '[class.holds-choice]': 'chosenRank() !== null',
  },
  templateUrl: './network-card.html',
  styleUrl: './network-card.scss',
})
export class NetworkCard {
  /** The network with its fits. */
  readonly network = input.required<MatchNetwork>();
  /** The fit chosen anywhere in the workspace, or null. */
  readonly chosen = input<ChosenFit | null>(null);
  /** Emits the fit the designer chooses in this card. */
  readonly choose = output<ChosenFit>();

  protected readonly title = computed(() => `${placementName(this.network().placement)} · solution ${this.network().solution}`);
  protected readonly headingId = computed(() => `network-${this.network().placement}-${this.network().solution}`);
  protected readonly schematic = computed<SchematicElement[]>(() =>
    this.network().elements.map((e) => ({ position: e.position, kind: e.kind, label: elementValue(e) })),
  );
  /** Rank of the chosen fit when it belongs to this network. */
  protected readonly chosenRank = computed(() => {
    const chosen = this.chosen();
    const network = this.network();
    return chosen && chosen.placement === network.placement && chosen.solution === network.solution ? chosen.rank : null;
  });

  protected readonly elementValue = elementValue;

  protected reactance(element: NetworkElement): string {
    const x = element.reactanceOhm;
    return `${x < 0 ? '−' : '+'}j${Math.abs(x).toPrecision(3)} Ω`;
  }

  protected chooseFit(rank: number): void {
    const network = this.network();
    this.choose.emit({ placement: network.placement, solution: network.solution, rank });
  }
}
