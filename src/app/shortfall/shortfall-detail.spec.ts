import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { ComponentFixture, TestBed } from '@angular/core/testing';
import { HarnessLoader } from '@angular/cdk/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MatInputHarness } from '@angular/material/input/testing';
import { MatSelectHarness } from '@angular/material/select/testing';
import { MatTableHarness } from '@angular/material/table/testing';

import type { Role } from '../../../shared/api/auth.js';
import type { ShortfallListResponse } from '../../../shared/api/builds.js';
import { demoUser, storeSession } from '../testing/signed-in-user.js';
import { SHORTFALL } from '../builds/build-fixtures.js';
import { ShortfallDetail } from './shortfall-detail.js';

describe('ShortfallDetail', () => {
  let fixture: ComponentFixture<ShortfallDetail>;
  let loader: HarnessLoader;
  let backend: HttpTestingController;
  let changed: (ShortfallListResponse | null)[];

  async function openAs(role: Role): Promise<void> {
    localStorage.clear();
    storeSession(demoUser(role));
    TestBed.configureTestingModule({ providers: [provideHttpClient(), provideHttpClientTesting()] });
    backend = TestBed.inject(HttpTestingController);
    fixture = TestBed.createComponent(ShortfallDetail);
    fixture.componentRef.setInput('buildId', 5);
    fixture.componentRef.setInput('shortfall', SHORTFALL);
    changed = [];
    fixture.componentInstance.changed.subscribe((c) => changed.push(c));
    loader = TestbedHarnessEnvironment.loader(fixture);
    fixture.detectChanges();
    await fixture.whenStable();
  }
  const testId = (id: string) => `[data-testid="${id}"]`;
  afterEach(() => localStorage.clear());

  it('lists each line with its buy-to spec', async () => {
    await openAs('purchasing');
    const table = await loader.getHarness(MatTableHarness.with({ selector: testId('shortfall-lines') }));
    const [row] = await Promise.all((await table.getRows()).map((r) => r.getCellTextByColumnName()));
    expect(row['quantity']).toBe('42');
    expect(row['value']).toContain('6.8 pF E24');
    expect(row['value']).toContain('ideal 6.526 pF');
    expect(row['tolerance']).toBe('±0.25 pF (C)');
    expect(row['srf']).toBe('1.736 GHz');
    expect(row['package']).toBe('0402');
  });

  it('sends the list to the address typed and reads it back', async () => {
    await openAs('purchasing');
    await (await loader.getHarness(MatInputHarness.with({ selector: testId('shortfall-send-to') }))).setValue('orders@supplier.example');
    await (await loader.getHarness(MatButtonHarness.with({ selector: testId('shortfall-send') }))).click();
    const send = backend.expectOne({ method: 'POST', url: '/api/builds/5/shortfall/send' });
    expect(send.request.body).toEqual({ to: 'orders@supplier.example' });
    send.flush({ outboxId: 3, to: ['orders@supplier.example'], status: 'sent' });
    const sent = { ...SHORTFALL, list: { ...SHORTFALL.list!, status: 'sent' as const, sentTo: 'orders@supplier.example' } };
    backend.expectOne({ method: 'GET', url: '/api/builds/5/shortfall' }).flush(sent);
    await fixture.whenStable();
    expect(changed).toEqual([sent]);
    expect(fixture.nativeElement.querySelector(testId('shortfall-message')).textContent).toContain('Sent to orders@supplier.example with the CSV attached.');
  });

  it('changes the status through the API', async () => {
    await openAs('admin');
    const select = await loader.getHarness(MatSelectHarness.with({ selector: testId('shortfall-status') }));
    expect(await select.getValueText()).toBe('Draft');
    await select.open();
    await select.clickOptions({ text: 'Ordered' });
    const request = backend.expectOne({ method: 'PATCH', url: '/api/builds/5/shortfall' });
    expect(request.request.body).toEqual({ status: 'ordered' });
    request.flush({ ...SHORTFALL, list: { ...SHORTFALL.list!, status: 'ordered' } });
    await fixture.whenStable();
    expect(changed[0]?.list?.status).toBe('ordered');
  });

  it('exports the CSV as a download', async () => {
    await openAs('designer');
    const clicked: string[] = [];
    const created = vi.spyOn(URL, 'createObjectURL').mockReturnValue('blob:shortfall');
    vi.spyOn(URL, 'revokeObjectURL').mockImplementation(() => undefined);
    vi.spyOn(HTMLAnchorElement.prototype, 'click').mockImplementation(function (this: HTMLAnchorElement) {
      clicked.push(this.download);
    });
    await (await loader.getHarness(MatButtonHarness.with({ selector: testId('shortfall-export') }))).click();
    backend.expectOne('/api/builds/5/shortfall.csv').flush(new Blob(['line,kind\r\n']));
    await fixture.whenStable();
    await new Promise((resolve) => setTimeout(resolve, 0));
    expect(created).toHaveBeenCalled();
    expect(clicked).toEqual(['shortfall-NODE-868-rev-C-5.csv']);
    vi.restoreAllMocks();
  });

  it('shows a designer the list without sending, status choice or receiving', async () => {
    await openAs('designer');
    const el: HTMLElement = fixture.nativeElement;
    expect(el.querySelector(testId('shortfall-send'))).toBeNull();
    expect(el.querySelector(testId('shortfall-receive'))).toBeNull();
    expect(el.querySelector(testId('shortfall-status'))?.textContent).toContain('Draft');
  });

  it('opens the receiving form for stores', async () => {
    await openAs('stores');
    expect(fixture.nativeElement.querySelector(testId('shortfall-send'))).toBeNull();
    await (await loader.getHarness(MatButtonHarness.with({ selector: testId('shortfall-receive') }))).click();
    expect(fixture.nativeElement.querySelectorAll(testId('shortfall-receive-line'))).toHaveLength(1);
  });
});
