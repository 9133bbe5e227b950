import {
  ChangeDetectionStrategy,
  Component,
  DestroyRef,
  ElementRef,
  computed,
  effect,
  inject,
  input,
  viewChild,
} from '@angular/core';
import {
  Chart,
  type ChartConfiguration,
  Legend,
  LineController,
  LineElement,
  LinearScale,
  PointElement,
  Tooltip,
} from 'chart.js';

import { formatValue } from '../../../shared/engine/index.js';
import { FLOOR_DB, type TpgCurve, frequencyUnit } from './tpg-sweep.js';

// Only the pieces this plot uses, so the rest of chart.js stays out of the bundle.
Chart.register(LineController, LineElement, PointElement, LinearScale, Legend, Tooltip);

/** Colours when the theme's CSS variables cannot be read (the theme's own teal and copper). */
const FALLBACK_COLOURS = { ideal: '#00696b', fit: '#9a4a16', band: '#70797a', grid: '#dbe4e4', text: '#3f4949' };

/** A theme colour from its CSS variable, or the fallback when the browser gives none we can use. */
function themeColour(host: HTMLElement, variable: string, fallback: string): string {
  const value = getComputedStyle(host).getPropertyValue(variable).trim();
  return value === '' || value.includes('(') ? fallback : value;
}

/**
 * TPG (dB) against frequency for the ideal network and the chosen fit, drawn with chart.js on a
 * canvas; the band edges, when a band is given, as dashed verticals. The figure carries a text
 * summary for people who cannot see the canvas.
 */
@Component({
  selector: 'sm-tpg-plot',
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <figure class="plot" data-testid="tpg-plot">
      <figcaption class="title">TPG against frequency</figcaption>
      <div class="canvas-box">
        <canvas #canvas role="img" [attr.aria-label]="summary()"></canvas>
      </div>
      @if (!fit()) {
        <p class="note">{{ fitNote() }}</p>
      }
    </figure>
  `,
  styles: `
    :host { display: block; }
    .plot { margin: 0; }
    .title { font: var(--mat-sys-title-medium); margin-bottom: 8px; }
    .canvas-box { position: relative; height: 280px; }
    .note { margin: 8px 0 0; font: var(--mat-sys-body-small); color: var(--mat-sys-on-surface-variant); }
  `,
})
export class TpgPlot {
  /** The ideal network's curve. */
  readonly ideal = input.required<TpgCurve>();
  /** The chosen fit's curve, or null when there is none to draw. */
  readonly fit = input<TpgCurve | null>(null);
  /** Why there is no fit curve, shown under the plot. */
  readonly fitNote = input('Choose a fit to compare it with the ideal network.');
  /** Design frequency f0, Hz. */
  readonly frequencyHz = input.required<number>();
  /** Band width centred on f0, Hz, or null. */
  readonly bandwidthHz = input<number | null>(null);

  private readonly host = inject<ElementRef<HTMLElement>>(ElementRef);
  private readonly canvas = viewChild.required<ElementRef<HTMLCanvasElement>>('canvas');
  private chart: Chart<'line'> | null = null;

  /** The plot in words: where the ideal network and the fit stand at f0 and the band edges. */
  protected readonly summary = computed(() => {
    const f0 = this.frequencyHz();
    const at = (curve: TpgCurve) => {
      let best = 0;
      curve.frequenciesHz.forEach((f, i) => {
        if (Math.abs(f - f0) < Math.abs(curve.frequenciesHz[best] - f0)) best = i;
      });
      return curve.tpgDb[best].toFixed(2);
    };
    const ideal = this.ideal();
    const fit = this.fit();
    const range = `${formatValue(ideal.frequenciesHz[0], 'frequency', { significantDigits: 3 })} to ${formatValue(ideal.frequenciesHz[ideal.frequenciesHz.length - 1], 'frequency', { significantDigits: 3 })}`;
    return (
      `Plot of TPG in dB from ${range}. At ${formatValue(f0, 'frequency')} the ideal network reaches ${at(ideal)} dB` +
      (fit ? ` and the chosen fit ${at(fit)} dB.` : '.')
    );
  });

  constructor() {
    effect(() => this.draw(this.ideal(), this.fit(), this.frequencyHz(), this.bandwidthHz()));
    inject(DestroyRef).onDestroy(() => this.chart?.destroy());
  }

  private draw(ideal: TpgCurve, fit: TpgCurve | null, frequencyHz: number, bandwidthHz: number | null): void {
    const { unit, divisor } = frequencyUnit(frequencyHz);
    const host = this.host.nativeElement;
    const colours = {
      ideal: themeColour(host, '--mat-sys-primary', FALLBACK_COLOURS.ideal),
      fit: themeColour(host, '--mat-sys-tertiary', FALLBACK_COLOURS.fit),
      band: themeColour(host, '--mat-sys-outline', FALLBACK_COLOURS.band),
      grid: themeColour(host, '--mat-sys-outline-variant', FALLBACK_COLOURS.grid),
      text: themeColour(host, '--mat-sys-on-surface-variant', FALLBACK_COLOURS.text),
    };
    const points = (curve: TpgCurve) => curve.frequenciesHz.map((f, i) => ({ x: f / divisor, y: curve.tpgDb[i] }));
    const lowest = Math.min(...ideal.tpgDb, ...(fit?.tpgDb ?? []));
    const yMin = Math.max(FLOOR_DB, Math.floor((lowest - 1) / 5) * 5);
    const datasets: ChartConfiguration<'line'>['data']['datasets'] = [
      { label: 'Ideal network', data: points(ideal), borderColor: colours.ideal, backgroundColor: colours.ideal, borderWidth: 2, pointRadius: 0, clip: false },
    ];
    if (fit) {
      datasets.push({ label: 'Chosen fit', data: points(fit), borderColor: colours.fit, backgroundColor: colours.fit, borderWidth: 2, borderDash: [6, 4], pointRadius: 0 });
    }
    if (bandwidthHz !== null) {
      const low = (frequencyHz - bandwidthHz / 2) / divisor;
      const high = (frequencyHz + bandwidthHz / 2) / divisor;
      datasets.push({
        label: 'Band edges',
        data: [{ x: low, y: yMin }, { x: low, y: 0 }, { x: low, y: null as unknown as number }, { x: high, y: yMin }, { x: high, y: 0 }],
        borderColor: colours.band,
        backgroundColor: colours.band,
        borderWidth: 1,
        borderDash: [2, 3],
        pointRadius: 0,
        spanGaps: false,
      });
    }
    const config: ChartConfiguration<'line'> = {
      type: 'line',
      data: { datasets },
      options: {
        responsive: true,
        maintainAspectRatio: false,
        animation: false,
        parsing: false,
        interaction: { mode: 'nearest', axis: 'x', intersect: false },
        scales: {
          x: {
            type: 'linear',
            min: ideal.frequenciesHz[0] / divisor,
            max: ideal.frequenciesHz[ideal.frequenciesHz.length - 1] / divisor,
            title: { display: true, text: `Frequency (${unit})`, color: colours.text },
            grid: { color: colours.grid },
            // The axis ends at the sweep's ends; labels stay on round values.
            ticks: { color: colours.text, includeBounds: false },
          },
          y: {
            type: 'linear',
            min: yMin,
            max: 0,
            title: { display: true, text: 'TPG (dB)', color: colours.text },
            grid: { color: colours.grid },
            ticks: { color: colours.text },
          },
        },
        plugins: {
          legend: { labels: { color: colours.text, boxHeight: 2 } },
          tooltip: {
            callbacks: {
              label: (item) => `${item.dataset.label}: ${(item.parsed.y ?? 0).toFixed(2)} dB`,
              title: (items) => (items[0] ? `${Number(items[0].parsed.x?.toPrecision(5))} ${unit}` : ''),
            },
          },
        },
      },
    };
    this.chart?.destroy();
    this.chart = null;
    const context = this.canvas().nativeElement.getContext('2d');
    // No 2D context (a test DOM without canvas): the figure's text summary still describes the plot.
    if (!context) return;
    this.chart = new Chart(context, config);
  }
}
