/**
 * The ideal half of `POST /api/matches/solve`: request checking (every problem named with its
 * field) and the api.md response shape.
 */
import { describe, expect, it } from 'vitest';
import { EngineInputError, parseSolveRequest, solveIdeal, STANDING_CAUTIONS } from '../../shared/engine/index.js';

function problemsOf(body: unknown) {
  try {
    parseSolveRequest(body);
  } catch (error) {
    expect(error).toBeInstanceOf(EngineInputError);
    return (error as EngineInputError).details;
  }
  throw new Error('expected an EngineInputError');
}

describe('parseSolveRequest', () => {
  it('reads strings and numbers into SI values and fills the api.md defaults', () => {
    const input = parseSolveRequest({ source: 50, load: '12-j35', frequencyHz: '868MHz', bandwidthHz: '10 MHz', powerW: '100mW' });
    expect(input).toEqual({
      source: { re: 50, im: 0 },
      load: { re: 12, im: -35 },
      // Typed ports: R with the ideal L or C of their X at f0 (port-model.ts).
      sourcePort: { model: 'series-equivalent', resistanceOhm: 50, reactanceOhm: 0, frequencyHz: 868e6 },
      loadPort: { model: 'series-equivalent', resistanceOhm: 12, reactanceOhm: -35, frequencyHz: 868e6 },
      sourceMeasured: null,
      loadMeasured: null,
      frequencyHz: 868e6,
      bandwidthHz: 10e6,
      powerW: 0.1,
      buildQuantity: 1,
      combinations: false,
      objective: 'worst-case',
      fitsPerNetwork: 3,
      location: null,
      usableSrfFraction: null,
      excludeAboveLimit: null,
    });
    expect(parseSolveRequest({ source: { re: 50, im: 0 }, load: '50∠-30°', frequencyHz: 2.45e9, objective: 'nominal', combinations: true, location: ' main ' }))
      .toMatchObject({ objective: 'nominal', combinations: true, location: 'main' });
  });

  it('names every bad field at once, quoting what was given', () => {
    const details = problemsOf({
      source: '0-j5',
      load: 'twelve',
      frequencyHz: '-868MHz',
      powerW: '2V',
      buildQuantity: 0,
      fitsPerNetwork: 2.5,
      objective: 'best',
      combinations: 'yes',
      usableSrfFraction: 1.5,
      colour: 'red',
    });
    const fields = details.map((d) => d.field).sort();
    expect(fields).toEqual(['buildQuantity', 'colour', 'combinations', 'fitsPerNetwork', 'frequencyHz', 'load', 'objective', 'powerW', 'source', 'usableSrfFraction']);
    const byField = Object.fromEntries(details.map((d) => [d.field, d]));
    expect(byField.source.message).toMatch(/purely reactive or negative-resistance/);
    expect(byField.source.value).toBe('0-j5');
    expect(byField.load.message).toContain('"twelve"');
    expect(byField.frequencyHz.value).toBe('-868MHz');
    expect(byField.powerW.message).toMatch(/voltage, not a power/);
  });

  it.each([
    [{ load: 50, frequencyHz: 1e9 }, 'source', /required/],
    [{ source: 50, load: 50 }, 'frequencyHz', /required/],
    [{ source: 50, load: 25, frequencyHz: 0 }, 'frequencyHz', /outside 1 Hz/],
    [{ source: 50, load: 25, frequencyHz: 1e13 }, 'frequencyHz', /outside 1 Hz/],
    [{ source: 50, load: 25, frequencyHz: Number.NaN }, 'frequencyHz', /not a finite number/],
    [{ source: 50, load: 25, frequencyHz: '868 MHz', bandwidthHz: '2GHz' }, 'bandwidthHz', /less than twice/],
    [{ source: 50, load: 25, frequencyHz: 1e9, objective: 'band' }, 'bandwidthHz', /needs a bandwidth/],
    [{ source: -50, load: 25, frequencyHz: 1e9 }, 'source', /greater than 0 Ω/],
    [{ source: 50, load: '1e300', frequencyHz: 1e9 }, 'load', /beyond/],
    [{ source: 50, load: 25, frequencyHz: 1e9, powerW: '1e300' }, 'powerW', /above the largest/],
  ])('%j: %s', (body, field, reason) => {
    const details = problemsOf(body);
    const detail = details.find((d) => d.field === field);
    expect(detail, JSON.stringify(details)).toBeDefined();
    expect(detail!.message).toMatch(reason);
  });

  it('refuses a body that is not an object', () => {
    for (const body of [null, 'x', [1], 3]) expect(() => parseSolveRequest(body)).toThrow(/JSON object/);
  });
});

describe('solveIdeal', () => {
  it('returns the api.md networks with empty fits, infeasible with reasons, and the cautions', () => {
    const response = solveIdeal({ source: { re: 100, im: 0 }, load: { re: 200, im: -100 }, frequencyHz: 500e6 });
    expect(response.networks).toHaveLength(2);
    for (const network of response.networks) {
      expect(Object.keys(network).sort()).toEqual(['dc', 'elements', 'fits', 'nodeQ', 'placement', 'response', 'solution']);
      expect(network.fits).toEqual([]);
      for (const element of network.elements) expect(Object.keys(element).sort()).toEqual(['kind', 'position', 'reactanceOhm', 'value']);
    }
    expect(response.infeasible).toEqual([{ placement: 'shunt-at-source', reason: expect.any(String) }]);
    for (const caution of STANDING_CAUTIONS) expect(response.cautions).toContain(caution);
    expect(response.cautions.join(' ')).toMatch(/vector network analyser/);
    expect(response.cautions.join(' ')).toMatch(/radio regulations/);
    expect(response.alreadyMatched).toBe(false);
  });

  it('adds element stresses and a power caution when a power is given', () => {
    // 50 Ω to 200 Ω at 1 W: the shunt element across the load sees sqrt(2 P RL) = 20 V peak.
    const response = solveIdeal({ source: { re: 50, im: 0 }, load: { re: 200, im: 0 }, frequencyHz: 100e6, powerW: 1 });
    for (const network of response.networks) {
      const shunt = network.elements.find((e) => e.position === 'shunt')!;
      expect(shunt.stress!.peakVoltageV).toBeCloseTo(20, 9);
      const series = network.elements.find((e) => e.position === 'series')!;
      expect(series.stress!.rmsCurrentA).toBeCloseTo(0.2 / Math.SQRT2, 9);
    }
    expect(response.cautions.some((c) => /At 1 W the largest peak voltage/.test(c))).toBe(true);
  });

  it('says when a node Q is high, and when no network is needed', () => {
    expect(solveIdeal({ source: { re: 50, im: 0 }, load: { re: 5000, im: 0 }, frequencyHz: 1e9 }).cautions.some((c) => /node Q above 10/.test(c))).toBe(false);
    expect(solveIdeal({ source: { re: 50, im: 0 }, load: { re: 2, im: 0 }, frequencyHz: 1e9 }).cautions.some((c) => /node Q above 10/.test(c))).toBe(false);
    expect(solveIdeal({ source: { re: 1, im: 0 }, load: { re: 500, im: 0 }, frequencyHz: 1e9 }).cautions.some((c) => /node Q above 10/.test(c))).toBe(true);
    const matched = solveIdeal({ source: { re: 50, im: 20 }, load: { re: 50, im: -20 }, frequencyHz: 1e9 });
    expect(matched.alreadyMatched).toBe(true);
    expect(matched.networks).toEqual([]);
  });

  it('lists the reactance-cancelling route for a complex load', () => {
    const response = solveIdeal({ source: { re: 50, im: 0 }, load: { re: 20, im: -40 }, frequencyHz: 868e6 });
    expect(response.cancellingRoutes!.length).toBe(4);
    for (const route of response.cancellingRoutes!) expect(route.parts).toHaveLength(3);
  });
});
