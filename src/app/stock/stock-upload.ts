import { HttpErrorResponse, HttpEventType } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, DestroyRef, ElementRef, inject, output, signal, viewChild } from '@angular/core';
import { takeUntilDestroyed } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { MatCheckboxModule } from '@angular/material/checkbox';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatRadioModule } from '@angular/material/radio';

import type { StockImportMode, StockImportReport } from '../../../shared/api/stock.js';
import { apiErrorMessage } from '../api/api-error-message.js';
import { ImportReport } from './import-report.js';
import { StockClient } from './stock-client.js';

/** Largest file the server accepts (stock-csv.md: 20 MB); bigger ones are refused before sending. */
export const MAX_STOCK_FILE_BYTES = 20 * 1024 * 1024;

/** Whether `report` came back from the server in the import report's shape (also inside a 422). */
function isImportReport(body: unknown): body is StockImportReport {
  return typeof body === 'object' && body !== null && Array.isArray((body as StockImportReport).rejected) && 'rowsRead' in body;
}

/** The upload panel (stores and admin): pick or drop a CSV, choose how to apply it, send it, read the report. */
@Component({
  selector: 'sm-stock-upload',
  templateUrl: './stock-upload.html',
  styleUrl: './stock-upload.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatButtonModule, MatCheckboxModule, MatIconModule, MatProgressBarModule, MatRadioModule, ImportReport],
})
export class StockUpload {
  /** Emits each report of an upload that changed the stock. */
  readonly imported = output<StockImportReport>();
  /** Emits each report the import history keeps (applied or refused; not a dry run). */
  readonly recorded = output<StockImportReport>();
  /** Emits an import's id when the person asks to see what it changed. */
  readonly showChanges = output<number>();

  private readonly client = inject(StockClient);
  private readonly destroyRef = inject(DestroyRef);
  private readonly fileInput = viewChild.required<ElementRef<HTMLInputElement>>('fileInput');

  protected readonly file = signal<File | null>(null);
  protected readonly mode = signal<StockImportMode>('merge');
  protected readonly dryRun = signal(false);
  protected readonly skipInvalid = signal(false);
  /** Whether a file is being dragged over the drop zone. */
  protected readonly dragging = signal(false);
  /** Whether an upload is on its way. */
  protected readonly uploading = signal(false);
  /** Share of the file sent, 0 to 100, while uploading. */
  protected readonly progress = signal(0);
  /** The report of the last upload, applied or refused. */
  protected readonly report = signal<StockImportReport | null>(null);
  /** Why the last upload failed without a report (wrong encoding, too large, server down), or null. */
  protected readonly failure = signal<string | null>(null);

  protected chooseFile(event: Event): void {
    const input = event.target as HTMLInputElement;
    this.takeFile(input.files?.item(0) ?? null);
  }

  protected dragOver(event: DragEvent): void {
    event.preventDefault();
    if (event.dataTransfer) event.dataTransfer.dropEffect = 'copy';
    this.dragging.set(true);
  }

  protected dragLeave(): void {
    this.dragging.set(false);
  }

  protected dropFile(event: DragEvent): void {
    event.preventDefault();
    this.dragging.set(false);
    this.takeFile(event.dataTransfer?.files.item(0) ?? null);
  }

  protected openFilePicker(): void {
    this.fileInput().nativeElement.click();
  }

  protected uploadStockList(): void {
    const file = this.file();
    if (!file || this.uploading()) return;
    this.uploading.set(true);
    this.progress.set(0);
    this.report.set(null);
    this.failure.set(null);
    this.client
      .uploadStockList(file, { mode: this.mode(), dryRun: this.dryRun(), skipInvalid: this.skipInvalid() })
      .pipe(takeUntilDestroyed(this.destroyRef))
      .subscribe({
        next: (event) => {
          if (event.type === HttpEventType.UploadProgress) {
            this.progress.set(event.total ? Math.round((100 * event.loaded) / event.total) : 0);
          } else if (event.type === HttpEventType.Response && event.body) {
            this.finish(event.body);
          }
        },
        error: (error: unknown) => {
          if (error instanceof HttpErrorResponse && error.status === 422 && isImportReport(error.error)) {
            this.finish(error.error);
          } else {
            this.failure.set(apiErrorMessage(error, 'The upload failed, and the server did not say why. Nothing was applied.'));
            this.uploading.set(false);
          }
        },
      });
  }

  private finish(report: StockImportReport): void {
    this.progress.set(100);
    this.report.set(report);
    this.uploading.set(false);
    if (report.applied) this.imported.emit(report);
    if (report.importId !== null) this.recorded.emit(report);
  }

  private takeFile(file: File | null): void {
    this.failure.set(null);
    if (file && file.size > MAX_STOCK_FILE_BYTES) {
      this.file.set(null);
      this.failure.set(`${file.name} is ${(file.size / 1024 / 1024).toFixed(1)} MB; one upload may be at most 20 MB. Split it by location.`);
      return;
    }
    this.file.set(file);
  }

  protected fileSizeText(file: File): string {
    return file.size < 1024 ? `${file.size} bytes` : file.size < 1024 * 1024 ? `${(file.size / 1024).toFixed(1)} kB` : `${(file.size / 1024 / 1024).toFixed(1)} MB`;
  }
}
