import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { ComponentFixture, TestBed } from '@angular/core/testing';
import { provideRouter } from '@angular/router';
import { HarnessLoader } from '@angular/cdk/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MatTableHarness } from '@angular/material/table/testing';

import type { Role } from '../../../shared/api/auth.js';
import type { BuildResponse } from '../../../shared/api/builds.js';
import { demoUser, storeSession } from '../testing/signed-in-user.js';
import { RESERVED_BUILD } from './build-fixtures.js';
import { BuildDetail } from './build-detail.js';

describe('BuildDetail', () => {
  let fixture: ComponentFixture<BuildDetail>;
  let loader: HarnessLoader;
  let backend: HttpTestingController;
  let changed: BuildResponse[];

  async function openAs(role: Role, build: BuildResponse = RESERVED_BUILD): Promise<void> {
    localStorage.clear();
    storeSession(demoUser(role));
    TestBed.configureTestingModule({ providers: [provideHttpClient(), provideHttpClientTesting(), provideRouter([])] });
    backend = TestBed.inject(HttpTestingController);
    fixture = TestBed.createComponent(BuildDetail);
    fixture.componentRef.setInput('build', build);
    changed = [];
    fixture.componentInstance.changed.subscribe((b) => changed.push(b));
    loader = TestbedHarnessEnvironment.loader(fixture);
    fixture.detectChanges();
    await fixture.whenStable();
  }
  const buttons = async () => Promise.all((await loader.getAllHarnesses(MatButtonHarness)).map((b) => b.getText()));
  afterEach(() => localStorage.clear());

  it('shows each element with what it needs and holds, the move, and the buy-to spec', async () => {
    await openAs('designer');
    const lines = await loader.getHarness(MatTableHarness.with({ selector: '[data-testid="build-lines"]' }));
    const rows = await Promise.all((await lines.getRows()).map((r) => r.getCellTextByColumnName()));
    expect(rows.map((r) => [r['match'], r['position'], r['needed'], r['reserved']])).toEqual([
      ['868 MHz antenna', 'shunt capacitor', '50', '10'],
      ['868 MHz antenna', 'series inductor', '50', '50'],
    ]);
    expect(rows[1]['partNumber']).toContain('instead of TW-L0402-11N');
    expect(fixture.nativeElement.querySelector('[data-testid="build-move"]').textContent).toContain('moved 868 MHz antenna series TW-L0402-11N to TW-L0402-10N');
    const shortfall = await loader.getHarness(MatTableHarness.with({ selector: '[data-testid="build-shortfall"]' }));
    const [line] = await Promise.all((await shortfall.getRows()).map((r) => r.getCellTextByColumnName()));
    expect(line['spec']).toContain('6.8 pF E24 ±0.25 pF (C), SRF ≥ 1.74 GHz');
    expect(line['quantity']).toBe('42');
    expect(line['reason']).toBe('Not enough stock');
  });

  it('lets a designer cancel but not mark built, and stores mark built but not cancel', async () => {
    await openAs('designer');
    expect((await buttons()).some((text) => text.includes('Cancel build'))).toBe(true);
    expect((await buttons()).some((text) => text.includes('Mark built'))).toBe(false);
    TestBed.resetTestingModule();
    await openAs('stores');
    expect((await buttons()).some((text) => text.includes('Mark built'))).toBe(true);
    expect((await buttons()).some((text) => text.includes('Cancel build'))).toBe(false);
    expect((await buttons()).some((text) => text.includes('Reserve stock'))).toBe(false);
  });

  it('marks the build built through the API and hands on the answer', async () => {
    await openAs('stores');
    await (await loader.getHarness(MatButtonHarness.with({ selector: '[data-testid="build-mark-built"]' }))).click();
    const request = backend.expectOne({ method: 'PATCH', url: '/api/builds/5' });
    expect(request.request.body).toEqual({ status: 'built' });
    request.flush({ ...RESERVED_BUILD, status: 'built' });
    await fixture.whenStable();
    expect(changed.map((b) => b.status)).toEqual(['built']);
  });

  it('offers to reserve a planned build and says nothing is short yet', async () => {
    await openAs('admin', { ...RESERVED_BUILD, status: 'planned', lines: [], shortfall: { lines: [] }, moves: [], shortfallStatus: null });
    await (await loader.getHarness(MatButtonHarness.with({ selector: '[data-testid="build-reserve"]' }))).click();
    const request = backend.expectOne({ method: 'POST', url: '/api/builds/5/reserve' });
    request.flush({ error: { code: 'conflict', message: 'Build 5 is reserved; only a planned build can be reserved.' } }, { status: 409, statusText: 'Conflict' });
    await fixture.whenStable();
    expect(fixture.nativeElement.querySelector('[data-testid="build-error"]').textContent).toContain('only a planned build can be reserved');
    expect(fixture.nativeElement.querySelector('[data-testid="build-shortfall-none"]').textContent).toContain('Reserve the build');
  });
});
