import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { ComponentFixture, TestBed } from '@angular/core/testing';
import { HarnessLoader } from '@angular/cdk/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MatCheckboxHarness } from '@angular/material/checkbox/testing';
import { MatInputHarness } from '@angular/material/input/testing';

import { MAX_MATCHES_PER_BUILD, type BuildResponse } from '../../../shared/api/builds.js';
import { SAVED_MATCH_SUMMARY } from '../matches/match-fixtures.js';
import type { SavedMatchSummary } from '../matches/saved-match.js';
import { RESERVED_BUILD } from './build-fixtures.js';
import { BuildPlanForm } from './build-plan-form.js';

const saved = (id: number, name: string, frequencyHz = 868e6): SavedMatchSummary => ({ ...SAVED_MATCH_SUMMARY, id, name, frequencyHz });
const NEWEST = [saved(8, '13.56 MHz tag coil', 13.56e6), saved(4, '2.45 GHz link', 2.45e9), saved(3, '868 MHz antenna')];

describe('BuildPlanForm', () => {
  let fixture: ComponentFixture<BuildPlanForm>;
  let loader: HarnessLoader;
  let backend: HttpTestingController;
  let planned: BuildResponse[];

  beforeEach(async () => {
    TestBed.configureTestingModule({ providers: [provideHttpClient(), provideHttpClientTesting()] });
    backend = TestBed.inject(HttpTestingController);
    fixture = TestBed.createComponent(BuildPlanForm);
    planned = [];
    fixture.componentInstance.planned.subscribe((b) => planned.push(b));
    loader = TestbedHarnessEnvironment.loader(fixture);
    fixture.detectChanges();
  });
  afterEach(() => backend.verify());

  /** Answers the first, unfiltered list of saved matches. */
  async function answerNewest(items = NEWEST, total = items.length): Promise<void> {
    backend.expectOne({ method: 'GET', url: '/api/matches' }).flush({ items, total });
    await fixture.whenStable();
  }

  const create = () => loader.getHarness(MatButtonHarness.with({ selector: '[data-testid="build-create"]' }));
  const field = (testId: string) => loader.getHarness(MatInputHarness.with({ selector: `[data-testid="${testId}"]` }));
  const options = () => loader.getAllHarnesses(MatCheckboxHarness.with({ selector: '[data-testid="build-match-option"]' }));
  const option = (id: number) => loader.getHarness(MatCheckboxHarness.with({ selector: `[data-testid="build-match-option"][data-id="${id}"]` }));
  const chosenNames = () =>
    Array.from(fixture.nativeElement.querySelectorAll('[data-testid="build-chosen-match"] .chosen-name') as NodeListOf<HTMLElement>).map((e) => e.textContent?.trim());
  const text = () => (fixture.nativeElement as HTMLElement).textContent?.replace(/\s+/g, ' ') ?? '';

  it('sends name, boards and the chosen matches in the order picked, and reserves by default', async () => {
    await answerNewest();
    expect(await (await create()).isDisabled()).toBe(true);
    expect(text()).toContain('None yet: tick the saved matches one board carries.');
    await (await field('build-name')).setValue('NODE-868 rev C');
    await (await field('build-quantity')).setValue('50');
    const listed = await options();
    expect(await Promise.all(listed.map((o) => o.getLabelText()))).toEqual(['13.56 MHz tag coil 13.56 MHz · Dev Okafor', '2.45 GHz link 2.45 GHz · Dev Okafor', '868 MHz antenna 868 MHz · Dev Okafor']);
    await (await option(3)).check();
    await (await option(8)).check();
    expect(chosenNames()).toEqual(['868 MHz antenna', '13.56 MHz tag coil']);
    expect(text()).toContain('a match higher in this list gets its parts first');
    await (await create()).click();

    const request = backend.expectOne({ method: 'POST', url: '/api/builds' });
    expect(request.request.body).toEqual({ name: 'NODE-868 rev C', quantity: 50, matchIds: [3, 8], reserve: true });
    request.flush(RESERVED_BUILD);
    await fixture.whenStable();
    expect(planned.map((b) => b.id)).toEqual([5]);
    expect(await (await field('build-name')).getValue()).toBe('');
    expect(chosenNames()).toEqual([]);
    expect(await (await option(3)).isChecked()).toBe(false);
  });

  it('moves a chosen match up, and takes one off the board', async () => {
    await answerNewest();
    await (await field('build-name')).setValue('x');
    for (const id of [4, 3, 8]) await (await option(id)).check();
    expect(chosenNames()).toEqual(['2.45 GHz link', '868 MHz antenna', '13.56 MHz tag coil']);
    const up = await loader.getAllHarnesses(MatButtonHarness.with({ selector: '[data-testid="build-chosen-up"]' }));
    expect(await up[0].isDisabled()).toBe(true);
    await up[2].click();
    expect(chosenNames()).toEqual(['2.45 GHz link', '13.56 MHz tag coil', '868 MHz antenna']);
    await (await loader.getHarness(MatButtonHarness.with({ selector: '[data-testid="build-chosen-remove"][aria-label="Take 2.45 GHz link off the board"]' }))).click();
    expect(chosenNames()).toEqual(['13.56 MHz tag coil', '868 MHz antenna']);
    expect(await (await option(4)).isChecked()).toBe(false);
    await (await create()).click();
    expect(backend.expectOne('/api/builds').request.body.matchIds).toEqual([8, 3]);
  });

  it('finds older saved matches by name, and keeps a chosen match that the search no longer lists', async () => {
    await answerNewest(NEWEST.slice(0, 2), 60);
    expect(fixture.nativeElement.querySelector('[data-testid="build-match-more"]')?.textContent).toContain('The newest 2 of 60; find the others by name.');
    await (await option(4)).check();
    await (await field('build-match-search')).setValue('antenna');
    const found = await vi.waitFor(() => backend.expectOne((r) => r.method === 'GET' && r.url === '/api/matches' && r.params.get('search') === 'antenna'));
    found.flush({ items: [saved(3, '868 MHz antenna')], total: 1 });
    await fixture.whenStable();
    expect((await options()).length).toBe(1);
    expect(fixture.nativeElement.querySelector('[data-testid="build-match-more"]')).toBeNull();
    await (await option(3)).check();
    expect(chosenNames()).toEqual(['2.45 GHz link', '868 MHz antenna']);

    await (await field('build-match-search')).setValue('no such');
    const none = await vi.waitFor(() => backend.expectOne((r) => r.method === 'GET' && r.params.get('search') === 'no such'));
    none.flush({ items: [], total: 0 });
    await fixture.whenStable();
    expect(fixture.nativeElement.querySelector('[data-testid="build-match-none"]')?.textContent).toContain('No saved match has “no such” in its name.');

    await (await field('build-name')).setValue('x');
    await (await create()).click();
    expect(backend.expectOne('/api/builds').request.body.matchIds).toEqual([4, 3]);
  });

  it('lets a board carry at most the server\'s 50 matches', async () => {
    const many = Array.from({ length: MAX_MATCHES_PER_BUILD + 1 }, (_, i) => saved(100 + i, `Match ${i + 1}`));
    await answerNewest(many);
    const boxes = await options();
    for (const box of boxes.slice(0, MAX_MATCHES_PER_BUILD)) await box.check();
    expect(chosenNames()).toHaveLength(MAX_MATCHES_PER_BUILD);
    expect(await boxes[MAX_MATCHES_PER_BUILD].isDisabled()).toBe(true);
    expect(fixture.nativeElement.querySelector('[data-testid="build-board-full"]')?.textContent).toContain('at most 50 saved matches');
    await boxes[0].uncheck();
    expect(await boxes[MAX_MATCHES_PER_BUILD].isDisabled()).toBe(false);
    expect(fixture.nativeElement.querySelector('[data-testid="build-board-full"]')).toBeNull();
  });

  it('says so when there are no saved matches, or they cannot be loaded', async () => {
    await answerNewest([]);
    expect(text()).toContain('No saved matches yet: solve a match and save its fit first.');
    await (await field('build-match-search')).setValue('x');
    const failed = await vi.waitFor(() => backend.expectOne((r) => r.params.get('search') === 'x'));
    failed.flush({ error: { code: 'internal', message: 'The database is not answering.' } }, { status: 503, statusText: 'Service Unavailable' });
    await fixture.whenStable();
    expect(fixture.nativeElement.querySelector('[role="alert"]')?.textContent).toContain('The database is not answering.');
  });

  it('will not send a board quantity that is not a whole number from 1', async () => {
    await answerNewest();
    await (await field('build-name')).setValue('x');
    await (await options())[0].check();
    for (const bad of ['0', '2.5', 'ten', '']) {
      await (await field('build-quantity')).setValue(bad);
      expect(await (await create()).isDisabled()).toBe(true);
    }
    expect(text()).toContain('Boards must be a whole number from 1');
  });

  it("shows the server's words when planning fails", async () => {
    await answerNewest();
    await (await field('build-name')).setValue('x');
    await (await option(4)).check();
    const reserve = await loader.getHarness(MatCheckboxHarness.with({ selector: '[data-testid="build-reserve-now"]' }));
    await reserve.uncheck();
    await (await create()).click();
    const request = backend.expectOne('/api/builds');
    expect(request.request.body.reserve).toBe(false);
    request.flush({ error: { code: 'not_found', message: 'Saved match 4 was not found.' } }, { status: 404, statusText: 'Not Found' });
    await fixture.whenStable();
    expect(fixture.nativeElement.querySelector('[role="alert"]').textContent).toContain('Saved match 4 was not found.');
    expect(planned).toEqual([]);
    expect(chosenNames()).toEqual(['2.45 GHz link']);
  });
});
