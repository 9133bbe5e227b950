import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { ComponentFixture, TestBed } from '@angular/core/testing';
import { HarnessLoader } from '@angular/cdk/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MatInputHarness } from '@angular/material/input/testing';

import type { ReceiveShortfallResponse } from '../../../shared/api/builds.js';
import { CAPACITOR_LINE, SHORTFALL } from '../builds/build-fixtures.js';
import { ShortfallReceiveForm, suggestedPartNumber } from './shortfall-receive-form.js';

describe('suggestedPartNumber', () => {
  it('writes kind, value code and package', () => {
    expect(suggestedPartNumber({ kind: 'capacitor', buyValue: 6.8e-12, package: '0402' })).toBe('RCV-C-6P8-0402');
    expect(suggestedPartNumber({ kind: 'inductor', buyValue: 10e-9, package: null })).toBe('RCV-L-10N');
    expect(suggestedPartNumber({ kind: 'capacitor', buyValue: 100e-12, package: '0603' })).toBe('RCV-C-100P-0603');
  });
});

describe('ShortfallReceiveForm', () => {
  let fixture: ComponentFixture<ShortfallReceiveForm>;
  let loader: HarnessLoader;
  let backend: HttpTestingController;
  let received: ReceiveShortfallResponse[];

  beforeEach(async () => {
    TestBed.configureTestingModule({ providers: [provideHttpClient(), provideHttpClientTesting()] });
    backend = TestBed.inject(HttpTestingController);
    fixture = TestBed.createComponent(ShortfallReceiveForm);
    fixture.componentRef.setInput('buildId', 5);
    fixture.componentRef.setInput('lines', [{ ...CAPACITOR_LINE, receivedQuantity: 12 }]);
    received = [];
    fixture.componentInstance.received.subscribe((r) => received.push(r));
    loader = TestbedHarnessEnvironment.loader(fixture);
    fixture.detectChanges();
    await fixture.whenStable();
  });
  afterEach(() => backend.verify());

  const input = (testId: string) => loader.getHarness(MatInputHarness.with({ selector: `[data-testid="${testId}"]` }));
  const submit = async () => (await loader.getHarness(MatButtonHarness.with({ selector: '[data-testid="shortfall-receive-submit"]' }))).click();

  it('starts from what is still to come and sends the receipt', async () => {
    // 42 to buy, 12 received so far: 30 to come.
    expect(await (await input('shortfall-receive-quantity')).getValue()).toBe('30');
    expect(await (await input('shortfall-receive-part')).getValue()).toBe('RCV-C-6P8-0402');
    await (await input('shortfall-receive-part')).setValue('TW-C0402-6P8');
    await submit();
    const request = backend.expectOne({ method: 'POST', url: '/api/builds/5/shortfall/receive' });
    expect(request.request.body).toEqual({ lines: [{ lineId: 71, quantity: 30, partNumber: 'TW-C0402-6P8', location: 'main', srfHz: null }] });
    request.flush({ importId: 44, created: 0, updated: 1, list: SHORTFALL });
    await fixture.whenStable();
    expect(received.map((r) => r.importId)).toEqual([44]);
  });

  it('refuses a quantity that is not a whole number, and shows the server\'s refusal', async () => {
    await (await input('shortfall-receive-quantity')).setValue('3.5');
    await submit();
    backend.expectNone('/api/builds/5/shortfall/receive');
    expect(fixture.nativeElement.querySelector('[data-testid="shortfall-receive-error"]').textContent).toContain('Line 1: the quantity received must be a whole number.');

    await (await input('shortfall-receive-quantity')).setValue('4');
    await submit();
    backend
      .expectOne('/api/builds/5/shortfall/receive')
      .flush({ error: { code: 'invalid_input', message: 'lines.0.partNumber: RCV-C-6P8-0402 at main is a stocked inductor; this line buys a capacitor' } }, { status: 400, statusText: 'Bad Request' });
    await fixture.whenStable();
    expect(fixture.nativeElement.querySelector('[data-testid="shortfall-receive-error"]').textContent).toContain('is a stocked inductor');
    expect(received).toEqual([]);
  });
});
