import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { ComponentFixture, TestBed } from '@angular/core/testing';
import { HarnessLoader } from '@angular/cdk/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { MatTabGroupHarness } from '@angular/material/tabs/testing';

import type { Role } from '../../../shared/api/auth.js';
import { demoUser, storeSession } from '../testing/signed-in-user.js';
import { StockPage } from './stock-page.js';

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
});
