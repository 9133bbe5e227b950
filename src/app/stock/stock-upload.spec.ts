import { provideHttpClient } from '@angular/common/http';
import { HttpEventType } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { ComponentFixture, TestBed } from '@angular/core/testing';
import { HarnessLoader } from '@angular/cdk/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MatCheckboxHarness } from '@angular/material/checkbox/testing';
import { MatProgressBarHarness } from '@angular/material/progress-bar/testing';
import { MatRadioGroupHarness } from '@angular/material/radio/testing';
import { MatTableHarness } from '@angular/material/table/testing';

import type { StockImportReport } from '../../../shared/api/stock.js';
import { StockUpload } from './stock-upload.js';

const REFUSED: StockImportReport = {
  applied: false,
  dryRun: false,
  mode: 'replace',
  rowsRead: 3,
  created: 0,
  updated: 0,
  unchanged: 0,
  zeroed: 0,
  rejected: [{ line: 4, column: 'quantity', value: 'lots', message: 'quantity "lots" is not a whole number; write it like 0, 25 or 4000' }],
  warnings: [],
  importId: 7,
  rejectedRows: 1,
  truncated: false,
};

describe('StockUpload', () => {
  let fixture: ComponentFixture<StockUpload>;
  let loader: HarnessLoader;
  let backend: HttpTestingController;

  beforeEach(() => {
    TestBed.configureTestingModule({ providers: [provideHttpClient(), provideHttpClientTesting()] });
    backend = TestBed.inject(HttpTestingController);
    fixture = TestBed.createComponent(StockUpload);
    loader = TestbedHarnessEnvironment.loader(fixture);
  });
  afterEach(() => backend.verify());

  function choose(file: File): void {
    const input = fixture.nativeElement.querySelector('[data-testid="stock-upload-input"]') as HTMLInputElement;
    const files = { 0: file, length: 1, item: (i: number) => (i === 0 ? file : null) } as unknown as FileList;
    Object.defineProperty(input, 'files', { value: files, configurable: true });
    input.dispatchEvent(new Event('change'));
  }

  const submit = () => loader.getHarness(MatButtonHarness.with({ selector: '[data-testid="stock-upload-submit"]' }));

  it('cannot be sent before a file is chosen', async () => {
    expect(await (await submit()).isDisabled()).toBe(true);
  });

  it('sends the file with mode, dry run and skip-invalid, shows progress, then the rejected rows', async () => {
    const applied = vi.fn();
    const recorded = vi.fn();
    fixture.componentRef.instance.imported.subscribe(applied);
    fixture.componentRef.instance.recorded.subscribe(recorded);
    choose(new File(['part_number,kind,value,tolerance,quantity\n'], 'week-48.csv', { type: 'text/csv' }));
    await fixture.whenStable();
    expect(fixture.nativeElement.querySelector('[data-testid="stock-upload-file"]').textContent).toContain('week-48.csv');
    await (await loader.getHarness(MatRadioGroupHarness)).checkRadioButton({ label: /Replace/ });
    await (await loader.getHarness(MatCheckboxHarness.with({ selector: '[data-testid="stock-upload-skip-invalid"]' }))).check();
    await (await submit()).click();

    const request = backend.expectOne('/api/stock/imports');
    expect(request.request.method).toBe('POST');
    expect(request.request.reportProgress).toBe(true);
    const form = request.request.body as FormData;
    expect([form.get('mode'), form.get('dryRun'), form.get('skipInvalid')]).toEqual(['replace', 'false', 'true']);
    expect((form.get('file') as File).name).toBe('week-48.csv');

    request.event({ type: HttpEventType.UploadProgress, loaded: 40, total: 100 });
    await fixture.whenStable();
    const bar = await loader.getHarness(MatProgressBarHarness);
    expect(await bar.getValue()).toBe(40);

    request.flush({ ...REFUSED, error: { code: 'rejected', message: '1 row(s) were rejected' } }, { status: 422, statusText: 'Unprocessable Entity' });
    await fixture.whenStable();
    const headline = fixture.nativeElement.querySelector('[data-testid="stock-report-headline"]').textContent;
    expect(headline).toContain('Nothing was applied: 1 row was rejected out of 3.');
    const table = await loader.getHarness(MatTableHarness.with({ selector: '[data-testid="stock-rejected-table"]' }));
    const rows = await Promise.all((await table.getRows()).map((row) => row.getCellTextByColumnName()));
    expect(rows).toEqual([{ line: '4', column: 'quantity', value: 'lots', message: REFUSED.rejected[0].message }]);
    expect(applied).not.toHaveBeenCalled();
    // The history keeps the refused attempt, so the page is told to show it there.
    expect(recorded).toHaveBeenCalledWith(expect.objectContaining(REFUSED));
  });

  it('does not tell the page of a dry run, which the history does not keep', async () => {
    const applied = vi.fn();
    const recorded = vi.fn();
    fixture.componentRef.instance.imported.subscribe(applied);
    fixture.componentRef.instance.recorded.subscribe(recorded);
    choose(new File(['x'], 'try.csv'));
    await fixture.whenStable();
    await (await submit()).click();
    backend.expectOne('/api/stock/imports').flush({ ...REFUSED, applied: false, dryRun: true, rejected: [], rejectedRows: 0, importId: null });
    await fixture.whenStable();
    expect(applied).not.toHaveBeenCalled();
    expect(recorded).not.toHaveBeenCalled();
  });

  it('reports an applied import, tells the page, and offers to show the changes', async () => {
    const applied = vi.fn();
    const shown = vi.fn();
    fixture.componentRef.instance.imported.subscribe(applied);
    fixture.componentRef.instance.showChanges.subscribe(shown);
    choose(new File(['x'], 'fixed.csv'));
    await fixture.whenStable();
    await (await submit()).click();
    const report: StockImportReport = { ...REFUSED, applied: true, mode: 'merge', created: 2, updated: 1, rejected: [], rejectedRows: 0, importId: 8 };
    backend.expectOne('/api/stock/imports').flush(report);
    await fixture.whenStable();
    expect(applied).toHaveBeenCalledWith(report);
    expect(fixture.nativeElement.querySelector('[data-testid="stock-report-headline"]').textContent).toContain(
      'Applied: 2 created, 1 updated, 0 unchanged, 0 set to 0.',
    );
    await (await loader.getHarness(MatButtonHarness.with({ selector: '[data-testid="stock-report-show-changes"]' }))).click();
    expect(shown).toHaveBeenCalledWith(8);
  });

  it("shows the server's reason when a file is refused before any row is read", async () => {
    choose(new File(['x'], 'latin1.csv'));
    await fixture.whenStable();
    await (await submit()).click();
    backend.expectOne('/api/stock/imports').flush(
      { error: { code: 'not_utf8', message: 'The file is not UTF-8 text: byte 0xE9 on line 2.' } },
      { status: 400, statusText: 'Bad Request' },
    );
    await fixture.whenStable();
    expect(fixture.nativeElement.querySelector('[data-testid="stock-upload-error"]').textContent).toContain('byte 0xE9 on line 2');
  });

  it('refuses a file over 20 MB without sending it', async () => {
    const big = new File(['x'], 'huge.csv');
    Object.defineProperty(big, 'size', { value: 20 * 1024 * 1024 + 1 });
    choose(big);
    await fixture.whenStable();
    expect(fixture.nativeElement.querySelector('[data-testid="stock-upload-error"]').textContent).toContain('at most 20 MB');
    expect(await (await submit()).isDisabled()).toBe(true);
  });
});
