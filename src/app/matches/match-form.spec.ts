import { ComponentFixture, TestBed } from '@angular/core/testing';
import { HarnessLoader } from '@angular/cdk/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MatInputHarness } from '@angular/material/input/testing';
import { MatSelectHarness } from '@angular/material/select/testing';
import { MatSlideToggleHarness } from '@angular/material/slide-toggle/testing';

import type { SolveRequest } from '../../../shared/api/matches.js';
import { MatchForm } from './match-form.js';

describe('MatchForm', () => {
  let fixture: ComponentFixture<MatchForm>;
  let loader: HarnessLoader;
  let emitted: SolveRequest[];

  beforeEach(async () => {
    fixture = TestBed.createComponent(MatchForm);
    loader = TestbedHarnessEnvironment.loader(fixture);
    emitted = [];
    fixture.componentInstance.solve.subscribe((request) => emitted.push(request));
    await fixture.whenStable();
  });

  const field = (id: string) => loader.getHarness(MatInputHarness.with({ selector: `[data-testid="${id}"]` }));
  const text = (id: string) => (fixture.nativeElement as HTMLElement).querySelector(`[data-testid="${id}"]`)?.textContent?.trim() ?? null;
  const solve = async () => (await loader.getHarness(MatButtonHarness.with({ selector: '[data-testid="match-solve"]' }))).click();

  it('shows what the load reads as once typing pauses', async () => {
    await (await field('match-load')).setValue('12 - 35j');
    await vi.waitFor(() => expect(text('match-load-reading')).toBe('Reads as 12 - j35 Ω'));
    await (await field('match-frequency')).setValue('868MHz');
    await vi.waitFor(() => expect(text('match-frequency-reading')).toBe('Reads as 868 MHz'));
  });

  it('shows the engine message under a field it cannot read', async () => {
    await (await field('match-load')).setValue('12-j3x');
    await vi.waitFor(() => expect(text('match-load-problem')).toContain('"12-j3x" is not an impedance'));
    await (await field('match-frequency')).setValue('868mhz');
    await vi.waitFor(() => expect(text('match-frequency-problem')).toContain('ambiguous'));
    expect(text('match-load-reading')).toBeNull();
  });

  it('refuses a load without resistance, with the reason', async () => {
    await (await field('match-load')).setValue('-j35');
    await vi.waitFor(() => expect(text('match-load-problem')).toContain('must be greater than 0 Ω'));
  });

  it('does not solve while a field is wrong, and shows problems on untouched fields then', async () => {
    await solve();
    expect(emitted).toEqual([]);
    await vi.waitFor(() => expect(text('match-load-problem')).toContain('is empty'));
    expect(text('match-frequency-problem')).toContain('is empty');
  });

  it('asks for a band when the band objective is chosen', async () => {
    await (await field('match-load')).setValue('12-j35');
    await (await field('match-frequency')).setValue('868MHz');
    const objective = await loader.getHarness(MatSelectHarness.with({ selector: '[data-testid="match-objective"]' }));
    await objective.open();
    await objective.clickOptions({ text: 'Across the band' });
    await solve();
    expect(emitted).toEqual([]);
    await vi.waitFor(() => expect(text('match-band-problem')).toContain('needs a bandwidth'));
  });

  it('emits the request as typed when every field reads cleanly', async () => {
    await (await field('match-load')).setValue('12-j35');
    await (await field('match-frequency')).setValue('868MHz');
    await (await field('match-band')).setValue('10MHz');
    await (await field('match-power')).setValue('100mW');
    await (await field('match-quantity')).setValue('250');
    await (await loader.getHarness(MatSlideToggleHarness.with({ selector: '[data-testid="match-combinations"]' }))).check();
    await solve();
    expect(emitted).toEqual([
      {
        source: '50',
        load: '12-j35',
        frequencyHz: '868MHz',
        bandwidthHz: '10MHz',
        powerW: '100mW',
        buildQuantity: 250,
        combinations: true,
        objective: 'worst-case',
      },
    ]);
  });

  it('shows a problem the server found next to its field until the field changes', async () => {
    fixture.componentRef.setInput('serverProblems', { location: 'no parts are stored at "Shelf Z"' });
    await fixture.whenStable();
    expect(text('match-location-problem')).toBe('no parts are stored at "Shelf Z"');
    await (await field('match-location')).setValue('Shelf A');
    await vi.waitFor(() => expect(text('match-location-problem')).toBeNull());
  });

  it('fills in a saved request', async () => {
    fixture.componentRef.setInput('preset', {
      source: { re: 50, im: 0 },
      load: '12-j35',
      frequencyHz: 868e6,
      buildQuantity: 40,
      combinations: true,
      objective: 'nominal',
    } satisfies SolveRequest);
    await fixture.whenStable();
    expect(await (await field('match-source')).getValue()).toBe('50');
    expect(await (await field('match-frequency')).getValue()).toBe('868000000');
    expect(await (await field('match-quantity')).getValue()).toBe('40');
    await vi.waitFor(() => expect(text('match-frequency-reading')).toBe('Reads as 868 MHz'));
  });

  it('takes a measured load file in place of the typed load, and goes back to typing', async () => {
    const fileText = ['[Version] 2.0', '# MHz Z RI R 50', '[Number of Ports] 1', '[Number of Frequencies] 2', '[Network Data]', '860 10 -40', '880 14 -30', '[End]'].join('\n');
    const picker = (fixture.nativeElement as HTMLElement).querySelector<HTMLInputElement>('[data-testid="match-load-file-input"]')!;
    Object.defineProperty(picker, 'files', { configurable: true, value: [new File([fileText], 'ant.s1p', { type: 'text/plain' })] });
    picker.dispatchEvent(new Event('change'));
    await vi.waitFor(() => expect((fixture.nativeElement as HTMLElement).querySelector('[data-testid="match-load-file-name"]')).not.toBeNull());
    expect(await (await field('match-load-file-name')).getValue()).toBe('ant.s1p');
    await (await field('match-frequency')).setValue('868MHz');
    // Hand: 868 MHz is 0.4 of the way from 860 to 880 MHz: 11.6 - j36 ohm.
    await vi.waitFor(() => expect(text('match-load-reading')).toBe('2 points, 860 MHz to 880 MHz; 11.6 - j36 Ω at 868 MHz'));
    await solve();
    expect(emitted).toHaveLength(1);
    expect(emitted[0].load).toBeUndefined();
    expect(emitted[0].loadTouchstone).toEqual({ fileName: 'ant.s1p', text: fileText });
    await (await loader.getHarness(MatButtonHarness.with({ selector: '[data-testid="match-load-file-clear"]' }))).click();
    await vi.waitFor(() => expect((fixture.nativeElement as HTMLElement).querySelector('[data-testid="match-load"]')).not.toBeNull());
  });

  it('names the line of a malformed measured file under the load', async () => {
    const picker = (fixture.nativeElement as HTMLElement).querySelector<HTMLInputElement>('[data-testid="match-load-file-input"]')!;
    Object.defineProperty(picker, 'files', { configurable: true, value: [new File(['# MHz S RI R 50\n868 0.1\n'], 'short.s1p')] });
    picker.dispatchEvent(new Event('change'));
    await vi.waitFor(() => expect(text('match-load-problem')).toMatch(/"short\.s1p" line 2/));
  });
});
