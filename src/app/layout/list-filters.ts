import { ChangeDetectionStrategy, Component, type Signal, type WritableSignal, computed, input, model, signal } from '@angular/core';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';

import { settledText } from './settled-text.js';

/** What a list's filters hold: part of a name, as typed and after a pause in typing, and a status ('' for any). */
export interface ListFilterState<S extends string> {
  readonly searchText: WritableSignal<string>;
  readonly search: Signal<string>;
  readonly status: WritableSignal<S | ''>;
  /** Whether either filter narrows the list. */
  readonly filtered: Signal<boolean>;
}

/** The state behind a {@link ListFilters} bar. Must be called in an injection context. */
export function listFilterState<S extends string>(): ListFilterState<S> {
  const searchText = signal('');
  const search = settledText(searchText);
  const status = signal<S | ''>('');
  return { searchText, search, status, filtered: computed(() => search().trim() !== '' || status() !== '') };
}

/**
 * A list's filter bar: a search box and a status choice ("Any" first). The test ids are
 * `<testIdPrefix>-search` and `<testIdPrefix>-status-filter`.
 */
@Component({
  selector: 'sm-list-filters',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatFormFieldModule, MatInputModule, MatSelectModule],
  template: `
    <mat-form-field class="search-field" subscriptSizing="dynamic">
      <mat-label>{{ searchLabel() }}</mat-label>
      <input
        matInput
        type="search"
        [value]="searchText()"
        (input)="searchText.set($any($event.target).value)"
        maxlength="200"
        autocomplete="off"
        [attr.data-testid]="testIdPrefix() + '-search'"
      />
    </mat-form-field>
    <mat-form-field class="status-field" subscriptSizing="dynamic">
      <mat-label>Status</mat-label>
      <mat-select [value]="status()" (selectionChange)="status.set($event.value)" [attr.data-testid]="testIdPrefix() + '-status-filter'">
        <mat-option value="">Any</mat-option>
        @for (s of statuses(); track s) {
          <mat-option [value]="s">{{ statusWord()(s) }}</mat-option>
        }
      </mat-select>
    </mat-form-field>
  `,
  styles: `
    :host {
      display: flex;
      flex-wrap: wrap;
      gap: 8px;
      margin-bottom: 12px;
    }

    .search-field {
      flex: 1 1 8em;
      max-width: 22em;
    }

    .status-field {
      flex: 0 1 9em;
    }
  `,
})
export class ListFilters<S extends string> {
  readonly searchLabel = input('Find by name');
  readonly statuses = input.required<readonly S[]>();
  readonly statusWord = input.required<(status: S) => string>();
  readonly testIdPrefix = input.required<string>();
  /** What the search box holds, as typed. */
  readonly searchText = model('');
  readonly status = model<S | ''>('');
}
