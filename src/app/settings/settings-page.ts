import { ChangeDetectionStrategy, Component, inject, signal } from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatCardModule } from '@angular/material/card';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSelectModule } from '@angular/material/select';
import { MatSlideToggleModule } from '@angular/material/slide-toggle';
import { MatSnackBar } from '@angular/material/snack-bar';
import { firstValueFrom } from 'rxjs';

import type { Objective } from '../../../shared/api/matches.js';
import { PREFERRED_SERIES, type PreferredSeries, SETTINGS_LIMITS } from '../../../shared/api/settings.js';
import { apiErrorDetails, apiErrorMessage } from '../api/api-error-message.js';
import { isAnnouncedByInterceptor } from '../auth/auth-interceptor.js';
import { type OrganisationSettings, type OrganisationSettingsResponse, OrganisationSettingsClient } from './organisation-settings.js';

/** How long a confirmation stays, in milliseconds. */
const NOTICE_MS = 5000;

/** The fields of the settings form, flat (the series per kind are two fields). */
type SettingsField = 'usableSrfFraction' | 'excludeAboveLimit' | 'defaultObjective' | 'lossBudgetDb' | 'capacitorSeries' | 'inductorSeries' | 'attritionPercent';

/** Which form field a request field (`details[].field`) belongs to. */
function fieldOf(requestField: string | undefined): SettingsField | null {
  if (!requestField) return null;
  if (requestField === 'preferredSeries.capacitor') return 'capacitorSeries';
  if (requestField === 'preferredSeries.inductor') return 'inductorSeries';
  const known: SettingsField[] = ['usableSrfFraction', 'excludeAboveLimit', 'defaultObjective', 'lossBudgetDb', 'attritionPercent'];
  return known.find((field) => field === requestField) ?? null;
}

/**
 * Organisation settings (admin): the usable fraction of SRF and whether parts above it are left out,
 * the default objective, the loss budget for yield and shortfall specs, the E-series buy-to values
 * come from, and the attrition allowance on purchases.
 */
@Component({
  selector: 'sm-settings-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [
    ReactiveFormsModule,
    MatButtonModule,
    MatCardModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatProgressBarModule,
    MatSelectModule,
    MatSlideToggleModule,
  ],
  templateUrl: './settings-page.html',
  styleUrl: './settings-page.scss',
})
export class SettingsPage {
  private readonly client = inject(OrganisationSettingsClient);
  private readonly snackBar = inject(MatSnackBar);

  protected readonly seriesNames: readonly PreferredSeries[] = PREFERRED_SERIES;
  protected readonly objectives: readonly { value: Objective; label: string }[] = [
    { value: 'worst-case', label: 'Worst case over tolerances' },
    { value: 'nominal', label: 'Nominal values at f0' },
    { value: 'band', label: 'Across the band' },
  ];
  protected readonly form = inject(NonNullableFormBuilder).group({
    usableSrfPercent: [50, [Validators.required, Validators.min(1), Validators.max(SETTINGS_LIMITS.usableSrfFraction.max * 100)]],
    excludeAboveLimit: false,
    defaultObjective: 'worst-case' as Objective,
    lossBudgetDb: [0.5, [Validators.required, Validators.min(0.01), Validators.max(SETTINGS_LIMITS.lossBudgetDb.max)]],
    capacitorSeries: 'E24' as PreferredSeries,
    inductorSeries: 'E12' as PreferredSeries,
    attritionPercent: [
      5,
      [Validators.required, Validators.min(SETTINGS_LIMITS.attritionPercent.min), Validators.max(SETTINGS_LIMITS.attritionPercent.max)],
    ],
  });

  /** Whether the settings are being fetched. */
  protected readonly loading = signal(true);
  /** Why the settings could not be fetched, or null. */
  protected readonly loadError = signal<string | null>(null);
  /** Whether a save is on its way. */
  protected readonly saving = signal(false);
  /** Why the last save failed, or null. */
  protected readonly saveError = signal<string | null>(null);
  /** Who changed the settings last and when, or null while the defaults stand. */
  protected readonly lastChange = signal<string | null>(null);
  /** Problems the server located, by field. */
  protected readonly fieldProblems = signal<Partial<Record<SettingsField, string>>>({});

  constructor() {
    void this.loadSettings();
  }

  protected async loadSettings(): Promise<void> {
    this.loading.set(true);
    this.loadError.set(null);
    try {
      this.show(await firstValueFrom(this.client.read()));
    } catch (error: unknown) {
      this.loadError.set(apiErrorMessage(error, 'The settings could not be loaded.'));
    } finally {
      this.loading.set(false);
    }
  }

  protected async saveSettings(): Promise<void> {
    if (this.saving()) return;
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      return;
    }
    const value = this.form.getRawValue();
    const settings: OrganisationSettings = {
      // Shown in percent, stored as a fraction (0.5 = half the SRF).
      usableSrfFraction: Number((value.usableSrfPercent / 100).toPrecision(6)),
      excludeAboveLimit: value.excludeAboveLimit,
      defaultObjective: value.defaultObjective,
      lossBudgetDb: value.lossBudgetDb,
      preferredSeries: { capacitor: value.capacitorSeries, inductor: value.inductorSeries },
      attritionPercent: value.attritionPercent,
    };
    this.saving.set(true);
    this.saveError.set(null);
    this.fieldProblems.set({});
    try {
      this.show(await firstValueFrom(this.client.write(settings)));
      this.snackBar.open('Organisation settings saved. New solves use them from now on.', 'Close', { duration: NOTICE_MS });
    } catch (error: unknown) {
      const problems: Partial<Record<SettingsField, string>> = {};
      for (const detail of apiErrorDetails(error)) {
        const field = fieldOf(detail.field);
        if (field && problems[field] === undefined) problems[field] = detail.message;
      }
      this.fieldProblems.set(problems);
      this.saveError.set(
        isAnnouncedByInterceptor(error) ? 'The settings were not saved.' : apiErrorMessage(error, 'The settings were not saved, and the server did not say why.'),
      );
    } finally {
      this.saving.set(false);
    }
  }

  private show(settings: OrganisationSettingsResponse): void {
    const at = settings.updatedAt ? new Date(settings.updatedAt) : null;
    this.lastChange.set(
      at && !Number.isNaN(at.getTime())
        ? `Last changed on ${at.toLocaleString(undefined, { dateStyle: 'medium', timeStyle: 'short' })}${settings.updatedBy ? ` by ${settings.updatedBy.name}` : ''}.`
        : 'The defaults stand: nobody has changed the settings yet.',
    );
    this.form.setValue({
      usableSrfPercent: Number((settings.usableSrfFraction * 100).toPrecision(6)),
      excludeAboveLimit: settings.excludeAboveLimit,
      defaultObjective: settings.defaultObjective,
      lossBudgetDb: settings.lossBudgetDb,
      capacitorSeries: settings.preferredSeries.capacitor,
      inductorSeries: settings.preferredSeries.inductor,
      attritionPercent: settings.attritionPercent,
    });
    this.form.markAsPristine();
  }
}
