/**
 * Per-element report of a fit: combined nominal values (circuit rules for parts in series and in
 * parallel), effective value at f0, f0/SRF and model flags.
 */
import { describe, expect, it } from 'vitest';
import { combinedNominalValue, elementModel, elementReport, partFlags, partModel } from '../../shared/engine/index.js';

const cap = (valueSi: number, extra = {}) => partModel({ kind: 'capacitor', valueSi, ...extra });
const ind = (valueSi: number, extra = {}) => partModel({ kind: 'inductor', valueSi, ...extra });

describe('element report', () => {
  it('combines nominal values: C parallel adds, C series reciprocal, L series adds, L parallel reciprocal', () => {
    expect(combinedNominalValue(elementModel('shunt', 'parallel', [cap(2.2e-12), cap(3.3e-12)]))).toBeCloseTo(5.5e-12, 25);
    expect(combinedNominalValue(elementModel('series', 'series', [cap(5.6e-12), cap(5.6e-12)]))).toBeCloseTo(2.8e-12, 25);
    expect(combinedNominalValue(elementModel('series', 'series', [ind(6.8e-9), ind(5.6e-9)]))).toBeCloseTo(12.4e-9, 22);
    expect(combinedNominalValue(elementModel('shunt', 'parallel', [ind(12e-9), ind(12e-9)]))).toBeCloseTo(6e-9, 22);
    expect(combinedNominalValue(elementModel('shunt', 'single', [cap(1e-12)]))).toBe(1e-12);
  });

  it('effective capacitance below SRF is C / (1 - (f/SRF)^2); f/SRF and flags', () => {
    // Series C and ESL: X = w ESL - 1/(w C) = -(1 - (f/SRF)^2)/(w C), so C_eff = C / (1 - (f/SRF)^2).
    const part = cap(10e-12, { srfHz: 2e9, esrOhm: 0.2 });
    const report = elementReport(elementModel('shunt', 'single', [part]), 1.2e9);
    expect(report.nominalValue).toBe(10e-12);
    expect(report.effectiveValue / (10e-12 / (1 - 0.36)) - 1).toBeCloseTo(0, 12);
    expect(report.frequencyRatio).toBeCloseTo(0.6, 15);
    expect(report.flags).toEqual(['above-limit']);
    expect(elementReport(elementModel('shunt', 'single', [part]), 1.2e9, 0.7).flags).toEqual([]);
  });

  it('flags unknown limits and losses, and the largest f/SRF of two parts', () => {
    expect(partFlags(ind(10e-9), 1e9)).toEqual(['limit-unknown', 'loss-unknown']);
    const element = elementModel('series', 'series', [ind(6.8e-9, { srfHz: 5e9, q: 30, qFrequencyHz: 1e8 }), ind(5.6e-9, { srfHz: 4e9 })]);
    const report = elementReport(element, 1e9);
    expect(report.frequencyRatio).toBeCloseTo(0.25, 15);
    expect(report.flags).toEqual(['loss-unknown']);
    expect(elementReport(elementModel('series', 'series', [ind(6.8e-9, { srfHz: 5e9 }), ind(5.6e-9)]), 1e9).frequencyRatio).toBeNull();
  });
});
