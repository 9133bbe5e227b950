import { ChangeDetectionStrategy, Component, computed, input, signal } from '@angular/core';
import { MatButtonToggleModule } from '@angular/material/button-toggle';

import { type Complex, formatImpedance, formatValue } from '../../../shared/engine/index.js';
import {
  type SmithElement,
  type SmithPath,
  matchTarget,
  reactanceCircle,
  reflectionOf,
  resistanceCircle,
  smithPath,
} from './smith-path.js';

/** A measured port over the plotted band, as the chart draws it. */
export interface MeasuredTraceView {
  port: 'source' | 'load';
  fileName: string | null;
  /** Measured impedances, ohm, ascending in frequency. */
  impedances: readonly Complex[];
  startHz: number;
  stopHz: number;
}

/** The reference the chart is normalised to. */
export type SmithReference = 'fifty-ohm' | 'source';

/** The 50 Ω reference most RF work uses. */
const FIFTY_OHM = 50;
/** Normalised resistances and reactances of the grid. */
const GRID_VALUES = [0.2, 0.5, 1, 2, 5];

/** Numbers the charts on a page, so each clip path has its own id. */
let nextChartId = 0;

/** A polyline ready for `points="..."`. */
function pointsOf(reflections: readonly Complex[]): string {
  return reflections.map((g) => `${g.re.toFixed(4)},${(-g.im).toFixed(4)}`).join(' ');
}

/** The chart position of a reflection coefficient. */
function placeOfReflection(g: Complex | undefined): { x: number; y: number } | null {
  return g ? { x: g.re, y: -g.im } : null;
}

/** The chart position of a normalised impedance (SVG y grows downward, so Gamma's im is negated). */
function placeOf(z: Complex): { x: number; y: number } {
  const g = reflectionOf(z);
  return { x: g.re, y: -g.im };
}

/**
 * A Smith chart of one match, drawn in SVG: the constant-resistance and constant-reactance grid,
 * the load, the path through each element of the ideal network (and of the chosen fit, from its
 * effective values at f0), and the target conj(Zs). Normalised to 50 Ω or to the source resistance.
 */
@Component({
  selector: 'sm-smith-chart',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatButtonToggleModule],
  templateUrl: './smith-chart.html',
  styleUrl: './smith-chart.scss',
})
export class SmithChart {
  /** Source impedance Zs, ohm. */
  readonly source = input.required<Complex>();
  /** Load impedance ZL, ohm. */
  readonly load = input.required<Complex>();
  /** The ideal network's elements, source to load. */
  readonly idealElements = input.required<readonly SmithElement[]>();
  /** The chosen fit's elements at f0, source to load, or null when no fit is chosen. */
  readonly fitElements = input<readonly SmithElement[] | null>(null);
  /**
   * Measured ports over the band: a measured load is drawn as measured, a measured source as its
   * conjugate (the target the network must reach at each frequency).
   */
  readonly measured = input<readonly MeasuredTraceView[]>([]);

  /** Id of this chart's unit-disc clip path. */
  protected readonly clipId = `sm-smith-clip-${nextChartId++}`;
  /** Which reference the chart is normalised to. */
  protected readonly reference = signal<SmithReference>('fifty-ohm');
  /** Z0 in ohm. */
  protected readonly referenceOhm = computed(() => (this.reference() === 'source' ? this.source().re : FIFTY_OHM));

  protected readonly resistanceCircles = GRID_VALUES.map((r) => ({ r, ...resistanceCircle(r), label: placeOf({ re: r, im: 0 }) }));
  protected readonly reactanceArcs = GRID_VALUES.flatMap((x) =>
    [x, -x].map((signed) => {
      const rim = reflectionOf({ re: 0, im: signed });
      return { x: signed, ...reactanceCircle(signed), label: { x: rim.re * 1.08, y: -rim.im * 1.08 } };
    }),
  );

  protected readonly idealPath = computed<SmithPath>(() => smithPath(this.load(), this.idealElements(), this.referenceOhm()));
  protected readonly fitPath = computed<SmithPath | null>(() => {
    const elements = this.fitElements();
    return elements ? smithPath(this.load(), elements, this.referenceOhm()) : null;
  });
  protected readonly idealPolylines = computed(() => this.idealPath().arcs.map((arc) => pointsOf(arc.reflections)));
  protected readonly fitPolylines = computed(() => this.fitPath()?.arcs.map((arc) => pointsOf(arc.reflections)) ?? []);

  /** Measured traces as polylines, with their legend words. */
  protected readonly measuredLines = computed(() =>
    this.measured().map((trace) => {
      const z0 = this.referenceOhm();
      const shown = trace.impedances.map((z) => reflectionOf({ re: z.re / z0, im: (trace.port === 'source' ? -z.im : z.im) / z0 }));
      const band = `${formatValue(trace.startHz, 'frequency', { significantDigits: 4 })} to ${formatValue(trace.stopHz, 'frequency', { significantDigits: 4 })}`;
      const what = trace.port === 'load' ? 'Measured load' : 'Target conj(Zs), measured source';
      return { port: trace.port, points: pointsOf(shown), legend: `${what}${trace.fileName ? ` (${trace.fileName})` : ''}, ${band}`, start: placeOfReflection(shown[0]) };
    }),
  );

  protected readonly loadPlace = computed(() => placeOf(this.idealPath().load));
  protected readonly targetPlace = computed(() => placeOf(matchTarget(this.source(), this.referenceOhm())));
  protected readonly fitEndPlace = computed(() => {
    const path = this.fitPath();
    return path ? placeOf(path.end) : null;
  });

  /** What the chart shows, for people who cannot see it. */
  protected readonly description = computed(() => {
    const z0 = this.referenceOhm();
    const load = this.load();
    const source = this.source();
    const steps = this.idealElements().length;
    const fitEnd = this.fitPath()?.end;
    const fitText = fitEnd ? ` The chosen fit ends at ${formatImpedance(fitEnd.re * z0, fitEnd.im * z0, 3)}.` : '';
    const measuredText = this.measuredLines().map((line) => ` ${line.legend} is drawn as a trace.`).join('');
    return (
      `Smith chart normalised to ${Number(z0.toPrecision(4))} Ω. The load ${formatImpedance(load.re, load.im, 4)} ` +
      `moves through ${steps} element${steps === 1 ? '' : 's'} of the ideal network to the target ` +
      `${formatImpedance(source.re, -source.im, 4)}, the conjugate of the source.${fitText}${measuredText}`
    );
  });

  protected selectReference(value: SmithReference): void {
    this.reference.set(value);
  }
}
