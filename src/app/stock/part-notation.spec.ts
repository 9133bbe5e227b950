import type { PartItem } from '../../../shared/api/stock.js';
import { changedFieldText, frequencyText, lossText, partValueText, ratingText, toleranceText } from './part-notation.js';

// Expected strings follow the SI prefixes (BIPM SI Brochure, 9th ed., table 7) and the IEC 60062
// tolerance letters (C = ±0.25 pF, J = ±5 %).
describe('part notation', () => {
  it('writes values in engineering notation with their unit', () => {
    expect(partValueText('capacitor', 4.7e-12)).toBe('4.7 pF');
    expect(partValueText('capacitor', 100e-12)).toBe('100 pF');
    expect(partValueText('inductor', 12e-9)).toBe('12 nH');
    expect(partValueText('inductor', 1e-6)).toBe('1 µH');
    // Sub-picofarad chip capacitors are written in pF, as their makers do.
    expect(partValueText('capacitor', 0.5e-12)).toBe('0.5 pF');
    expect(partValueText('inductor', 0.6e-9)).toBe('0.6 nH');
  });

  it('writes relative and absolute tolerances', () => {
    expect(toleranceText('capacitor', { mode: 'relative', fraction: 0.05 })).toBe('±5 %');
    expect(toleranceText('capacitor', { mode: 'absolute', deltaSi: 0.25e-12 })).toBe('±0.25 pF');
    expect(toleranceText('inductor', { mode: 'absolute', deltaSi: 0.2e-9 })).toBe('±0.2 nH');
  });

  it('writes frequencies, and a dash for an unknown SRF', () => {
    expect(frequencyText(6.2e9)).toBe('6.2 GHz');
    expect(frequencyText(868e6)).toBe('868 MHz');
    expect(frequencyText(null)).toBe('—');
  });

  it('shows ESR when given, since it wins over Q, else Q at its frequency', () => {
    expect(lossText({ esrOhm: 0.3, q: 40, qFrequencyHz: 500e6 })).toBe('ESR 0.3 Ω');
    expect(lossText({ esrOhm: null, q: 40, qFrequencyHz: 500e6 })).toBe('Q 40 @ 500 MHz');
    expect(lossText({ esrOhm: null, q: null, qFrequencyHz: null })).toBe('—');
  });

  it("shows the rating that fits the kind", () => {
    const part = { voltageRating: 50, currentRating: 0.3 } as Pick<PartItem, 'voltageRating' | 'currentRating'>;
    expect(ratingText({ ...part, kind: 'capacitor' })).toBe('50 V');
    expect(ratingText({ ...part, kind: 'inductor' })).toBe('300 mA');
  });

  it('writes changed fields of an import in the units of the field', () => {
    expect(changedFieldText('capacitor', 'tolerance', { mode: 'absolute', deltaSi: 0.5e-12 })).toBe('±0.5 pF');
    expect(changedFieldText('inductor', 'srfHz', 3.1e9)).toBe('3.1 GHz');
    expect(changedFieldText('inductor', 'unitCost', '0.021')).toBe('0.021');
    expect(changedFieldText('inductor', 'srfHz', null)).toBe('—');
  });
});
