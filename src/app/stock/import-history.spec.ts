import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { ComponentFixture, TestBed } from '@angular/core/testing';
import { HarnessLoader } from '@angular/cdk/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { MatTableHarness } from '@angular/material/table/testing';

import type { StockImportDetail, StockImportSummary } from '../../../shared/api/stock.js';
import { ImportHistory } from './import-history.js';

const ENTRY: StockImportSummary = {
  id: 12,
  status: 'applied',
  createdAt: '2026-11-30T09:15:00.000Z',
  user: { id: 3, name: 'Sana Pike', email: 'stores@tarnwick.example' },
  fileName: 'week-48.csv',
  sha256: 'ab'.repeat(32),
  sizeBytes: 2048,
  mode: 'replace',
  skipInvalid: false,
  rowsRead: 3,
  created: 1,
  updated: 1,
  unchanged: 1,
  zeroed: 1,
  rejectedCount: 0,
  warningCount: 0,
  locations: ['main'],
};

const DETAIL: StockImportDetail = {
  ...ENTRY,
  previousImportId: 11,
  rejected: [],
  warnings: [],
  problemsTruncated: false,
  changesTotal: 3,
  page: 1,
  pageSize: 50,
  changes: [
    { partId: 1, partNumber: 'TW-C0402-2P2', location: 'main', kind: 'capacitor', change: 'updated', quantityBefore: 50, quantityAfter: 45, fields: [{ field: 'tolerance', before: { mode: 'absolute', deltaSi: 0.25e-12 }, after: { mode: 'absolute', deltaSi: 0.5e-12 } }] },
    { partId: 2, partNumber: 'TW-C0402-8P2', location: 'main', kind: 'capacitor', change: 'created', quantityBefore: null, quantityAfter: 4, fields: [] },
    { partId: 3, partNumber: 'TW-L0402W-12N', location: 'main', kind: 'inductor', change: 'zeroed', quantityBefore: 30, quantityAfter: 0, fields: [] },
  ],
};

describe('ImportHistory', () => {
  let fixture: ComponentFixture<ImportHistory>;
  let loader: HarnessLoader;
  let backend: HttpTestingController;

  beforeEach(async () => {
    TestBed.configureTestingModule({ providers: [provideHttpClient(), provideHttpClientTesting()] });
    backend = TestBed.inject(HttpTestingController);
    fixture = TestBed.createComponent(ImportHistory);
    loader = TestbedHarnessEnvironment.loader(fixture);
    fixture.detectChanges();
    await fixture.whenStable();
    const list = backend.expectOne((req) => req.url === '/api/stock/imports');
    expect([list.request.params.get('page'), list.request.params.get('pageSize')]).toEqual(['1', '10']);
    list.flush({ items: [ENTRY], total: 1 });
    await fixture.whenStable();
  });
  afterEach(() => backend.verify());

  it('lists uploads with who, file and result', async () => {
    const table = await loader.getHarness(MatTableHarness.with({ selector: '[data-testid="stock-history"]' }));
    const [row] = await Promise.all((await table.getRows()).map((r) => r.getCellTextByColumnName()));
    expect(row['who']).toBe('Sana Pike');
    expect(row['file']).toContain('week-48.csv');
    expect(row['result']).toContain('1 created, 1 updated, 1 set to 0, 1 unchanged');
  });

  it('opens an import and shows each part with its quantity before and after and its other changes', async () => {
    (fixture.nativeElement.querySelector('[data-testid="stock-history-row-12"]') as HTMLElement).click();
    await fixture.whenStable();
    const detail = backend.expectOne((req) => req.url === '/api/stock/imports/12');
    expect(detail.request.params.get('change')).toBeNull();
    detail.flush(DETAIL);
    await fixture.whenStable();
    expect(fixture.nativeElement.querySelector('[data-testid="stock-history-detail"]').textContent).toContain('Changes since the previous import (#11)');
    const table = await loader.getHarness(MatTableHarness.with({ selector: '[data-testid="stock-history-changes"]' }));
    const rows = await Promise.all((await table.getRows()).map((r) => r.getCellTextByColumnName()));
    expect(rows.map((r) => [r['change'], r['quantity'], r['fields']])).toEqual([
      ['Changed', '50 → 45 (-5)', 'tolerance: ±0.25 pF → ±0.5 pF'],
      ['New', 'new: 4', '—'],
      ['Set to 0', '30 → 0 (-30)', '—'],
    ]);
  });

  it('opens an import from the keyboard through the file-name button, which says whether it is open', async () => {
    const open = fixture.nativeElement.querySelector('[data-testid="stock-history-open-12"]') as HTMLButtonElement;
    expect(open.tagName).toBe('BUTTON');
    expect(open.textContent?.trim()).toBe('week-48.csv');
    expect(open.getAttribute('aria-pressed')).toBe('false');
    // The row stays a table row: a role on it would break the table for screen readers.
    expect(fixture.nativeElement.querySelector('[data-testid="stock-history-row-12"]').getAttribute('role')).not.toBe('button');
    open.focus();
    open.click();
    await fixture.whenStable();
    backend.expectOne((req) => req.url === '/api/stock/imports/12').flush(DETAIL);
    await fixture.whenStable();
    expect(open.getAttribute('aria-pressed')).toBe('true');
    expect(fixture.nativeElement.querySelector('[data-testid="stock-history-detail"]')).not.toBeNull();
  });
});
