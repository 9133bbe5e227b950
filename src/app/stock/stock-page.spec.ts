import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { ComponentFixture, TestBed } from '@angular/core/testing';
import { HarnessLoader } from '@angular/cdk/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { MatTabGroupHarness } from '@angular/material/tabs/testing';

import type { Role } from '../../../shared/api/auth.js';
import type { StockImportReport, StockImportSummary } from '../../../shared/api/stock.js';
import { demoUser, storeSession } from '../testing/signed-in-user.js';
import { By } from '@angular/platform-browser';
import { StockPage } from './stock-page.js';
import { StockUpload } from './stock-upload.js';

const REFUSED: StockImportReport = {
  applied: false,
  dryRun: false,
  mode: 'merge',
  rowsRead: 1,
  created: 0,
  updated: 0,
  unchanged: 0,
  zeroed: 0,
  rejected: [{ line: 2, column: 'quantity', value: 'lots', message: 'quantity "lots" is not a whole number' }],
  warnings: [],
  importId: 9,
  rejectedRows: 1,
  truncated: false,
};

describe('StockPage', () => {
  let fixture: ComponentFixture<StockPage>;
  let loader: HarnessLoader;
  let backend: HttpTestingController;

  async function openAs(role: Role): Promise<string[]> {
    localStorage.clear();
    storeSession(demoUser(role));
    TestBed.configureTestingModule({ providers: [provideHttpClient(), provideHttpClientTesting()] });
    backend = TestBed.inject(HttpTestingController);
    fixture = TestBed.createComponent(StockPage);
    loader = TestbedHarnessEnvironment.loader(fixture);
    fixture.detectChanges();
    await fixture.whenStable();
    backend.match(() => true).forEach((request) => request.flush(request.request.url.endsWith('locations') ? { items: [] } : { items: [], total: 0 }));
    await fixture.whenStable();
    const tabs = await (await loader.getHarness(MatTabGroupHarness)).getTabs();
    return Promise.all(tabs.map((tab) => tab.getLabel()));
  }

  afterEach(() => localStorage.clear());

  it('shows a designer the stock list and the history, but no upload', async () => {
    expect(await openAs('designer')).toEqual(['Stock list', 'Import history']);
    expect(fixture.nativeElement.querySelector('[data-testid="stock-upload-input"]')).toBeNull();
  });

  it('gives stores and admin the upload tab', async () => {
    expect(await openAs('stores')).toEqual(['Stock list', 'Upload', 'Import history']);
    TestBed.resetTestingModule();
    expect(await openAs('admin')).toEqual(['Stock list', 'Upload', 'Import history']);
  });

  it('lists a refused upload in the history when the history tab is opened after it', async () => {
    await openAs('stores');
    const group = await loader.getHarness(MatTabGroupHarness);
    await group.selectTab({ label: 'Upload' });
    await fixture.whenStable();
    const upload = fixture.debugElement.query(By.directive(StockUpload)).componentInstance as StockUpload;
    upload.recorded.emit(REFUSED);
    await group.selectTab({ label: 'Import history' });
    await fixture.whenStable();
    const history = backend.match((request) => request.method === 'GET' && request.url === '/api/stock/imports');
    expect(history.length).toBe(1);
    const entry: StockImportSummary = {
      id: 9,
      status: 'rejected',
      createdAt: '2026-12-02T10:00:00Z',
      user: null,
      fileName: 'week-49.csv',
      sha256: 'ab'.repeat(32),
      sizeBytes: 120,
      mode: 'merge',
      skipInvalid: false,
      rowsRead: 1,
      created: 0,
      updated: 0,
      unchanged: 0,
      zeroed: 0,
      rejectedCount: 1,
      warningCount: 0,
      locations: ['main'],
    };
    history[0].flush({ items: [entry], total: 1 });
    await fixture.whenStable();
    expect(fixture.nativeElement.textContent).toContain('week-49.csv');
  });
});
