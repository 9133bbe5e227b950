import { provideHttpClient, withInterceptors } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { ComponentFixture, TestBed } from '@angular/core/testing';
import { HarnessLoader } from '@angular/cdk/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MatInputHarness } from '@angular/material/input/testing';
import { provideRouter } from '@angular/router';

import type { Role } from '../../../shared/api/auth.js';
import { authInterceptor } from '../auth/auth-interceptor.js';
import { BlankPage } from '../testing/blank-page.js';
import { demoUser, storeSession } from '../testing/signed-in-user.js';
import { LOW_PASS_BEST, SAVED_MATCH_SUMMARY, SOLVED, STOCKED_PARTS } from './match-fixtures.js';
import { MatchesPage } from './matches-page.js';
import type { SavedMatch, SavedMatchSummary } from './saved-match.js';

const SAVED_LIST: SavedMatchSummary[] = [SAVED_MATCH_SUMMARY];

describe('MatchesPage', () => {
  let fixture: ComponentFixture<MatchesPage>;
  let loader: HarnessLoader;
  let backend: HttpTestingController;
  let page: HTMLElement;

  async function open(role: Role = 'designer', saved: SavedMatchSummary[] = [], userId = 7, total = saved.length): Promise<void> {
    localStorage.clear();
    storeSession(demoUser(role, userId));
    TestBed.configureTestingModule({
      providers: [
        provideRouter([{ path: 'sign-in', component: BlankPage }]),
        provideHttpClient(withInterceptors([authInterceptor])),
        provideHttpClientTesting(),
      ],
    });
    backend = TestBed.inject(HttpTestingController);
    fixture = TestBed.createComponent(MatchesPage);
    loader = TestbedHarnessEnvironment.loader(fixture);
    page = fixture.nativeElement;
    fixture.detectChanges();
    backend.expectOne({ method: 'GET', url: '/api/matches' }).flush({ items: saved, total });
    await fixture.whenStable();
  }

  const field = (id: string) => loader.getHarness(MatInputHarness.with({ selector: `[data-testid="${id}"]` }));
  const button = (id: string) => loader.getHarness(MatButtonHarness.with({ selector: `[data-testid="${id}"]` }));
  const all = (id: string) => Array.from(page.querySelectorAll<HTMLElement>(`[data-testid="${id}"]`));

  /** Answers every stock lookup of a fit's parts from the invented stock list. */
  function answerPartLookups(): number {
    const lookups = backend.match((request) => request.url === '/api/parts');
    for (const lookup of lookups) {
      const wanted = lookup.request.params.get('search');
      lookup.flush({ items: STOCKED_PARTS.filter((part) => part.partNumber === wanted), total: 1 });
    }
    return lookups.length;
  }

  async function solveDemoMatch(): Promise<void> {
    await (await field('match-load')).setValue('12-j35');
    await (await field('match-frequency')).setValue('868MHz');
    await (await button('match-solve')).click();
    const request = backend.expectOne({ method: 'POST', url: '/api/matches/solve' });
    expect(request.request.body).toEqual({
      source: '50',
      load: '12-j35',
      frequencyHz: '868MHz',
      buildQuantity: 1,
      combinations: false,
      objective: 'worst-case',
    });
    request.flush(SOLVED);
    await fixture.whenStable();
    expect(answerPartLookups()).toBe(2);
    await fixture.whenStable();
  }

  // jsdom has no 2D canvas (it logs "not implemented"); the plot then keeps only its text summary.
  beforeEach(() => vi.spyOn(HTMLCanvasElement.prototype, 'getContext').mockReturnValue(null));
  afterEach(() => {
    backend.verify();
    vi.restoreAllMocks();
  });

  it('stops a solve on its way: the request is cancelled and the form can solve again', async () => {
    await open();
    expect(all('match-stop')).toHaveLength(0);
    await (await field('match-load')).setValue('12-j35');
    await (await field('match-frequency')).setValue('868MHz');
    await (await button('match-solve')).click();
    const request = backend.expectOne({ method: 'POST', url: '/api/matches/solve' });
    expect(await (await button('match-solve')).isDisabled()).toBe(true);
    await (await button('match-stop')).click();
    expect(request.cancelled).toBe(true);
    expect(all('match-stop')).toHaveLength(0);
    expect(await (await button('match-solve')).isDisabled()).toBe(false);
    expect(all('network-card')).toHaveLength(0);
    expect(document.body.textContent).toContain('Solve stopped');
    // And solving again asks again.
    await (await button('match-solve')).click();
    backend.expectOne({ method: 'POST', url: '/api/matches/solve' }).flush(SOLVED);
    await fixture.whenStable();
    answerPartLookups();
    await fixture.whenStable();
    expect(all('network-card').length).toBeGreaterThan(0);
  });

  it('renders one card per ideal network, with its traits and fits', async () => {
    await open();
    await solveDemoMatch();

    const cards = all('network-card');
    expect(cards.map((card) => [card.dataset['placement'], card.dataset['solution']])).toEqual([
      ['shunt-at-source', '1'],
      ['shunt-at-load', '2'],
    ]);
    const [lowPass, highPass] = cards;
    expect(lowPass.querySelector('[data-testid="network-response"]')?.textContent).toContain('low-pass');
    expect(lowPass.querySelector('[data-testid="network-dc"]')?.textContent).toContain('Passes DC');
    expect(lowPass.querySelector('[data-testid="network-node-q"]')?.textContent).toContain('1.78');
    expect(highPass.querySelector('[data-testid="network-dc"]')?.textContent).toContain('Blocks DC');
    expect(highPass.querySelector('[data-testid="network-shunt-ground"]')).not.toBeNull();

    // The schematic draws a shunt capacitor then a series inductor, source to load.
    const symbols = Array.from(lowPass.querySelectorAll<SVGElement>('svg g.element')).map((g) => `${g.dataset['position']} ${g.dataset['kind']}`);
    expect(symbols).toEqual(['shunt capacitor', 'series inductor']);
    expect(lowPass.querySelector('svg[role="img"]')?.getAttribute('aria-label')).toContain('shunt element across the source');

    const rows = Array.from(lowPass.querySelectorAll<HTMLElement>('[data-testid="fit-row"]'));
    expect(rows.length).toBe(2);
    expect(rows[0].textContent).toContain('TW-C0402-6P8');
    expect(rows[0].textContent).toContain('6.8 pF nominal, 6.91 pF at f0');
    expect(rows[0].textContent).toContain('f0/SRF 0.18');
    expect(rows[0].textContent).toContain('0.61 dB');
    expect(rows[0].textContent).toContain('TPG 0.944');
    expect(rows[0].querySelector('[data-testid="fit-yield"]')?.textContent?.trim()).toBe('97.4 % within 0.5 dB');
    expect(rows[1].querySelector('[data-testid="fit-yield"]')?.textContent?.trim()).toBe('—');
    expect(rows[1].textContent).toContain('×2');
    expect(rows[1].textContent).toContain('two in parallel');
    const chips = Array.from(rows[1].querySelectorAll<HTMLElement>('mat-chip')).map((chip) => chip.textContent?.trim());
    expect(chips).toContain('Above limit');
    expect(chips).toContain('Short stock');
    expect(rows[0].querySelector('[data-flag="limit-unknown"]')?.textContent?.trim()).toBe('Limit unknown');

    // No stock for the other network: a plain message in its card, not an error.
    expect(highPass.querySelector('[data-testid="no-fits"]')?.textContent).toContain('No stocked fit');
    expect(all('fit-row').length).toBe(2);
    expect(page.querySelector('[role="alert"]')).toBeNull();

    expect(all('infeasible-placement')[0].textContent).toContain('not possible');
  });

  it('shows the cautions from the answer near the results', async () => {
    await open();
    await solveDemoMatch();
    const cautions = all('match-cautions')[0];
    expect(cautions.querySelectorAll('li').length).toBe(2);
    expect(cautions.textContent).toContain('vector network analyser');
    expect(cautions.textContent).toContain('radio regulations');
  });

  it('says in words what each flag on the fits means, once per flag, most serious first', async () => {
    await open();
    await solveDemoMatch();
    const legend = all('flag-legend')[0];
    const entries = Array.from(legend.querySelectorAll<HTMLElement>('[data-flag]'));
    // The fixture's fits carry limit-unknown, above-limit and short-stock (fit-flags.ts orders them).
    expect(entries.map((e) => e.dataset['flag'])).toEqual(['short-stock', 'above-limit', 'limit-unknown']);
    expect(entries[0].querySelector('dt')?.textContent?.trim()).toBe('Short stock');
    expect(entries[0].querySelector('dd')?.textContent).toContain('Stores do not have enough of a part for the build quantity.');
    expect(entries[2].querySelector('dd')?.textContent).toContain('gives no SRF');
  });

  it('chooses the best fit of the first network, and draws the plot and the Smith chart for it', async () => {
    await open();
    await solveDemoMatch();
    const chooses = all('fit-choose');
    expect(chooses[0].getAttribute('aria-pressed')).toBe('true');
    expect(chooses[1].getAttribute('aria-pressed')).toBe('false');

    const plot = all('tpg-plot')[0];
    expect(plot.querySelector('canvas')?.getAttribute('aria-label')).toMatch(/ideal network reaches -?0\.00 dB and the chosen fit -?\d+\.\d\d dB/);
    const smith = all('smith-chart')[0];
    expect(smith.querySelector('svg[role="img"]')?.getAttribute('aria-label')).toContain('normalised to 50 Ω');
    expect(smith.querySelectorAll('[data-testid="smith-ideal-arc"]').length).toBe(2);
    expect(smith.querySelectorAll('[data-testid="smith-fit-arc"]').length).toBe(2);

    // Choosing the second fit moves the choice and sweeps that fit's parts.
    await (await loader.getAllHarnesses(MatButtonHarness.with({ selector: '[data-testid="fit-choose"]' })))[1].click();
    expect(answerPartLookups()).toBe(2);
    await fixture.whenStable();
    expect(all('fit-choose').map((b) => b.getAttribute('aria-pressed'))).toEqual(['false', 'true']);
  });

  it('saves the chosen fit with its name and request, then lists it', async () => {
    await open();
    await solveDemoMatch();
    await (await field('match-name')).setValue('Soil node 868 MHz chip antenna');
    await (await button('match-save')).click();

    const save = backend.expectOne({ method: 'POST', url: '/api/matches' });
    expect(save.request.body).toEqual({
      name: 'Soil node 868 MHz chip antenna',
      request: {
        source: '50',
        load: '12-j35',
        frequencyHz: '868MHz',
        buildQuantity: 1,
        combinations: false,
        objective: 'worst-case',
      },
      chosen: { placement: 'shunt-at-source', solution: 1, rank: 1 },
    });
    save.flush({ ...SAVED_LIST[0] }, { status: 201, statusText: 'Created' });
    const list = await vi.waitFor(() => backend.expectOne({ method: 'GET', url: '/api/matches' }));
    list.flush({ items: SAVED_LIST, total: 1 });
    await fixture.whenStable();
    const rows = all('saved-match-row');
    expect(rows.length).toBe(1);
    expect(rows[0].textContent).toContain('Soil node 868 MHz chip antenna');
    expect(rows[0].textContent).toContain('868 MHz');
    expect(rows[0].textContent).toContain('worst case 0.61 dB');
    expect(rows[0].textContent).toContain('TW-C0402-6P8 x1, TW-L0402-10N x1');
  });

  it('shows a 400 answer next to the field it names', async () => {
    await open();
    await (await field('match-load')).setValue('12-j35');
    await (await field('match-frequency')).setValue('868MHz');
    await (await field('match-location')).setValue('Shelf Z');
    await (await button('match-solve')).click();
    backend.expectOne('/api/matches/solve').flush(
      {
        error: {
          code: 'invalid_input',
          message: 'location: "Shelf Z" holds no parts',
          details: [{ field: 'location', value: 'Shelf Z', message: 'location: "Shelf Z" holds no parts' }],
        },
      },
      { status: 400, statusText: 'Bad Request' },
    );
    await fixture.whenStable();
    await vi.waitFor(() =>
      expect(page.querySelector('[data-testid="match-location-problem"]')?.textContent?.trim()).toBe('"Shelf Z" holds no parts'),
    );
    expect(page.querySelector('[data-testid="match-error"]')?.textContent).toContain('see the fields marked');
    expect(all('network-card').length).toBe(0);
  });

  /** The saved match 11 (SAVED_LIST[0], saved by user 7) as the server sends it. */
  function savedDetail(): SavedMatch {
    const network = SOLVED.networks[0];
    return {
      ...SAVED_LIST[0],
      request: { source: '50', load: '12-j35', frequencyHz: '868MHz' },
      network: { ...network, fits: [] },
      fit: { ...LOW_PASS_BEST, elements: LOW_PASS_BEST.elements.map((e) => ({ ...e, parts: e.parts.map((p) => ({ ...p, partId: 1, location: 'Shelf A', available: 4000, unitCost: '0.0120' })) })), yield: 0.974, yieldBudgetDb: 0.5, yieldSamples: 2000, objectiveDb: 0.61, stockCover: 4000, costPerBuild: '0.0240' },
      settings: { usableSrfFraction: 0.5, excludeAboveLimit: false, lossBudgetDb: 0.5 },
      parts: [],
      sweep: { frequenciesHz: [800e6, 868e6, 900e6], idealTpg: [0.9, 1, 0.95], fitTpg: [0.85, 0.944, 0.9] },
      smith: {
        ideal: { referenceOhm: 50, load: { re: 12, im: -35 }, target: { re: 50, im: 0 }, nodes: [], steps: [] },
        fit: { referenceOhm: 50, load: { re: 12, im: -35 }, target: { re: 50, im: 0 }, nodes: [], steps: [] },
        measured: [],
      },
      stockChanges: [{ partId: 2, partNumber: 'TW-L0402-10N', change: 'short' }],
    };
  }

  /** Opens the page as `role` (user `userId`) with saved match 11 reopened. */
  async function reopen(role: Role, userId = 7): Promise<void> {
    await open(role, SAVED_LIST, userId);
    fixture.componentRef.setInput('saved', '11');
    await fixture.whenStable();
    backend.expectOne({ method: 'GET', url: '/api/matches/11' }).flush(savedDetail());
    await fixture.whenStable();
  }

  it('reopens a saved match as saved, with its sweep, and notes what changed in stock', async () => {
    await reopen('purchasing');

    expect(page.querySelector('[data-testid="reopened-match"]')?.textContent).toContain('Soil node 868 MHz chip antenna');
    expect(page.querySelector('[data-testid="reopened-match"]')?.textContent).toContain('by Dev Okafor');
    // One card, the saved network with the saved fit, chosen.
    const cards = all('network-card');
    expect(cards.map((card) => card.dataset['placement'])).toEqual(['shunt-at-source']);
    expect(all('fit-row').length).toBe(1);
    expect(all('fit-choose')[0].getAttribute('aria-pressed')).toBe('true');
    expect(all('match-note')[0].textContent).toContain('TW-L0402-10N no longer has enough available');
    // Cautions are there although the saved answer carries none.
    expect(all('match-cautions')[0].textContent).toContain('vector network analyser');
    // The saved sweep draws the fit, so no stock lookup is needed; nothing is solved again.
    backend.expectNone('/api/matches/solve');
    backend.expectNone((request) => request.url === '/api/parts');
    expect(all('tpg-plot')[0].querySelector('canvas')?.getAttribute('aria-label')).toContain('ideal network reaches 0.00 dB and the chosen fit -0.25 dB');
    expect(await (await field('match-load')).getValue()).toBe('12-j35');
    // Purchasing may read saved matches but not save them.
    expect(all('match-save').length).toBe(0);
    expect(page.querySelector('[data-testid="match-save-role"]')).not.toBeNull();
  });

  it('lets the designer who saved a match delete it, once confirmed, and lists the rest', async () => {
    await reopen('designer');
    await (await button('match-delete')).click();
    expect(page.querySelector('[data-testid="match-delete-area"]')?.textContent).toContain('Builds that carry it keep their own copy');
    // Nothing is sent until the second press.
    backend.expectNone({ method: 'DELETE' });
    await (await button('match-delete-confirm')).click();
    const deletion = backend.expectOne({ method: 'DELETE', url: '/api/matches/11' });
    deletion.flush(null, { status: 204, statusText: 'No Content' });
    await fixture.whenStable();
    const list = await vi.waitFor(() => backend.expectOne({ method: 'GET', url: '/api/matches' }));
    list.flush({ items: SAVED_LIST.slice(1), total: SAVED_LIST.length - 1 });
    await fixture.whenStable();
    expect(all('saved-match-row').map((row) => row.dataset['id'])).toEqual(SAVED_LIST.slice(1).map((m) => String(m.id)));
  });

  it('keeps the match when "Keep it" is pressed, and shows why a delete failed next to the button', async () => {
    await reopen('admin', 9);
    await (await button('match-delete')).click();
    await (await button('match-delete-keep')).click();
    expect(all('match-delete-confirm').length).toBe(0);
    backend.expectNone({ method: 'DELETE' });
    await (await button('match-delete')).click();
    await (await button('match-delete-confirm')).click();
    backend
      .expectOne({ method: 'DELETE', url: '/api/matches/11' })
      .flush({ error: { code: 'not_found', message: 'Saved match 11 was not found.' } }, { status: 404, statusText: 'Not Found' });
    await fixture.whenStable();
    // Someone deleted it meanwhile: the server's reason, next to the button.
    await vi.waitFor(() => {
      fixture.detectChanges();
      expect(page.querySelector('[data-testid="match-delete-error"]')?.textContent).toContain('Saved match 11 was not found.');
    });
  });

  it('offers no delete to another designer, nor to purchasing', async () => {
    await reopen('designer', 8);
    expect(all('match-delete').length).toBe(0);
    TestBed.resetTestingModule();
    await reopen('purchasing');
    expect(all('match-delete').length).toBe(0);
  });

  it('finds saved matches by name after a pause in typing, and says when the list shows only the newest', async () => {
    await open('designer', SAVED_LIST, 7, 75);
    expect(page.querySelector('[data-testid="saved-more"]')?.textContent).toContain(`The newest ${SAVED_LIST.length} of 75`);
    await (await field('saved-search')).setValue('soil');
    const found = await vi.waitFor(() => backend.expectOne((r) => r.method === 'GET' && r.url === '/api/matches' && r.params.get('search') === 'soil'));
    found.flush({ items: SAVED_LIST.slice(0, 1), total: 1 });
    await fixture.whenStable();
    expect(all('saved-match-row').length).toBe(1);
    expect(page.querySelector('[data-testid="saved-more"]')).toBeNull();
    await (await field('saved-search')).setValue('no such');
    const none = await vi.waitFor(() => backend.expectOne((r) => r.method === 'GET' && r.params.get('search') === 'no such'));
    none.flush({ items: [], total: 0 });
    await vi.waitFor(() => {
      fixture.detectChanges();
      expect(page.querySelector('[data-testid="saved-search-none"]')?.textContent).toContain('No saved match has “no such” in its name.');
    });
  });
});
