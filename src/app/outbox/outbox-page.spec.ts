import { provideHttpClient, withInterceptors } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { ComponentFixture, TestBed } from '@angular/core/testing';
import { HarnessLoader } from '@angular/cdk/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MatButtonToggleHarness } from '@angular/material/button-toggle/testing';
import { MatPaginatorHarness } from '@angular/material/paginator/testing';
import { MatTableHarness } from '@angular/material/table/testing';
import { provideRouter } from '@angular/router';

import type { OutboxEntry, OutboxMessage } from '../../../shared/api/outbox.js';
import { authInterceptor } from '../auth/auth-interceptor.js';
import { BlankPage } from '../testing/blank-page.js';
import { demoUser, storeSession } from '../testing/signed-in-user.js';
import { OutboxPage, byteSize } from './outbox-page.js';

// Invented mail of the demo company (product.md: Tarnwick Field Sensors).
const SHORTFALL: OutboxEntry = {
  id: 12,
  purpose: 'shortfall-list',
  from: 'Shelfmatch <shelfmatch@tarnwick.example>',
  to: ['orders@parts-supplier.example'],
  subject: 'Shortfall list: NODE-868 × 50',
  status: 'sent',
  error: null,
  attachments: [{ filename: 'shortfall-node-868.csv', contentType: 'text/csv', sizeBytes: 4310 }],
  messageId: '<a1b2@tarnwick.example>',
  actorId: 4,
  createdAt: '2026-12-01T09:30:05.000Z',
  sentAt: '2026-12-01T09:30:06.000Z',
};
const FAILED: OutboxEntry = {
  id: 13,
  purpose: 'invitation',
  from: 'Shelfmatch <shelfmatch@tarnwick.example>',
  to: ['new.hire@tarnwick.example'],
  subject: 'You are invited to Shelfmatch',
  status: 'failed',
  error: 'The mail server at 127.0.0.1:2525 cannot be reached right now (connect ECONNREFUSED 127.0.0.1:2525).',
  attachments: [],
  messageId: null,
  actorId: 1,
  createdAt: '2026-12-01T10:02:00.000Z',
  sentAt: null,
};

describe('OutboxPage', () => {
  let fixture: ComponentFixture<OutboxPage>;
  let loader: HarnessLoader;
  let backend: HttpTestingController;

  async function open(items: OutboxEntry[], total = items.length): Promise<void> {
    localStorage.clear();
    storeSession(demoUser('admin', 1));
    TestBed.configureTestingModule({
      providers: [
        provideRouter([{ path: 'sign-in', component: BlankPage }]),
        provideHttpClient(withInterceptors([authInterceptor])),
        provideHttpClientTesting(),
      ],
    });
    backend = TestBed.inject(HttpTestingController);
    fixture = TestBed.createComponent(OutboxPage);
    loader = TestbedHarnessEnvironment.loader(fixture);
    answerList({ page: '1', pageSize: '25' }, items, total);
    await settle();
  }

  function answerList(params: Record<string, string>, items: OutboxEntry[], total = items.length): void {
    const request = backend.expectOne((r) => r.url === '/api/outbox');
    const sent = Object.fromEntries(request.request.params.keys().map((key) => [key, request.request.params.get(key)]));
    expect(sent).toEqual(params);
    request.flush({ items, total });
  }

  async function entryRows(): Promise<Record<string, string>[]> {
    const rows = await (await loader.getHarness(MatTableHarness)).getRows();
    const cells = await Promise.all(rows.map((row) => row.getCellTextByColumnName()));
    return cells.filter((row) => 'subject' in row);
  }

  const element = (testId: string): HTMLElement | null => fixture.nativeElement.querySelector(`[data-testid="${testId}"]`);

  /** Lets the answered request's promise callbacks run, then waits for the rendering they scheduled. */
  async function settle(): Promise<void> {
    await new Promise((resolve) => setTimeout(resolve));
    await fixture.whenStable();
  }

  afterEach(() => backend.verify());

  it('lists sent and failed mail with status, recipients, subject, kind and time', async () => {
    await open([FAILED, SHORTFALL]);
    const rows = await entryRows();
    expect(rows.map((row) => [row['status'], row['to'], row['subject'], row['purpose']])).toEqual([
      ['error Failed', 'new.hire@tarnwick.example', 'You are invited to Shelfmatch', 'Invitation'],
      ['check_circle Sent', 'orders@parts-supplier.example', 'Shortfall list: NODE-868 × 50 attach_file', 'Shortfall list'],
    ]);
    expect(rows[1]['time']).toMatch(/^2026-12-01 \d\d:\d\d:05$/);
    expect(element('outbox-table')).not.toBeNull();
  });

  it('opens an entry to show its bodies and attachments, fetched once', async () => {
    await open([SHORTFALL]);
    await (await loader.getHarness(MatButtonHarness.with({ selector: '[data-testid="outbox-open-12"]' }))).click();
    const message: OutboxMessage = { ...SHORTFALL, text: 'Please quote the attached lines.\nThank you.', html: '<p>Please quote the <b>attached</b> lines.</p><script>alert(1)</script>' };
    backend.expectOne('/api/outbox/12').flush(message);
    await settle();

    expect(element('outbox-text')?.textContent).toBe('Please quote the attached lines.\nThank you.');
    const html = element('outbox-html');
    expect(html?.querySelector('b')?.textContent).toBe('attached');
    expect(html?.querySelector('script')).toBeNull();
    expect(element('outbox-attachments')?.textContent).toContain('shortfall-node-868.csv');
    expect(element('outbox-attachments')?.textContent).toContain('text/csv, 4.3 kB');

    const toggle = await loader.getHarness(MatButtonHarness.with({ selector: '[data-testid="outbox-open-12"]' }));
    await toggle.click();
    expect(element('outbox-detail-12')).toBeNull();
    await toggle.click();
    expect(element('outbox-detail-12')).not.toBeNull();
    // The second opening needs no second request (backend.verify() checks nothing is pending).
  });

  it('shows why a send failed', async () => {
    await open([FAILED]);
    await (await loader.getHarness(MatButtonHarness.with({ selector: '[data-testid="outbox-open-13"]' }))).click();
    backend.expectOne('/api/outbox/13').flush({ ...FAILED, text: 'Hello', html: null });
    await settle();
    expect(element('outbox-error')?.textContent).toContain('cannot be reached');
    expect(element('outbox-html')).toBeNull();
  });

  it('filters by status and turns pages through the API', async () => {
    const many = Array.from({ length: 25 }, (_, n) => ({ ...SHORTFALL, id: 100 - n }));
    await open(many, 30);
    await (await loader.getHarness(MatButtonToggleHarness.with({ text: 'Failed' }))).check();
    answerList({ page: '1', pageSize: '25', status: 'failed' }, [FAILED]);
    await settle();
    expect((await entryRows()).map((row) => row['subject'])).toEqual(['You are invited to Shelfmatch']);

    await (await loader.getHarness(MatButtonToggleHarness.with({ text: 'All' }))).check();
    answerList({ page: '1', pageSize: '25' }, many, 30);
    await settle();
    await (await loader.getHarness(MatPaginatorHarness)).goToNextPage();
    answerList({ page: '2', pageSize: '25' }, [SHORTFALL], 30);
    await settle();
    expect((await entryRows()).length).toBe(1);
  });

  it('says so when nothing has been sent, and when the Outbox cannot be loaded', async () => {
    await open([]);
    expect(fixture.nativeElement.textContent).toContain('Nothing has been sent yet.');
    await (await loader.getHarness(MatButtonHarness.with({ selector: '[data-testid="outbox-refresh"]' }))).click();
    backend
      .expectOne((r) => r.url === '/api/outbox')
      .flush({ error: { code: 'internal_error', message: 'Something went wrong on the server; it has been logged.' } }, { status: 500, statusText: 'Error' });
    await settle();
    expect(element('outbox-load-error')?.textContent).toContain('Something went wrong on the server');
  });
});

describe('byteSize', () => {
  it('writes sizes with SI prefixes', () => {
    expect([byteSize(0), byteSize(999), byteSize(4310), byteSize(2_500_000)]).toEqual(['0 B', '999 B', '4.3 kB', '2.5 MB']);
  });
});
