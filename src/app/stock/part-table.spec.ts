import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting, type TestRequest } from '@angular/common/http/testing';
import { ComponentFixture, TestBed } from '@angular/core/testing';
import { HarnessLoader } from '@angular/cdk/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { MatSelectHarness } from '@angular/material/select/testing';
import { MatSortHarness } from '@angular/material/sort/testing';
import { MatTableHarness } from '@angular/material/table/testing';
import { MatPaginatorHarness } from '@angular/material/paginator/testing';

import type { PartItem, PartListResponse } from '../../../shared/api/stock.js';
import { PartTable } from './part-table.js';

// Invented parts of the demo company's stores (product.md: Tarnwick Field Sensors).
const CAP: PartItem = {
  id: 1,
  partNumber: 'TW-C0402-4P7',
  kind: 'capacitor',
  value: 4.7e-12,
  tolerance: { mode: 'absolute', deltaSi: 0.25e-12 },
  srfHz: 9.5e9,
  q: null,
  qFrequencyHz: null,
  esrOhm: 0.35,
  quantity: 120,
  reserved: 20,
  available: 100,
  package: '0402',
  voltageRating: 50,
  currentRating: null,
  location: 'main',
  series: 'E12',
  unitCost: '0.0125',
  manufacturerPart: null,
  description: 'C0G',
};
const IND: PartItem = {
  ...CAP,
  id: 2,
  partNumber: 'TW-L0402W-12N',
  kind: 'inductor',
  value: 12e-9,
  tolerance: { mode: 'relative', fraction: 0.05 },
  srfHz: null,
  q: 38,
  qFrequencyHz: 500e6,
  esrOhm: null,
  quantity: 0,
  reserved: 0,
  available: 0,
  voltageRating: null,
  currentRating: 0.3,
  location: 'lab',
};

describe('PartTable', () => {
  let fixture: ComponentFixture<PartTable>;
  let loader: HarnessLoader;
  let backend: HttpTestingController;

  function answerParts(request: TestRequest, answer: PartListResponse): void {
    request.flush(answer);
  }

  const partsRequest = () => backend.expectOne((req) => req.url === '/api/parts');

  beforeEach(async () => {
    TestBed.configureTestingModule({ providers: [provideHttpClient(), provideHttpClientTesting()] });
    backend = TestBed.inject(HttpTestingController);
    fixture = TestBed.createComponent(PartTable);
    loader = TestbedHarnessEnvironment.loader(fixture);
    fixture.detectChanges();
    await fixture.whenStable();
    backend.expectOne('/api/parts/locations').flush({ items: ['lab', 'main'] });
  });
  afterEach(() => backend.verify());

  it('asks for the first page sorted by part number, and shows values with units and tolerance', async () => {
    const request = partsRequest();
    expect(request.request.params.keys().sort()).toEqual(['order', 'page', 'pageSize', 'sort']);
    expect([request.request.params.get('sort'), request.request.params.get('order'), request.request.params.get('page'), request.request.params.get('pageSize')]).toEqual([
      'partNumber',
      'asc',
      '1',
      '25',
    ]);
    answerParts(request, { items: [CAP, IND], total: 2 });
    await fixture.whenStable();
    const table = await loader.getHarness(MatTableHarness.with({ selector: '[data-testid="stock-table"]' }));
    const rows = await Promise.all((await table.getRows()).map((row) => row.getCellTextByColumnName()));
    expect(rows.map((r) => [r['value'], r['tolerance'], r['srfHz'], r['loss'], r['rating'], r['location']])).toEqual([
      ['4.7 pF', '±0.25 pF', '9.5 GHz', 'ESR 0.35 Ω', '50 V', 'main'],
      ['12 nH', '±5 %', '—', 'Q 38 @ 500 MHz', '300 mA', 'lab'],
    ]);
    expect(rows[0]['available']).toContain('100');
    expect(rows[0]['available']).toContain('20 reserved');
    expect(rows[1]['available']).toBe('Out of stock');
  });

  it('filters by kind and location on the server, back on page 1', async () => {
    answerParts(partsRequest(), { items: [CAP], total: 80 });
    await fixture.whenStable();
    const paginator = await loader.getHarness(MatPaginatorHarness);
    await paginator.goToNextPage();
    const second = partsRequest();
    expect(second.request.params.get('page')).toBe('2');
    answerParts(second, { items: [CAP], total: 80 });

    const kind = await loader.getHarness(MatSelectHarness.with({ selector: '[data-testid="stock-filter-kind"]' }));
    await kind.open();
    await kind.clickOptions({ text: 'Inductors' });
    const byKind = partsRequest();
    expect([byKind.request.params.get('kind'), byKind.request.params.get('page')]).toEqual(['inductor', '1']);
    answerParts(byKind, { items: [IND], total: 1 });

    const location = await loader.getHarness(MatSelectHarness.with({ selector: '[data-testid="stock-filter-location"]' }));
    await location.open();
    await location.clickOptions({ text: 'lab' });
    const byLocation = partsRequest();
    expect([byLocation.request.params.get('kind'), byLocation.request.params.get('location')]).toEqual(['inductor', 'lab']);
    answerParts(byLocation, { items: [IND], total: 1 });
  });

  it('sorts on the server when a column header is clicked', async () => {
    answerParts(partsRequest(), { items: [CAP, IND], total: 2 });
    await fixture.whenStable();
    const sort = await loader.getHarness(MatSortHarness);
    const [valueHeader] = await sort.getSortHeaders({ label: 'Value' });
    await valueHeader.click();
    const byValue = partsRequest();
    expect([byValue.request.params.get('sort'), byValue.request.params.get('order')]).toEqual(['value', 'asc']);
    answerParts(byValue, { items: [CAP, IND], total: 2 });
    await valueHeader.click();
    const descending = partsRequest();
    expect([descending.request.params.get('sort'), descending.request.params.get('order')]).toEqual(['value', 'desc']);
    answerParts(descending, { items: [IND, CAP], total: 2 });
  });

  it('sends the search after typing pauses', async () => {
    answerParts(partsRequest(), { items: [CAP, IND], total: 2 });
    const input = fixture.nativeElement.querySelector('[data-testid="stock-search"]') as HTMLInputElement;
    input.value = '4p7';
    input.dispatchEvent(new Event('input'));
    await vi.waitFor(() => backend.expectOne((req) => req.url === '/api/parts' && req.params.get('search') === '4p7').flush({ items: [CAP], total: 1 }), {
      timeout: 2000,
    });
  });
});
