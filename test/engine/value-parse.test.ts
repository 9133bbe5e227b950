/**
 * Value strings, impedance strings, tolerance strings and engineering formatting.
 * Expected numbers are written from the definitions of the SI prefixes (BIPM SI Brochure, 9th ed.)
 * and the IEC 60062 letter-and-digit code, not from the engine's output.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  EngineInputError,
  formatImpedance,
  formatTolerance,
  formatValue,
  parseComplex,
  parseTolerance,
  parseValue,
  type Quantity,
} from '../../shared/engine/index.js';

function errorOf(run: () => unknown): EngineInputError {
  try {
    run();
  } catch (error) {
    expect(error).toBeInstanceOf(EngineInputError);
    return error as EngineInputError;
  }
  throw new Error('expected an EngineInputError');
}

describe('parseValue', () => {
  it.each<[string, Quantity, number]>([
    ['4.7pF', 'capacitance', 4.7e-12],
    ['4.7 pF', 'capacitance', 4.7e-12],
    ['4.7 p', 'capacitance', 4.7e-12],
    ['4p7', 'capacitance', 4.7e-12],
    ['4.7e-12', 'capacitance', 4.7e-12],
    ['4.7E-12F', 'capacitance', 4.7e-12],
    ['2n2', 'capacitance', 2.2e-9],
    ['p68', 'capacitance', 0.68e-12],
    ['4.7pf', 'capacitance', 4.7e-12],
    ['4.7f', 'capacitance', 4.7e-15],
    ['1µF', 'capacitance', 1e-6],
    ['1μF', 'capacitance', 1e-6],
    ['1uF', 'capacitance', 1e-6],
    ['12nH', 'inductance', 12e-9],
    ['12n', 'inductance', 12e-9],
    ['1u0', 'inductance', 1e-6],
    ['2n2H', 'inductance', 2.2e-9],
    ['868MHz', 'frequency', 868e6],
    ['2.45 GHz', 'frequency', 2.45e9],
    ['6.2 G', 'frequency', 6.2e9],
    ['6.2e9', 'frequency', 6.2e9],
    ['100MHz', 'frequency', 1e8],
    ['13.56MHz', 'frequency', 13.56e6],
    ['50', 'resistance', 50],
    ['0.3ohm', 'resistance', 0.3],
    ['0.3 Ω', 'resistance', 0.3],
    ['300m', 'resistance', 0.3],
    ['1R5', 'resistance', 1.5],
    ['R47', 'resistance', 0.47],
    ['50R', 'resistance', 50],
    ['4k7', 'resistance', 4700],
    ['4K7', 'resistance', 4700],
    ['4M7', 'resistance', 4.7e6],
    ['50V', 'voltage', 50],
    ['300mA', 'current', 0.3],
    ['100mW', 'power', 0.1],
    ['.5p', 'capacitance', 0.5e-12],
  ])('%s as %s is %d', (text, quantity, expected) => {
    expect(parseValue(text, quantity)).toBe(expected);
  });

  it('code form and exponent form give the same double', () => {
    expect(parseValue('4p7', 'capacitance')).toBe(parseValue('4.7e-12', 'capacitance'));
    expect(parseValue('8n2', 'inductance')).toBe(8.2e-9);
  });

  it('accepts finite JSON numbers', () => {
    expect(parseValue(868e6, 'frequency')).toBe(868e6);
  });

  it.each<[unknown, Quantity, RegExp]>([
    ['4.7nH', 'capacitance', /is an inductance, not a capacitance/],
    ['868mhz', 'frequency', /ambiguous/],
    ['1R5', 'capacitance', /resistor code letter R/],
    ['4,7pF', 'capacitance', /comma/],
    ['4.7 p F', 'capacitance', /unknown prefix or unit/],
    ['4.7xF', 'capacitance', /unknown prefix or unit/],
    ['', 'capacitance', /empty/],
    ['   ', 'capacitance', /empty/],
    ['pF', 'capacitance', /not a capacitance/],
    ['NaN', 'capacitance', /not a capacitance/],
    ['Infinity', 'frequency', /not a frequency/],
    ['1e400', 'frequency', /too large/],
    ['-4.7pF', 'capacitance', /greater than zero/],
    ['0', 'capacitance', /greater than zero/],
    [Number.NaN, 'capacitance', /not a finite number/],
    [Number.POSITIVE_INFINITY, 'capacitance', /not a finite number/],
    [null, 'capacitance', /expected a number or a string/],
    ['5%', 'capacitance', /unknown prefix or unit "%"/],
  ])('refuses %j as %s, quoting it and showing an accepted form', (input, quantity, reason) => {
    const error = errorOf(() => parseValue(input, quantity, { field: 'value' }));
    expect(error.message).toMatch(reason);
    expect(error.message).toMatch(/write it like "/);
    expect(error.field).toBe('value');
    if (typeof input === 'string') expect(error.message).toContain(JSON.stringify(input));
  });

  it('applies range options', () => {
    expect(() => parseValue('1e300', 'power', { maxSi: 1e6 })).toThrow(/above the largest/);
    expect(parseValue('0', 'resistance', { sign: 'non-negative' })).toBe(0);
    expect(parseValue('-3', 'resistance', { sign: 'any' })).toBe(-3);
  });
});

describe('parseComplex', () => {
  it.each<[unknown, number, number]>([
    ['12-j35', 12, -35],
    ['12 - j35', 12, -35],
    ['12 - 35j', 12, -35],
    ['12-35i', 12, -35],
    ['12+j35', 12, 35],
    ['12 + j 35 ohm', 12, 35],
    ['12-j35Ω', 12, -35],
    ['50', 50, 0],
    ['-j35', 0, -35],
    ['j35', 0, 35],
    ['1e3-j2.5e2', 1000, -250],
    ['12 − j35', 12, -35], // U+2212 minus sign, as typeset text often has
    [50, 50, 0],
    [{ re: 12, im: -35 }, 12, -35],
  ])('%j is %d %d', (input, re, im) => {
    expect(parseComplex(input)).toEqual({ re, im });
  });

  it('reads polar form in degrees (and radians when marked)', () => {
    const z = parseComplex('50∠-30°');
    // 50 cos(-30°) = 25 sqrt(3), 50 sin(-30°) = -25.
    expect(z.re).toBeCloseTo(25 * Math.sqrt(3), 12);
    expect(z.im).toBeCloseTo(-25, 12);
    expect(parseComplex('10∠90').im).toBeCloseTo(10, 12);
    expect(parseComplex('2∠3.141592653589793rad').re).toBeCloseTo(-2, 12);
  });

  it.each(['12+j', '12j35', 'abc', '12--j3', '12-j35-j3', '3+4', '', '50∠', 'j', '1,5-j2', 'NaN'])('refuses %j', (text) => {
    const error = errorOf(() => parseComplex(text, 'load'));
    expect(error.field).toBe('load');
    expect(error.message).toContain(JSON.stringify(text));
    expect(error.message).toMatch(/write it like "12-j35"/);
  });

  it('refuses non-finite numbers and objects', () => {
    expect(() => parseComplex(Number.NaN)).toThrow(EngineInputError);
    expect(() => parseComplex({ re: Number.POSITIVE_INFINITY, im: 0 })).toThrow(EngineInputError);
    expect(() => parseComplex([1, 2])).toThrow(EngineInputError);
  });
});

describe('parseTolerance', () => {
  it('reads percent, letters and absolute amounts', () => {
    expect(parseTolerance('5%', 'capacitor')).toEqual({ mode: 'relative', fraction: 0.05 });
    expect(parseTolerance('±5 %', 'inductor')).toEqual({ mode: 'relative', fraction: 0.05 });
    expect(parseTolerance('+/-2%', 'inductor')).toEqual({ mode: 'relative', fraction: 0.02 });
    expect(parseTolerance('J', 'inductor')).toEqual({ mode: 'relative', fraction: 0.05 });
    expect(parseTolerance('C', 'capacitor')).toEqual({ mode: 'absolute', deltaSi: 0.25e-12 });
    expect(parseTolerance('0.1pF', 'capacitor')).toEqual({ mode: 'absolute', deltaSi: 0.1e-12 });
    expect(parseTolerance('±0.25 pF', 'capacitor')).toEqual({ mode: 'absolute', deltaSi: 0.25e-12 });
    expect(parseTolerance('±0.2 nH', 'inductor')).toEqual({ mode: 'absolute', deltaSi: 0.2e-9 });
  });

  it('refuses what has no meaning for the kind', () => {
    expect(() => parseTolerance('B', 'inductor')).toThrow(/capacitance tolerance/);
    expect(() => parseTolerance('0.1nH', 'capacitor')).toThrow(/not a tolerance/);
    expect(() => parseTolerance('5', 'capacitor')).toThrow(/no % sign or unit/);
    expect(() => parseTolerance('80%', 'capacitor')).toThrow(/more than/);
    expect(() => parseTolerance('X', 'capacitor')).toThrow(EngineInputError);
  });

  it('formats back to a string it reads', () => {
    for (const text of ['5%', 'C', '0.1pF', 'K']) {
      const tolerance = parseTolerance(text, 'capacitor');
      expect(parseTolerance(formatTolerance(tolerance, 'capacitor'), 'capacitor')).toEqual(tolerance);
    }
  });
});

describe('formatValue', () => {
  it.each<[number, Quantity, string]>([
    [4.7e-12, 'capacitance', '4.7 pF'],
    [868e6, 'frequency', '868 MHz'],
    [2.45e9, 'frequency', '2.45 GHz'],
    [12e-9, 'inductance', '12 nH'],
    [1e-6, 'inductance', '1 µH'],
    [50, 'resistance', '50 Ω'],
    [0.3, 'current', '300 mA'],
    [999.96e-12, 'capacitance', '1 nF'],
    [0, 'capacitance', '0 F'],
    [1e-18, 'capacitance', '1e-18 F'],
  ])('%d %s as %s', (value, quantity, text) => {
    expect(formatValue(value, quantity)).toBe(text);
  });

  it('formats impedances that parse back', () => {
    expect(formatImpedance(12, -35)).toBe('12 - j35 Ω');
    expect(formatImpedance(50, 0)).toBe('50 Ω');
    expect(parseComplex(formatImpedance(12.5, 3.25))).toEqual({ re: 12.5, im: 3.25 });
  });

  const quantities: Quantity[] = ['capacitance', 'inductance', 'frequency', 'resistance', 'voltage', 'current', 'power'];
  const positive = fc.double({ min: 1e-20, max: 1e20, noNaN: true, noDefaultInfinity: true });

  it('round trip: parse(format(x, 17 digits)) is x exactly (property)', () => {
    fc.assert(
      fc.property(positive, fc.constantFrom(...quantities), (x, quantity) => {
        expect(parseValue(formatValue(x, quantity, { significantDigits: 17 }), quantity)).toBe(x);
      }),
      { numRuns: 2000 },
    );
  });

  it('round trip: format(parse(format(x, d))) is format(x, d) (property)', () => {
    fc.assert(
      fc.property(positive, fc.constantFrom(...quantities), fc.integer({ min: 1, max: 12 }), (x, quantity, digits) => {
        const text = formatValue(x, quantity, { significantDigits: digits });
        expect(formatValue(parseValue(text, quantity), quantity, { significantDigits: digits })).toBe(text);
        expect(Math.abs(parseValue(text, quantity) / x - 1)).toBeLessThanOrEqual(0.5 * 10 ** (1 - digits) + 1e-15);
      }),
      { numRuns: 2000 },
    );
  });
});
