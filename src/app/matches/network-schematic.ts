import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';

import type { ElementKind, ElementPosition, NetworkPlacement } from '../../../shared/api/matches.js';

/** One element as the schematic draws it. */
export interface SchematicElement {
  position: ElementPosition;
  kind: ElementKind;
  /** Short value text shown beside the symbol, e.g. `2.7 pF`. */
  label: string;
}

/** Width of the source and load blocks and of one element slot, in SVG units. */
const PORT_WIDTH = 64;
const SLOT_WIDTH = 96;
/** Heights of the signal rail, the ground rail and the middle of a shunt element. */
const RAIL_Y = 22;
const GROUND_Y = 92;
const MIDDLE_Y = (RAIL_Y + GROUND_Y) / 2;

/** A drawn element: its slot centre and how it is turned. */
interface PlacedElement extends SchematicElement {
  centreX: number;
  /** `translate(...) rotate(...)` for the symbol, drawn along x from -25 to 25. */
  transform: string;
}

/**
 * A small schematic of an L network in SVG, with capacitor and inductor symbols of Shelfmatch's own
 * drawing: the source on the left, the elements in ladder order (series elements in the signal rail,
 * shunt elements from the rail to ground), the load on the right.
 */
@Component({
  selector: 'sm-network-schematic',
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './network-schematic.html',
  styleUrl: './network-schematic.scss',
})
export class NetworkSchematic {
  /** Which side the shunt element is on (used in the description). */
  readonly placement = input.required<NetworkPlacement>();
  /** Elements from the source to the load. */
  readonly elements = input.required<readonly SchematicElement[]>();

  protected readonly railY = RAIL_Y;
  protected readonly groundY = GROUND_Y;
  protected readonly middleY = MIDDLE_Y;
  protected readonly portWidth = PORT_WIDTH;

  /** Total drawing width. */
  protected readonly width = computed(() => 2 * PORT_WIDTH + this.elements().length * SLOT_WIDTH);
  protected readonly placed = computed<PlacedElement[]>(() =>
    this.elements().map((element, index) => {
      const centreX = PORT_WIDTH + (index + 0.5) * SLOT_WIDTH;
      const transform =
        element.position === 'series' ? `translate(${centreX} ${RAIL_Y})` : `translate(${centreX} ${MIDDLE_Y}) rotate(90)`;
      return { ...element, centreX, transform };
    }),
  );
  /** Stretches of signal rail not taken by a series symbol. */
  protected readonly railSegments = computed(() => {
    const segments: { from: number; to: number }[] = [];
    let from = PORT_WIDTH / 2;
    for (const element of this.placed()) {
      if (element.position === 'series') {
        segments.push({ from, to: element.centreX - 25 });
        from = element.centreX + 25;
      }
    }
    segments.push({ from, to: this.width() - PORT_WIDTH / 2 });
    return segments;
  });

  /** What the schematic shows, in words. */
  protected readonly description = computed(() => {
    const parts = this.elements().map((e) => `${e.position} ${e.kind} ${e.label}`);
    const where = this.placement() === 'shunt-at-load' ? 'shunt element across the load' : 'shunt element across the source';
    return `Schematic, ${where}: source, ${parts.join(', ')}, load.`;
  });
}
