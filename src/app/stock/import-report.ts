import { ChangeDetectionStrategy, Component, computed, input, output } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatTableModule } from '@angular/material/table';

import type { StockImportReport } from '../../../shared/api/stock.js';

/** The row-by-row report of one upload: what it did (or would do), the rejected rows and the warnings. */
@Component({
  selector: 'sm-import-report',
  templateUrl: './import-report.html',
  styleUrl: './import-report.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatButtonModule, MatIconModule, MatTableModule],
})
export class ImportReport {
  /** The server's report (200 applied or dry run, or the body of a 422). */
  readonly report = input.required<StockImportReport>();
  /** Emits the import id when the person asks to see what changed. */
  readonly showChanges = output<number>();

  protected readonly problemColumns = ['line', 'column', 'value', 'message'];

  /** `applied`, `dry-run` or `refused`: which of the three outcomes the report tells. */
  protected readonly outcome = computed<'applied' | 'dry-run' | 'refused'>(() => {
    const report = this.report();
    if (report.applied) return 'applied';
    return isRefused(report) ? 'refused' : 'dry-run';
  });

  /** One sentence that says what happened. */
  protected readonly headline = computed(() => {
    const r = this.report();
    const counts = `${r.created} created, ${r.updated} updated, ${r.unchanged} unchanged, ${r.zeroed} set to 0`;
    if (r.applied) return `Applied: ${counts}.`;
    if (isRefused(r)) {
      const rows = r.rejectedRows === 1 ? '1 row was' : `${r.rejectedRows} rows were`;
      return r.rejectedRows > 0 ? `Nothing was applied: ${rows} rejected out of ${r.rowsRead}.` : 'Nothing was applied: the file was refused.';
    }
    return `Dry run, nothing applied. It would give: ${counts}.`;
  });
}

/** Whether the server refused the file (a 422): nothing applied and nothing counted. */
function isRefused(report: StockImportReport): boolean {
  return !report.applied && report.rejected.length > 0 && report.created + report.updated + report.unchanged + report.zeroed === 0;
}
