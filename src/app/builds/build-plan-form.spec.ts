import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { ComponentFixture, TestBed } from '@angular/core/testing';
import { HarnessLoader } from '@angular/cdk/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MatCheckboxHarness } from '@angular/material/checkbox/testing';
import { MatInputHarness } from '@angular/material/input/testing';

import type { BuildResponse } from '../../../shared/api/builds.js';
import { RESERVED_BUILD } from './build-fixtures.js';
import { BuildPlanForm } from './build-plan-form.js';

describe('BuildPlanForm', () => {
  let fixture: ComponentFixture<BuildPlanForm>;
  let loader: HarnessLoader;
  let backend: HttpTestingController;
  let planned: BuildResponse[];

  beforeEach(async () => {
    TestBed.configureTestingModule({ providers: [provideHttpClient(), provideHttpClientTesting()] });
    backend = TestBed.inject(HttpTestingController);
    fixture = TestBed.createComponent(BuildPlanForm);
    fixture.componentRef.setInput('matches', [
      { id: 3, name: '868 MHz antenna' },
      { id: 4, name: '2.45 GHz link' },
      { id: 8, name: '13.56 MHz tag coil' },
    ]);
    planned = [];
    fixture.componentInstance.planned.subscribe((b) => planned.push(b));
    loader = TestbedHarnessEnvironment.loader(fixture);
    fixture.detectChanges();
    await fixture.whenStable();
  });
  afterEach(() => backend.verify());

  const create = () => loader.getHarness(MatButtonHarness.with({ selector: '[data-testid="build-create"]' }));
  const field = (testId: string) => loader.getHarness(MatInputHarness.with({ selector: `[data-testid="${testId}"]` }));

  it('sends name, boards and the chosen matches in list order, and reserves by default', async () => {
    expect(await (await create()).isDisabled()).toBe(true);
    await (await field('build-name')).setValue('NODE-868 rev C');
    await (await field('build-quantity')).setValue('50');
    const options = await loader.getAllHarnesses(MatCheckboxHarness.with({ selector: '[data-testid="build-match-option"]' }));
    expect(await Promise.all(options.map((o) => o.getLabelText()))).toEqual(['868 MHz antenna', '2.45 GHz link', '13.56 MHz tag coil']);
    await options[2].check();
    await options[0].check();
    await (await create()).click();

    const request = backend.expectOne({ method: 'POST', url: '/api/builds' });
    expect(request.request.body).toEqual({ name: 'NODE-868 rev C', quantity: 50, matchIds: [3, 8], reserve: true });
    request.flush(RESERVED_BUILD);
    await fixture.whenStable();
    expect(planned.map((b) => b.id)).toEqual([5]);
    expect(await (await field('build-name')).getValue()).toBe('');
  });

  it('will not send a board quantity that is not a whole number from 1', async () => {
    await (await field('build-name')).setValue('x');
    (await loader.getAllHarnesses(MatCheckboxHarness))[0].check();
    for (const bad of ['0', '2.5', 'ten', '']) {
      await (await field('build-quantity')).setValue(bad);
      expect(await (await create()).isDisabled()).toBe(true);
    }
    expect(fixture.nativeElement.textContent).toContain('Boards must be a whole number from 1');
  });

  it('shows the server\'s words when planning fails', async () => {
    await (await field('build-name')).setValue('x');
    await (await loader.getAllHarnesses(MatCheckboxHarness.with({ selector: '[data-testid="build-match-option"]' })))[1].check();
    const reserve = await loader.getHarness(MatCheckboxHarness.with({ selector: '[data-testid="build-reserve-now"]' }));
    await reserve.uncheck();
    await (await create()).click();
    const request = backend.expectOne('/api/builds');
    expect(request.request.body.reserve).toBe(false);
    request.flush({ error: { code: 'not_found', message: 'Saved match 4 was not found.' } }, { status: 404, statusText: 'Not Found' });
    await fixture.whenStable();
    expect(fixture.nativeElement.querySelector('[role="alert"]').textContent).toContain('Saved match 4 was not found.');
    expect(planned).toEqual([]);
  });
});
