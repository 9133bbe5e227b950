/**
 * Every column of the stock-list schema (handbook stock-csv.md): its accepted forms, read through the
 * real upload route into PostgreSQL, and its errors, each located by line and column.
 * Expected SI values follow from the SI prefix definitions (BIPM SI Brochure, 9th ed., table 7:
 * p = 1e-12, n = 1e-9, u = 1e-6, m = 1e-3, M = 1e6, G = 1e9) and the IEC 60062 tolerance letters
 * (B ±0.1 pF, C ±0.25 pF, D ±0.5 pF, F 1 %, G 2 %, J 5 %, K 10 %, M 20 %).
 */
import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import { startTestApp, type TestApp } from '../support/test-app.js';
import { FULL_HEADER, clearStock, csvFile, storedParts, uploadStock, type StoredPart } from '../fixtures/stock/stock-upload.js';

let t: TestApp;
let stores: { token: string };
beforeAll(async () => {
  t = await startTestApp();
  stores = await t.addUser('stores');
});
afterAll(async () => {
  await t?.close();
});
beforeEach(async () => {
  await clearStock(t.sequelize);
});

/** A full row with the given cells replaced (by column name); the rest are a plain valid capacitor. */
function row(cells: Partial<Record<string, string>>): string {
  const base: Record<string, string> = {
    part_number: 'P1',
    kind: 'capacitor',
    value: '4.7pF',
    tolerance: 'C',
    srf: '',
    q: '',
    q_freq: '',
    esr: '',
    quantity: '10',
    package: '0402',
    voltage_rating: '',
    current_rating: '',
    location: '',
    series: '',
    unit_cost: '',
    manufacturer_part: '',
    description: '',
  };
  const merged = { ...base, ...cells };
  return FULL_HEADER.split(',')
    .map((column) => {
      const cell = merged[column] ?? '';
      return /[",\n]/.test(cell) ? `"${cell.replace(/"/g, '""')}"` : cell;
    })
    .join(',');
}

async function importRows(...rows: string[]): Promise<Map<string, StoredPart>> {
  const res = await uploadStock(t.app, stores.token, csvFile(FULL_HEADER, ...rows));
  expect(res.status, JSON.stringify(res.body.rejected)).toBe(200);
  return new Map((await storedParts(t.sequelize)).map((p) => [p.part_number, p]));
}

/** Uploads one row as a dry run and returns its problems. */
async function problemsOf(cells: Partial<Record<string, string>>) {
  const res = await uploadStock(t.app, stores.token, csvFile(FULL_HEADER, row(cells)), { dryRun: true });
  expect(res.status).toBe(422);
  return res.body.rejected as { line: number; column: string; value: string; message: string }[];
}

async function expectProblem(cells: Partial<Record<string, string>>, column: string, messagePart: RegExp) {
  const problems = await problemsOf(cells);
  const found = problems.find((p) => p.column === column);
  expect(found, `no ${column} problem in ${JSON.stringify(problems)}`).toBeDefined();
  expect(found!.line).toBe(2);
  expect(found!.value).toBe(cells[column] ?? '');
  expect(found!.message).toMatch(messagePart);
}

describe('part_number', () => {
  it('accepts text up to 64 characters and refuses longer, blank, and line breaks', async () => {
    const long = 'X'.repeat(64);
    const parts = await importRows(row({ part_number: long }), row({ part_number: '  C-0402-4P7  ' }));
    expect(parts.has(long)).toBe(true);
    expect(parts.has('C-0402-4P7')).toBe(true);
    await expectProblem({ part_number: 'X'.repeat(65) }, 'part_number', /65 characters long; at most 64/);
    await expectProblem({ part_number: '' }, 'part_number', /required/);
    await expectProblem({ part_number: 'A\nB' }, 'part_number', /line break/);
  });
});

describe('kind', () => {
  it('accepts capacitor/inductor, C/L and cap/ind in any case', async () => {
    const parts = await importRows(
      row({ part_number: 'k1', kind: 'capacitor' }),
      row({ part_number: 'k2', kind: 'C' }),
      row({ part_number: 'k3', kind: 'Cap' }),
      row({ part_number: 'k4', kind: 'inductor', value: '12n', tolerance: '5%' }),
      row({ part_number: 'k5', kind: 'l', value: '12n', tolerance: '5%' }),
      row({ part_number: 'k6', kind: 'IND', value: '12n', tolerance: '5%' }),
    );
    expect(['k1', 'k2', 'k3', 'k4', 'k5', 'k6'].map((p) => parts.get(p)!.kind)).toEqual([
      'capacitor',
      'capacitor',
      'capacitor',
      'inductor',
      'inductor',
      'inductor',
    ]);
  });

  it('refuses anything else', async () => {
    await expectProblem({ kind: 'resistor' }, 'kind', /not a part kind; write capacitor, inductor, C, L, cap or ind/);
    await expectProblem({ kind: '' }, 'kind', /required/);
  });
});

describe('value', () => {
  it('reads 4.7pF, 4.7 p, 4p7 and 4.7e-12 as 4.7 pF; 12nH and 12n as 12 nH; 1u0 as 1 uH', async () => {
    const parts = await importRows(
      row({ part_number: 'v1', value: '4.7pF' }),
      row({ part_number: 'v2', value: '4.7 p' }),
      row({ part_number: 'v3', value: '4p7' }),
      row({ part_number: 'v4', value: '4.7e-12' }),
      row({ part_number: 'v5', kind: 'L', value: '12nH', tolerance: '5%' }),
      row({ part_number: 'v6', kind: 'L', value: '12n', tolerance: '5%' }),
      row({ part_number: 'v7', kind: 'L', value: '1u0', tolerance: '5%' }),
    );
    for (const p of ['v1', 'v2', 'v3', 'v4']) expect(parts.get(p)!.value_si).toBe(4.7e-12);
    expect(parts.get('v5')!.value_si).toBe(12e-9);
    expect(parts.get('v6')!.value_si).toBe(12e-9);
    expect(parts.get('v7')!.value_si).toBe(1e-6);
  });

  it('refuses a unit of the other kind, non-values, zero, negatives, absurd sizes and a decimal comma', async () => {
    await expectProblem({ value: '12nH' }, 'value', /is an inductance \(H\), but the row's kind is capacitor/);
    await expectProblem({ kind: 'L', value: '4.7pF', tolerance: '5%' }, 'value', /is a capacitance \(F\), but the row's kind is inductor/);
    await expectProblem({ value: 'big' }, 'value', /"big"/);
    await expectProblem({ value: '0' }, 'value', /greater than zero/);
    await expectProblem({ value: '-4.7pF' }, 'value', /greater than zero/);
    await expectProblem({ value: '1e300' }, 'value', /above .* the largest capacitance accepted/);
    await expectProblem({ value: '4,7pF' }, 'value', /comma/);
    await expectProblem({ value: '' }, 'value', /required/);
  });
});

describe('tolerance', () => {
  it('reads 5%, ±5 %, J as relative 5 %; 0.1pF, ±0.25 pF, C as absolute; ±0.3nH for an inductor', async () => {
    const parts = await importRows(
      row({ part_number: 't1', value: '10pF', tolerance: '5%' }),
      row({ part_number: 't2', value: '10pF', tolerance: '±5 %' }),
      row({ part_number: 't3', value: '10pF', tolerance: 'J' }),
      row({ part_number: 't4', tolerance: '0.1pF' }),
      row({ part_number: 't5', tolerance: '±0.25 pF' }),
      row({ part_number: 't6', tolerance: 'C' }),
      row({ part_number: 't7', kind: 'L', value: '3.3nH', tolerance: '±0.3nH' }),
      row({ part_number: 't8', value: '100pF', tolerance: 'k' }),
      row({ part_number: 't9', tolerance: 'B' }),
    );
    for (const p of ['t1', 't2', 't3']) expect([parts.get(p)!.tolerance_kind, parts.get(p)!.tolerance_value]).toEqual(['relative', 0.05]);
    expect([parts.get('t4')!.tolerance_kind, parts.get('t4')!.tolerance_value]).toEqual(['absolute', 0.1e-12]);
    expect(parts.get('t5')!.tolerance_value).toBe(0.25e-12);
    expect(parts.get('t6')!.tolerance_value).toBe(0.25e-12);
    expect([parts.get('t7')!.tolerance_kind, parts.get('t7')!.tolerance_value]).toEqual(['absolute', 0.3e-9]);
    expect([parts.get('t8')!.tolerance_kind, parts.get('t8')!.tolerance_value]).toEqual(['relative', 0.1]);
    expect(parts.get('t9')!.tolerance_value).toBe(0.1e-12);
  });

  it('refuses unknown letters, bare numbers, zero, huge, pF letters on inductors and a tolerance not below the value', async () => {
    await expectProblem({ tolerance: 'Q' }, 'tolerance', /"Q" is not a tolerance; write it like/);
    await expectProblem({ tolerance: '5' }, 'tolerance', /no % sign or unit/);
    await expectProblem({ tolerance: '0%' }, 'tolerance', /greater than zero/);
    await expectProblem({ tolerance: '-5%' }, 'tolerance', /negative/);
    await expectProblem({ tolerance: '60%' }, 'tolerance', /more than ±50 %/);
    await expectProblem({ kind: 'L', value: '10n', tolerance: 'C' }, 'tolerance', /not one for an inductor/);
    await expectProblem({ value: '4.7pF', tolerance: '5pF' }, 'tolerance', /not smaller than the value 4.7 pF/);
    await expectProblem({ tolerance: '0.1nH' }, 'tolerance', /is an inductance \(H\), but the row's kind is capacitor/);
    await expectProblem({ tolerance: '' }, 'tolerance', /required/);
  });
});

describe('srf, q, q_freq and esr', () => {
  it('reads 6GHz, 6.2 G and 6.2e9; Q with its frequency; ESR as 0.3, 0.3ohm or 300m; blanks as unknown', async () => {
    const parts = await importRows(
      row({ part_number: 's1', srf: '6GHz' }),
      row({ part_number: 's2', srf: '6.2 G' }),
      row({ part_number: 's3', srf: '6.2e9', q: '40', q_freq: '100MHz' }),
      row({ part_number: 's4', q: '55.5', q_freq: '250 M', esr: '0.3' }),
      row({ part_number: 's5', esr: '0.3ohm' }),
      row({ part_number: 's6', esr: '300m' }),
      row({ part_number: 's7' }),
    );
    expect(parts.get('s1')!.srf_hz).toBe(6e9);
    expect(parts.get('s2')!.srf_hz).toBe(6.2e9);
    expect(parts.get('s3')!.srf_hz).toBe(6.2e9);
    expect([parts.get('s3')!.q, parts.get('s3')!.q_frequency_hz]).toEqual([40, 100e6]);
    expect([parts.get('s4')!.q, parts.get('s4')!.q_frequency_hz, parts.get('s4')!.esr_ohm]).toEqual([55.5, 250e6, 0.3]);
    expect(parts.get('s5')!.esr_ohm).toBe(0.3);
    expect(parts.get('s6')!.esr_ohm).toBe(0.3);
    const blank = parts.get('s7')!;
    expect([blank.srf_hz, blank.q, blank.q_frequency_hz, blank.esr_ohm]).toEqual([null, null, null, null]);
  });

  it('refuses bad frequencies, Q without its frequency (and the reverse), non-positive Q and ESR', async () => {
    await expectProblem({ srf: 'fast' }, 'srf', /"fast"/);
    await expectProblem({ srf: '-1GHz' }, 'srf', /greater than zero/);
    await expectProblem({ srf: '6nH' }, 'srf', /inductance, not a frequency/);
    await expectProblem({ srf: '5' }, 'srf', /below 1 kHz/);
    await expectProblem({ q: '40' }, 'q_freq', /required with q/);
    await expectProblem({ q_freq: '100MHz' }, 'q', /q is blank/);
    await expectProblem({ q: '0', q_freq: '100MHz' }, 'q', /greater than zero/);
    await expectProblem({ q: 'high', q_freq: '100MHz' }, 'q', /not a number/);
    await expectProblem({ q: '40', q_freq: '100mhz' }, 'q_freq', /ambiguous/);
    await expectProblem({ esr: '0' }, 'esr', /greater than zero/);
    await expectProblem({ esr: '0.3V' }, 'esr', /voltage, not a resistance/);
    // Absurdly small values (handbook quality.md, bad input): refused with the smallest accepted.
    await expectProblem({ esr: '1e-300' }, 'esr', /below .*the smallest resistance accepted/);
    await expectProblem({ q: '1e-300', q_freq: '100MHz' }, 'q', /below 0.1/);
    await expectProblem({ voltage_rating: '1e-300V' }, 'voltage_rating', /below .*the smallest voltage accepted/);
    await expectProblem({ kind: 'L', value: '12n', tolerance: '5%', current_rating: '1e-300A' }, 'current_rating', /below .*the smallest current accepted/);
  });
});

describe('quantity', () => {
  it('reads whole numbers from 0', async () => {
    const parts = await importRows(row({ part_number: 'q0', quantity: '0' }), row({ part_number: 'q1', quantity: '4000' }));
    expect([parts.get('q0')!.quantity, parts.get('q1')!.quantity]).toEqual([0, 4000]);
  });

  it('refuses negatives, fractions, thousands separators, words and blanks', async () => {
    await expectProblem({ quantity: '-1' }, 'quantity', /negative/);
    await expectProblem({ quantity: '2.5' }, 'quantity', /not a whole number/);
    await expectProblem({ quantity: '1,000' }, 'quantity', /thousands separator/);
    await expectProblem({ quantity: 'ten' }, 'quantity', /not a whole number/);
    await expectProblem({ quantity: '' }, 'quantity', /required/);
  });
});

describe('package, ratings, location, series, unit_cost, manufacturer_part, description', () => {
  it('reads them, with main as the default location and ratings in V and A', async () => {
    const parts = await importRows(
      row({ part_number: 'o1', package: '0603', voltage_rating: '50V', location: 'lab', series: 'e24', unit_cost: '0.0120', manufacturer_part: 'TW-C0603-4P7', description: 'C0G, "tight", 50 V\nsecond line' }),
      row({ part_number: 'o2', kind: 'L', value: '12n', tolerance: '5%', current_rating: '300mA', unit_cost: '.5' }),
      row({ part_number: 'o3', voltage_rating: '6.3 V', unit_cost: '0' }),
    );
    const o1 = parts.get('o1')!;
    expect([o1.package, o1.voltage_rating_v, o1.location, o1.series, o1.unit_cost, o1.manufacturer_part]).toEqual([
      '0603',
      50,
      'lab',
      'E24',
      '0.0120',
      'TW-C0603-4P7',
    ]);
    expect(o1.description).toBe('C0G, "tight", 50 V\nsecond line');
    const o2 = parts.get('o2')!;
    expect([o2.location, o2.current_rating_a, o2.voltage_rating_v, o2.unit_cost]).toEqual(['main', 0.3, null, '0.5000']);
    expect([parts.get('o3')!.voltage_rating_v, parts.get('o3')!.unit_cost]).toEqual([6.3, '0.0000']);
  });

  it('refuses ratings on the wrong kind, unknown series and malformed money', async () => {
    await expectProblem({ kind: 'L', value: '12n', tolerance: '5%', voltage_rating: '50V' }, 'voltage_rating', /for capacitors/);
    await expectProblem({ current_rating: '300mA' }, 'current_rating', /for inductors/);
    await expectProblem({ voltage_rating: '300mA' }, 'voltage_rating', /current, not a voltage/);
    await expectProblem({ series: 'E13' }, 'series', /not an IEC 60063 series/);
    await expectProblem({ unit_cost: '-1' }, 'unit_cost', /negative/);
    await expectProblem({ unit_cost: '1,25' }, 'unit_cost', /comma/);
    await expectProblem({ unit_cost: '$1' }, 'unit_cost', /not a decimal number/);
    await expectProblem({ unit_cost: '0.00001' }, 'unit_cost', /more than 4 decimal places/);
    await expectProblem({ package: '0402-extra-long-x' }, 'package', /at most 16/);
  });

  it('warns, without refusing, when a value is not a member of the series the row names', async () => {
    // IEC 60063: E12 has 3.9 and 4.7 but not 4.3 (4.3 is an E24 value); E96 has 4.75 but not 4.7.
    const res = await uploadStock(
      t.app,
      stores.token,
      csvFile(FULL_HEADER, row({ part_number: 'e1', value: '4.3pF', series: 'E12' }), row({ part_number: 'e2', value: '4.3pF', series: 'E24' }), row({ part_number: 'e3', value: '4.7pF', series: 'E96' })),
    );
    expect(res.status).toBe(200);
    expect(res.body.created).toBe(3);
    const seriesWarnings = res.body.warnings.filter((w: { column: string }) => w.column === 'value');
    expect(seriesWarnings.map((w: { line: number }) => w.line)).toEqual([2, 4]);
    // Nearest by log distance: ln(4.7/4.3) < ln(4.3/3.9); ln(4.75/4.7) < ln(4.7/4.64).
    expect(seriesWarnings[0].message).toMatch(/4.3 pF is not an E12 value \(the nearest E12 value is 4.7 pF\)/);
    expect(seriesWarnings[1].message).toMatch(/4.7 pF is not an E96 value \(the nearest E96 value is 4.75 pF\)/);
  });
});

describe('header', () => {
  it('reads names in any case with space, _ and - alike, and warns about unknown columns', async () => {
    const file = csvFile('Part Number,KIND,Value,tolerance,Q-Freq,q,Unit_Cost,Colour,  QUANTITY ', 'h1,C,1p0,B,500 MHz,60,0.01,blue,7');
    const res = await uploadStock(t.app, stores.token, file);
    expect(res.status).toBe(200);
    expect(res.body.warnings).toEqual([expect.objectContaining({ line: 1, column: 'Colour', message: expect.stringMatching(/unknown column "Colour" is ignored/) })]);
    const [part] = await storedParts(t.sequelize);
    expect([part.part_number, part.value_si, part.q, part.q_frequency_hz, part.unit_cost]).toEqual(['h1', 1e-12, 60, 500e6, '0.0100']);
  });

  it('refuses a file without a required column or with a column twice, naming it on line 1', async () => {
    const missing = await uploadStock(t.app, stores.token, csvFile('part_number,kind,value,quantity', 'a,C,1p,5'), { skipInvalid: true });
    expect(missing.status).toBe(422);
    expect(missing.body.rejected).toEqual([expect.objectContaining({ line: 1, column: 'tolerance', message: expect.stringMatching(/no tolerance column/) })]);
    const twice = await uploadStock(t.app, stores.token, csvFile('part_number,kind,value,tolerance,quantity,Quantity', 'a,C,1p,B,5,6'));
    expect(twice.status).toBe(422);
    expect(twice.body.rejected[0]).toMatchObject({ line: 1, column: 'quantity' });
    expect(await storedParts(t.sequelize)).toEqual([]);
  });
});
