/**
 * The next-best stocked part for a short element (shared/shortfall/substitute-part.ts) follows the
 * snapper's rules of rf-engine.md: enough available, never at or above SRF, above-limit after
 * within-limit, within the loss budget. The one-element tag-coil match has a closed-form loss
 * (see shortfall-calculations.test.ts): 10 log10(1 + (w (C - C0) / 0.04)^2) at 13.56 MHz.
 */
import { describe, expect, it } from 'vitest';
import { bestSubstitute, type MatchDesign, type StockCandidate } from '../../shared/shortfall/index.js';

const F0 = 13.56e6;
const W = 2 * Math.PI * F0;

function tagCoil(): MatchDesign {
  const b0 = W * 1e-9;
  const d = 0.02 ** 2 + b0 ** 2;
  return {
    source: { re: 50, im: 0 },
    load: { re: 0.02 / d, im: b0 / d },
    frequencyHz: F0,
    elements: [{ position: 'shunt', kind: 'capacitor', idealValue: 1e-9, arrangement: 'single', parts: [{ kind: 'capacitor', valueSi: 1e-9 }] }],
  };
}

const J = { mode: 'relative', fraction: 0.05 } as const;
const candidate = (id: number, partNumber: string, valueSi: number, available: number, srfHz: number | null = null): StockCandidate => ({
  id,
  partNumber,
  location: 'main',
  spec: { kind: 'capacitor', valueSi, tolerance: J, srfHz },
  available,
  package: '0603',
});

const RULES = { usableSrfFraction: 0.5, excludeAboveLimit: false, lossBudgetDb: 0.5 };

describe('bestSubstitute', () => {
  const exactButScarce = candidate(1, 'C-1N0-A', 1e-9, 5);
  const near = candidate(2, 'C-1N1', 1.1e-9, 50);
  // SRF 25 MHz: f0 / SRF = 0.542, above the 0.5 limit; 0.7058 nF looks like 1 nF there (C / (1 - 0.542^2)).
  const aboveLimit = candidate(3, 'C-0N7-HOT', 0.7058e-9, 50, 25e6);
  // SRF 13 MHz is below f0: never used as a capacitor.
  const pastSrf = candidate(4, 'C-1N0-PAST', 1e-9, 50, 13e6);
  const inductor: StockCandidate = { ...candidate(5, 'L-1N0', 1e-9, 50), spec: { kind: 'inductor', valueSi: 1e-9 } };

  it('takes a part within its limit with enough stock, and reports its worst case', () => {
    const found = bestSubstitute(tagCoil(), 0, [exactButScarce, near, aboveLimit, pastSrf, inductor], 10, RULES);
    expect(found?.candidate.partNumber).toBe('C-1N1');
    // 1.1 nF J: worst corner 1.155 nF, dB = w x 0.155 nF = 0.013206 S -> 10 log10(1 + 0.10900) = 0.4493 dB.
    expect(found?.losses.worstCaseDb).toBeCloseTo(0.4493, 3);
    expect(found?.aboveLimit).toBe(false);
  });

  it('takes the exact part once it has enough, and an above-limit part only when nothing within limits will do', () => {
    expect(bestSubstitute(tagCoil(), 0, [exactButScarce, near], 5, RULES)?.candidate.partNumber).toBe('C-1N0-A');
    const hot = bestSubstitute(tagCoil(), 0, [exactButScarce, aboveLimit, pastSrf], 10, RULES);
    expect(hot?.candidate.partNumber).toBe('C-0N7-HOT');
    expect(hot?.aboveLimit).toBe(true);
    expect(bestSubstitute(tagCoil(), 0, [aboveLimit, pastSrf], 10, { ...RULES, excludeAboveLimit: true })).toBeNull();
  });

  it('offers nothing past SRF, of the wrong kind, excluded, or over the loss budget', () => {
    expect(bestSubstitute(tagCoil(), 0, [pastSrf, inductor], 1, RULES)).toBeNull();
    expect(bestSubstitute(tagCoil(), 0, [near], 1, RULES, new Set([2]))).toBeNull();
    // 1.1 nF's worst case 0.4493 dB is over a 0.4 dB budget.
    expect(bestSubstitute(tagCoil(), 0, [near], 1, { ...RULES, lossBudgetDb: 0.4 })).toBeNull();
  });
});
