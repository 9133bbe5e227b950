import { ChangeDetectionStrategy, Component, computed, effect, inject, input, linkedSignal, output, signal } from '@angular/core';
import { takeUntilDestroyed, toSignal } from '@angular/core/rxjs-interop';
import { type AbstractControl, FormBuilder, ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import { MatSlideToggleModule } from '@angular/material/slide-toggle';
import { debounceTime, map, startWith } from 'rxjs';

import type { MeasuredPortInput, Objective, SolveRequest } from '../../../shared/api/matches.js';
import { MAX_MEASURED_TEXT_CHARS } from '../../../shared/touchstone/measured-port.js';
import { type FieldReading, type MatchFormField, type MatchFormValue, readForm, solveRequestOf } from './field-reading.js';

/** How long typing must pause before a field's reading updates, in milliseconds. */
export const READING_DEBOUNCE_MS = 250;

/** The objectives a designer may pick, with the words the form shows. */
export const OBJECTIVE_CHOICES: readonly { value: Objective; label: string; hint: string }[] = [
  { value: 'worst-case', label: 'Worst case', hint: 'Ranks fits by loss at the worst tolerance corner' },
  { value: 'nominal', label: 'Nominal at f0', hint: 'Ranks fits by loss at f0 with nominal values' },
  { value: 'band', label: 'Across the band', hint: 'Ranks fits by the largest loss across the band' },
];

/** A port of the match: the form takes each as typed text or as a measured file. */
export type MatchPort = 'source' | 'load';

/** What the file picker offers: Touchstone one-port files (version 1 `.s1p`, version 2 `.ts`). */
export const MEASURED_FILE_ACCEPT = '.s1p,.S1P,.ts,.txt';

/** What a request field of a saved match holds, as form text. */
function textOf(value: unknown): string {
  if (value === undefined || value === null) return '';
  if (typeof value === 'object' && 're' in (value as object)) {
    const { re, im = 0 } = value as { re: number; im?: number };
    return im === 0 ? String(re) : `${re}${im < 0 ? '-' : '+'}j${Math.abs(im)}`;
  }
  return String(value);
}

/**
 * The match form: source and load impedances, frequency, optional band and power, build quantity,
 * combinations, objective and location. Every text field shows, a moment after typing stops, what it
 * reads as (the engine's parse, in engineering notation) or the engine's message for what is wrong.
 */
@Component({
  selector: 'sm-match-form',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [
    ReactiveFormsModule,
    MatButtonModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatSelectModule,
    MatSlideToggleModule,
  ],
  templateUrl: './match-form.html',
  styleUrl: './match-form.scss',
})
export class MatchForm {
  /** Whether a solve is on its way (the button waits). */
  readonly pending = input(false);
  /** Problems the server located in the last request, by form field. */
  readonly serverProblems = input<Partial<Record<MatchFormField, string>>>({});
  /** A request to fill the form with (a reopened saved match). */
  readonly preset = input<SolveRequest | null>(null);
  /** Emits the request to solve when the form reads cleanly. */
  readonly solve = output<SolveRequest>();
  /** Emits when the user stops the solve on its way (the server then gives it up). */
  readonly stop = output<void>();

  protected readonly objectives = OBJECTIVE_CHOICES;
  protected readonly measuredFileAccept = MEASURED_FILE_ACCEPT;
  /** The two port fields, source first. */
  protected readonly ports: readonly { name: MatchPort; label: string; placeholder: string; hint: string }[] = [
    { name: 'source', label: 'Source', placeholder: '50', hint: 'e.g. 50 or 25+j10, or a measured file' },
    { name: 'load', label: 'Load', placeholder: '12-j35', hint: 'e.g. 12-j35, or a measured file' },
  ];

  protected readonly form = inject(FormBuilder).nonNullable.group({
    source: '50',
    load: '',
    sourceFile: null as MeasuredPortInput | null,
    loadFile: null as MeasuredPortInput | null,
    frequency: '',
    band: '',
    power: '',
    quantity: 1 as number | null,
    combinations: false,
    objective: 'worst-case' as Objective,
    location: '',
  });

  /** Why a chosen file could not be read at all (too big, not text), by port. */
  private readonly fileReadProblems = signal<Partial<Record<MatchPort, string>>>({});
  /** The measured file of each port, or null while the port is typed. */
  private readonly files = toSignal(
    this.form.valueChanges.pipe(map(() => ({ source: this.form.controls.sourceFile.value, load: this.form.controls.loadFile.value }))),
    { initialValue: { source: null, load: null } as Record<MatchPort, MeasuredPortInput | null> },
  );
  private readonly objective = toSignal(this.form.controls.objective.valueChanges, { initialValue: this.form.controls.objective.value });
  /** What the chosen objective ranks by. */
  protected readonly objectiveHint = computed(() => OBJECTIVE_CHOICES.find((choice) => choice.value === this.objective())?.hint ?? '');

  /** Whether the designer has asked to solve (problems then show on untouched fields too). */
  private readonly attempted = signal(false);
  /** Names of fields changed since the server's problems arrived (their problem no longer applies). */
  private readonly editedSinceServer = linkedSignal<Partial<Record<MatchFormField, string>>, ReadonlySet<string>>({
    source: this.serverProblems,
    computation: () => new Set<string>(),
  });
  /** Fields the designer has typed in so far (read when a reading is made, not on every key). */
  private readonly typedFields = new Set<string>();

  /**
   * What each field reads as, a moment after typing stops, with the fields typed in by then: a field
   * counts as typed only together with a reading of what was typed, so it never shows the reading
   * of the text it had before (an empty field's "is empty") while the new one is on its way.
   */
  private readonly readingState = toSignal(
    this.form.valueChanges.pipe(
      startWith(this.form.getRawValue()),
      debounceTime(READING_DEBOUNCE_MS),
      map(() => ({ readings: readForm(this.form.getRawValue() as MatchFormValue), typed: new Set(this.typedFields) as ReadonlySet<string> })),
    ),
    { initialValue: { readings: readForm(this.form.getRawValue() as MatchFormValue), typed: new Set<string>() as ReadonlySet<string> } },
  );

  /** The line under each field: the value read, or a problem (the server's first, then the engine's). */
  protected readonly lines = computed(() => {
    const { readings, typed } = this.readingState();
    const server = this.serverProblems();
    const edited = this.editedSinceServer();
    const shown: Partial<Record<MatchFormField, FieldReading>> = {};
    const unreadable = this.fileReadProblems();
    for (const field of Object.keys(this.form.controls) as MatchFormField[]) {
      const reading = readings[field];
      if ((field === 'source' || field === 'load') && unreadable[field]) shown[field] = { kind: 'problem', message: unreadable[field] };
      else if (server[field] && !edited.has(field)) shown[field] = { kind: 'problem', message: server[field] };
      else if (reading?.kind === 'problem' && !(this.attempted() || typed.has(field))) shown[field] = { kind: 'empty' };
      else if (reading) shown[field] = reading;
    }
    return shown;
  });

  constructor() {
    for (const [name, control] of Object.entries(this.form.controls) as [string, AbstractControl][]) {
      // A file stands for its port: choosing one counts as editing the port.
      const field = name === 'sourceFile' ? 'source' : name === 'loadFile' ? 'load' : name;
      control.valueChanges.pipe(takeUntilDestroyed()).subscribe(() => {
        this.typedFields.add(field);
        this.editedSinceServer.update((fields) => new Set(fields).add(field));
      });
    }
    effect(() => {
      const preset = this.preset();
      if (preset) this.fill(preset);
    });
  }

  /** The measured file of a port, or null. */
  protected file(port: MatchPort): MeasuredPortInput | null {
    return this.files()[port];
  }

  /** Reads the file chosen in a port's picker and uses it for that port. */
  protected async pickFile(port: MatchPort, event: Event): Promise<void> {
    const picker = event.target as HTMLInputElement;
    const chosen = picker.files?.[0];
    picker.value = '';
    if (!chosen) return;
    const control = port === 'source' ? this.form.controls.sourceFile : this.form.controls.loadFile;
    if (chosen.size > MAX_MEASURED_TEXT_CHARS) {
      this.fileReadProblems.update((p) => ({ ...p, [port]: `“${chosen.name}” is ${Math.round(chosen.size / 1000)} kB; measured files up to ${MAX_MEASURED_TEXT_CHARS / 1000} kB are accepted.` }));
      control.setValue(null);
      return;
    }
    try {
      const text = await chosen.text();
      this.fileReadProblems.update((p) => ({ ...p, [port]: undefined }));
      control.setValue({ fileName: chosen.name, text });
    } catch {
      this.fileReadProblems.update((p) => ({ ...p, [port]: `“${chosen.name}” could not be read as text.` }));
      control.setValue(null);
    }
  }

  /** Goes back to a typed impedance for a port. */
  protected clearFile(port: MatchPort): void {
    this.fileReadProblems.update((p) => ({ ...p, [port]: undefined }));
    (port === 'source' ? this.form.controls.sourceFile : this.form.controls.loadFile).setValue(null);
  }

  /** The problem shown under a field, or null. */
  protected problem(field: MatchFormField): string | null {
    const line = this.lines()[field];
    return line?.kind === 'problem' ? line.message : null;
  }

  /** The value a field reads as, or null. */
  protected reading(field: MatchFormField): string | null {
    const line = this.lines()[field];
    return line?.kind === 'value' ? line.shown : null;
  }

  protected submitRequest(): void {
    this.attempted.set(true);
    const value = this.form.getRawValue() as MatchFormValue;
    const readings = readForm(value);
    const hasProblem = Object.values(readings).some((reading) => reading?.kind === 'problem');
    if (hasProblem || this.pending()) return;
    this.solve.emit(solveRequestOf(value));
  }

  private fill(request: SolveRequest): void {
    this.form.setValue({
      source: textOf(request.source),
      load: textOf(request.load),
      sourceFile: request.sourceTouchstone ?? null,
      loadFile: request.loadTouchstone ?? null,
      frequency: textOf(request.frequencyHz),
      band: textOf(request.bandwidthHz),
      power: textOf(request.powerW),
      quantity: request.buildQuantity ?? 1,
      combinations: request.combinations ?? false,
      objective: request.objective ?? 'worst-case',
      location: textOf(request.location),
    });
  }
}
