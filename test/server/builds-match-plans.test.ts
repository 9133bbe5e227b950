/**
 * How a saved match becomes a build's plan (server/services/builds/read-match-plans.ts): the ideal
 * network of its chosen placement and solution, in ladder order, with the chosen fit's parts.
 * The ideal values are the ones worked by hand in builds-scenario.ts (868 MHz, 50 ohm into
 * 12 - j35 ohm, shunt-at-source solution 1: shunt C 6.5257 pF, series L 10.333 nH).
 */
import { describe, expect, it } from 'vitest';
import { planOfSavedMatch, type SavedMatchForPlan } from '../../server/services/builds/read-match-plans.js';
import { SUB_GHZ_SERIES_L_H, SUB_GHZ_SHUNT_C_F } from './builds-scenario.js';

const fitElement = (position: 'shunt' | 'series', kind: 'capacitor' | 'inductor', parts: { partNumber: string; quantity: number }[], arrangement: 'single' | 'series' | 'parallel' = 'single') => ({
  position,
  kind,
  arrangement,
  parts,
  nominalValue: 0,
  effectiveValue: 0,
  frequencyRatio: null,
  flags: [],
});

const SAVED: SavedMatchForPlan = {
  id: 12,
  name: '868 MHz antenna',
  request: { source: 50, load: '12-j35', frequencyHz: '868MHz', location: 'main' },
  chosen: { placement: 'shunt-at-source', solution: 1, rank: 1 },
  fit: {
    elements: [
      fitElement('series', 'inductor', [{ partNumber: 'TW-L0402W-10N', quantity: 1 }]),
      fitElement('shunt', 'capacitor', [{ partNumber: 'TW-C0402-3P3', quantity: 2 }], 'parallel'),
    ],
  },
};

describe('planOfSavedMatch', () => {
  it('solves the chosen network again and lists its elements source to load with the fit parts', () => {
    const plan = planOfSavedMatch(SAVED);
    expect(plan.matchId).toBe(12);
    expect(plan.design).toMatchObject({ source: { re: 50, im: 0 }, load: { re: 12, im: -35 }, frequencyHz: 868e6, location: 'main', usableSrfFraction: null, excludeAboveLimit: null });
    // shunt-at-source: the shunt element sits across the source, so it comes first.
    expect(plan.design.elements.map((e) => [e.position, e.kind, e.arrangement, e.parts])).toEqual([
      ['shunt', 'capacitor', 'parallel', [{ partNumber: 'TW-C0402-3P3', perBoard: 2 }]],
      ['series', 'inductor', 'single', [{ partNumber: 'TW-L0402W-10N', perBoard: 1 }]],
    ]);
    expect(plan.design.elements[0].idealValue).toBeCloseTo(SUB_GHZ_SHUNT_C_F, 15);
    expect(plan.design.elements[1].idealValue).toBeCloseTo(SUB_GHZ_SERIES_L_H, 12);
  });

  it('refuses, naming the match, a fit that does not fit the network or a request that no longer reads', () => {
    expect(() => planOfSavedMatch({ ...SAVED, fit: { elements: [SAVED.fit.elements[0]] } })).toThrow(/Saved match 12 \(868 MHz antenna\) cannot be planned: its fit has no shunt element/);
    expect(() => planOfSavedMatch({ ...SAVED, fit: { elements: [SAVED.fit.elements[0], fitElement('shunt', 'inductor', [])] } })).toThrow(/is an inductor, the network needs a capacitor/);
    expect(() => planOfSavedMatch({ ...SAVED, request: { ...SAVED.request, load: '-5+j2' } })).toThrow(/its request does not read/);
  });
});
