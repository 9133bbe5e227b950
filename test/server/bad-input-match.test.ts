/**
 * Malformed match requests at scale (handbook quality.md "Bad input, faults and intruders"; the
 * request is api.md "Matches"): 1,000 solve requests, each a valid request with one to three
 * fields broken (wrong types, missing or null required fields, NaN and Infinity as strings,
 * negative or zero resistance, absurd frequencies, wrong units, unknown fields, huge strings,
 * deep nesting) or a broken body (not an object, not JSON, the wrong content type, over the 1 MB
 * limit). fast-check draws them from a fixed seed, so every run sends the same requests.
 *
 * Every answer: never 5xx; a field problem is a 400 `invalid_input` whose details name each broken
 * field (the field path, e.g. `source` or `loadTouchstone.text`) and no field that was not broken;
 * a body that is not JSON is a 400 `invalid_json`, one over the limit a 413. One in five is also
 * sent to `POST /api/matches` inside a valid envelope, and the matches table (and the audit trail)
 * never grows. The valid requests the breaks start from are solved and saved first, so every
 * refusal is the break's doing.
 *
 * The set of fields is read from what the request has today (source, load, their measured-file
 * forms, frequency, band, power and the options); names used as unknown fields are ones no
 * version of the request will take (they carry a `zz` or are JavaScript's own property names).
 */
import { readFileSync } from 'node:fs';
import { createServer, type Server } from 'node:http';
import { join } from 'node:path';
import { gzipSync } from 'node:zlib';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import fc from 'fast-check';
import { QueryTypes } from 'sequelize';
import { startTestApp, type TestApp } from '../support/test-app.js';

const SEED = 0x3a7c4;
const REQUESTS = 1000;
/** Every SAVE_EVERY-th request is also sent to POST /api/matches. */
const SAVE_EVERY = 5;
const BATCH = 20;
/** express.json's limit in server/app.ts. */
const BODY_LIMIT_BYTES = 1024 * 1024;

const ROOT = join(import.meta.dirname, '..', '..');
const ANTENNA = readFileSync(join(ROOT, 'seeds', 'measured', 'tarnwick-868-chip-antenna.s1p'), 'utf8');

type Body = Record<string, unknown>;

/** Valid requests of the demo scenario (868 MHz chip antenna, 2.45 GHz link, a 100 MHz real-to-real match). */
const BASES: Body[] = [
  { source: 50, load: '12-j35', frequencyHz: '868MHz' },
  { source: { re: 50, im: 0 }, load: { re: 12.5, im: 0 }, frequencyHz: 100e6, objective: 'nominal', fitsPerNetwork: 5, combinations: true },
  {
    source: '50',
    load: '25+j10',
    frequencyHz: '2.45 GHz',
    bandwidthHz: '80MHz',
    objective: 'band',
    powerW: '100mW',
    buildQuantity: 10,
    location: 'main',
    usableSrfFraction: 0.5,
    excludeAboveLimit: true,
  },
  { source: 50, loadTouchstone: { fileName: 'tarnwick-868-chip-antenna.s1p', text: ANTENNA }, frequencyHz: '868MHz', bandwidthHz: '10MHz' },
];

/** An object nested `depth` levels under `re`. */
function deep(depth: number): unknown {
  let value: unknown = 1;
  for (let i = 0; i < depth; i += 1) value = { re: value, im: 0 };
  return value;
}

/** Values no impedance field takes. */
const NOT_IMPEDANCE: unknown[] = [
  true, false, [], [50, 0], {}, { re: 'x', im: 0 }, { re: 50, im: '3' }, { im: 5 }, { re: -5, im: 0 }, { re: 0, im: 10 }, { re: null, im: 0 },
  'abc', '', '   ', 'NaN', 'Infinity', '-Infinity', '1e309', '50+j', 'j', '50+j10+j3', '50,5', '50 ohm ohm', '∞',
  -50, 0, -1e-9, 1e300, -0, 1e-300, '0', '-50', '0+j10', '-5-j3', '0-j0', '1e10', '50 V', '50pF',
];
/** Values no frequency field takes (a frequency must be finite, from 1 Hz to 1 THz). */
const NOT_FREQUENCY: unknown[] = [
  0, -1, -868e6, 1e30, 1e13, 0.5, 1e-300, 'NaN', 'Infinity', '-Infinity', '1e309', '0Hz', '-868MHz', '868 MHz MHz', '868MV', '868pF', '868 ohm',
  '', ' ', 'abc', '1THzz', '2THz', '868,5MHz', true, false, [], [868e6], {}, { value: 868e6 }, '0x10', '1_000', '∞', '868e', 'MHz',
];
const NOT_BANDWIDTH: unknown[] = [-1, -10e6, 'NaN', 'Infinity', '1e309', '-10MHz', '10pF', '10 V', 'abc', '', true, [], {}, '10,5MHz'];
const NOT_POWER: unknown[] = [-1, -0.1, 'NaN', 'Infinity', '1e309', '-100mW', '1e300W', '5V', '100mA', 'loud', '', true, [], {}, 1e12];
const NOT_COUNT = (max: number): unknown[] => [0, -1, 1.5, max + 1, 1e300, '3', '', 'NaN', true, [], {}, -0.5, 2 ** 53 + 2];
const NOT_FLAG: unknown[] = ['true', 'false', 1, 0, 'yes', '', [], {}, [true]];
const NOT_OBJECTIVE: unknown[] = ['best', '', 'Nominal', 'WORST-CASE', 'worst case', 1, true, [], {}, ['nominal']];
const NOT_LOCATION: unknown[] = ['', '   ', 'x'.repeat(65), 5, true, [], {}, ['main']];
const NOT_FRACTION: unknown[] = [0, -0.1, 1.5, 2, '0.5', 'NaN', true, [], {}, 1e300];
const NOT_MEASURED: unknown[] = [
  'text of a file', 5, true, [], { text: '' }, { text: '   ' }, { fileName: 'x.s1p' }, { text: 5 }, { text: ANTENNA, fileName: 7 },
  { text: ANTENNA, extra: 1 }, { text: 'not touchstone at all' }, { text: '# MHz S MA R 50\n868 abc def\n' }, { text: '# GHz Z RI R 50\n0.868 -5 -35\n' },
  { text: ANTENNA.replace(/^# MHz S MA R 50$/m, '# MHz S MA R 50\n! two option lines\n# MHz S MA R 50') },
];
/** Names no solve request takes: misspellings with a marker, and JavaScript's own property names. */
const UNKNOWN_NAMES = ['zzFrequency', 'freqZz', 'zz_load', 'zzsourceImpedance', 'FREQUENCYHZ', 'frequencyHz ', ' source', 'Source', 'LOAD', '__proto__', 'constructor', 'prototype', 'toString', 'hasOwnProperty', 'zz.dotted', 'zz[0]', '', 'zz\u0000nul', 'zz😀'];

/** A break of one field: what to write there and which field paths must be named. */
interface FieldBreak {
  field: string;
  /** The value written, or `delete` to leave the field out. */
  value: unknown;
  /** Top-level names any of which the details must name for this break. */
  names: string[];
  /** The break is a problem only when the request is otherwise as in the base (it is relative to other fields). */
  alone?: boolean;
}

const pick = <T>(values: readonly T[]) => fc.nat({ max: values.length - 1 }).map((i) => values[i]);

/** Breaks that apply to base `b`. */
function breaksFor(b: Body): fc.Arbitrary<FieldBreak> {
  const typed = (name: 'source' | 'load') => b[name] !== undefined;
  const options: fc.Arbitrary<FieldBreak>[] = [
    pick(NOT_IMPEDANCE).map((value) => ({ field: 'source', value, names: ['source'] })),
    pick(NOT_FREQUENCY).map((value) => ({ field: 'frequencyHz', value, names: ['frequencyHz'] })),
    fc.constantFrom('delete', null).map((value) => ({ field: 'source', value, names: ['source'] })),
    fc.constantFrom('delete', null).map((value) => ({ field: 'frequencyHz', value, names: ['frequencyHz'] })),
    pick(NOT_BANDWIDTH).map((value) => ({ field: 'bandwidthHz', value, names: ['bandwidthHz'] })),
    pick(NOT_POWER).map((value) => ({ field: 'powerW', value, names: ['powerW'] })),
    pick(NOT_COUNT(1_000_000)).map((value) => ({ field: 'buildQuantity', value, names: ['buildQuantity'] })),
    pick(NOT_COUNT(50)).map((value) => ({ field: 'fitsPerNetwork', value, names: ['fitsPerNetwork'] })),
    pick(NOT_FLAG).map((value) => ({ field: 'combinations', value, names: ['combinations'] })),
    pick(NOT_FLAG).map((value) => ({ field: 'excludeAboveLimit', value, names: ['excludeAboveLimit'] })),
    pick(NOT_OBJECTIVE).map((value) => ({ field: 'objective', value, names: ['objective'] })),
    pick(NOT_LOCATION).map((value) => ({ field: 'location', value, names: ['location'] })),
    pick(NOT_FRACTION).map((value) => ({ field: 'usableSrfFraction', value, names: ['usableSrfFraction'] })),
    fc.tuple(pick(UNKNOWN_NAMES), fc.jsonValue({ maxDepth: 2 })).map(([name, value]) => ({ field: name, value, names: [name] })),
    fc.integer({ min: 2, max: 2000 }).map((depth) => ({ field: 'source', value: deep(depth), names: ['source'] })),
    fc.integer({ min: 1000, max: 400_000 }).map((n) => ({ field: 'source', value: '5'.repeat(n) + 'x', names: ['source'] })),
    fc.integer({ min: 1000, max: 400_000 }).map((n) => ({ field: 'zzPadding', value: 'p'.repeat(n), names: ['zzPadding'] })),
    fc.string({ unit: 'grapheme', maxLength: 30 }).filter((s) => !/\d/.test(s)).map((value) => ({ field: 'frequencyHz', value, names: ['frequencyHz'] })),
    // Relative to other fields: a band reaching below 1 Hz, the band objective with no band.
    fc.constant({ field: 'bandwidthHz', value: '5GHz', names: ['bandwidthHz'], alone: true }),
  ];
  if (typed('load')) {
    options.push(pick(NOT_IMPEDANCE).map((value) => ({ field: 'load', value, names: ['load'] })));
    options.push(fc.constantFrom('delete', null).map((value) => ({ field: 'load', value, names: ['load'] })));
    options.push(pick(NOT_MEASURED).map((value) => ({ field: 'loadTouchstone', value, names: ['loadTouchstone'] })));
    options.push(fc.constant({ field: 'sourceTouchstone', value: { fileName: 'a.s1p', text: ANTENNA }, names: ['sourceTouchstone'], alone: true }));
  } else {
    options.push(pick(NOT_MEASURED).map((value) => ({ field: 'loadTouchstone', value, names: ['loadTouchstone'] })));
    options.push(fc.constant({ field: 'loadTouchstone', value: 'delete', names: ['load'] }));
    options.push(fc.constant({ field: 'load', value: 50, names: ['loadTouchstone'], alone: true }));
  }
  // The band objective with no band (relative too: a broken objective falls back to worst-case).
  if (b.objective === 'band') options.push(fc.constant({ field: 'bandwidthHz', value: 'delete', names: ['bandwidthHz'], alone: true }));
  else if (b.bandwidthHz === undefined) options.push(fc.constant({ field: 'objective', value: 'band', names: ['bandwidthHz'], alone: true }));
  return fc.oneof(...options);
}

/** A whole-body break: what is sent, and how it must be answered. */
interface BodyBreak {
  kind: 'body';
  label: string;
  contentType: string | null;
  payload: string | Buffer;
  /** `required`: the body reads as an empty object, so the required fields are named. */
  expect: 'invalid_json' | 'body' | 'too_large' | 'required' | 'source' | 'unsupported_charset' | 'unsupported_encoding' | 'invalid_body';
  contentEncoding?: string;
}

interface FieldCase {
  kind: 'fields';
  base: number;
  breaks: FieldBreak[];
}

type MatchCase = FieldCase | BodyBreak;

const base0 = JSON.stringify(BASES[0]);
const BODY_BREAKS: BodyBreak[] = [
  { kind: 'body', label: 'array', contentType: 'application/json', payload: '[]', expect: 'body' },
  { kind: 'body', label: 'array of the request', contentType: 'application/json', payload: `[${base0}]`, expect: 'body' },
  { kind: 'body', label: 'JSON string', contentType: 'application/json', payload: '"868MHz"', expect: 'invalid_json' },
  { kind: 'body', label: 'JSON number', contentType: 'application/json', payload: '42', expect: 'invalid_json' },
  { kind: 'body', label: 'JSON null', contentType: 'application/json', payload: 'null', expect: 'invalid_json' },
  { kind: 'body', label: 'JSON true', contentType: 'application/json', payload: 'true', expect: 'invalid_json' },
  { kind: 'body', label: 'cut short', contentType: 'application/json', payload: base0.slice(0, -5), expect: 'invalid_json' },
  { kind: 'body', label: 'single quotes', contentType: 'application/json', payload: base0.replace(/"/g, "'"), expect: 'invalid_json' },
  { kind: 'body', label: 'bare NaN', contentType: 'application/json', payload: '{"source": 50, "load": 12, "frequencyHz": NaN}', expect: 'invalid_json' },
  { kind: 'body', label: 'bare Infinity', contentType: 'application/json', payload: '{"source": Infinity, "load": 12, "frequencyHz": 1e8}', expect: 'invalid_json' },
  { kind: 'body', label: 'trailing comma', contentType: 'application/json', payload: '{"source": 50, "load": 12, "frequencyHz": 1e8,}', expect: 'invalid_json' },
  { kind: 'body', label: 'comment', contentType: 'application/json', payload: '{"source": 50, /* ohm */ "load": 12, "frequencyHz": 1e8}', expect: 'invalid_json' },
  { kind: 'body', label: 'empty JSON', contentType: 'application/json', payload: '', expect: 'required' },
  { kind: 'body', label: '{}', contentType: 'application/json', payload: '{}', expect: 'required' },
  { kind: 'body', label: 'array nested 2000 deep', contentType: 'application/json', payload: '['.repeat(2000) + ']'.repeat(2000), expect: 'body' },
  { kind: 'body', label: 'source nested 3000 deep', contentType: 'application/json', payload: `{"source":${'{"re":'.repeat(3000)}1${'}'.repeat(3000)},"load":12,"frequencyHz":1e8}`, expect: 'source' },
  { kind: 'body', label: 'text/plain', contentType: 'text/plain', payload: base0, expect: 'body' },
  { kind: 'body', label: 'form-encoded', contentType: 'application/x-www-form-urlencoded', payload: 'source=50&load=12-j35&frequencyHz=868MHz', expect: 'body' },
  { kind: 'body', label: 'multipart', contentType: 'multipart/form-data; boundary=zz', payload: '--zz\r\nContent-Disposition: form-data; name="source"\r\n\r\n50\r\n--zz--\r\n', expect: 'body' },
  { kind: 'body', label: 'XML', contentType: 'application/xml', payload: '<solve><source>50</source></solve>', expect: 'body' },
  { kind: 'body', label: 'no content type', contentType: null, payload: base0, expect: 'body' },
  { kind: 'body', label: 'over 1 MB', contentType: 'application/json', payload: JSON.stringify({ ...BASES[0], location: 'x'.repeat(BODY_LIMIT_BYTES + 10) }), expect: 'too_large' },
  { kind: 'body', label: 'over 1 MB of whitespace', contentType: 'application/json', payload: ' '.repeat(BODY_LIMIT_BYTES + 1) + base0, expect: 'too_large' },
  // Bytes that are not UTF-8 inside a string become U+FFFD, so the field holding them is refused.
  { kind: 'body', label: 'not UTF-8', contentType: 'application/json; charset=utf-8', payload: Buffer.concat([Buffer.from('{"source": "5'), Buffer.from([0xff, 0xfe]), Buffer.from('0", "load": 12, "frequencyHz": 1e8}')]), expect: 'source' },
  { kind: 'body', label: 'gzip of a broken field', contentType: 'application/json', contentEncoding: 'gzip', payload: gzipSync(JSON.stringify({ ...BASES[0], source: 'fifty' })), expect: 'source' },
  { kind: 'body', label: 'gzip of broken JSON', contentType: 'application/json', contentEncoding: 'gzip', payload: gzipSync(base0.slice(0, -3)), expect: 'invalid_json' },
  { kind: 'body', label: 'gzip of over 1 MB', contentType: 'application/json', contentEncoding: 'gzip', payload: gzipSync(' '.repeat(20 * BODY_LIMIT_BYTES) + base0), expect: 'too_large' },
  // Bodies body-parser cannot read: 415 for a charset or encoding it does not take, 400 for a body that does not inflate.
  { kind: 'body', label: 'unknown charset', contentType: 'application/json; charset=ebcdic', payload: base0, expect: 'unsupported_charset' },
  { kind: 'body', label: 'ISO-8859-1 charset', contentType: 'application/json; charset=iso-8859-1', payload: base0, expect: 'unsupported_charset' },
  { kind: 'body', label: 'unknown encoding', contentType: 'application/json', contentEncoding: 'compress', payload: base0, expect: 'unsupported_encoding' },
  { kind: 'body', label: 'gzip that is not', contentType: 'application/json', contentEncoding: 'gzip', payload: 'not gzip at all', expect: 'invalid_body' },
  // Nesting too deep for JSON.stringify: the answer must still be JSON, with the value summarised.
  { kind: 'body', label: 'array nested 100k deep', contentType: 'application/json', payload: '['.repeat(100_000) + ']'.repeat(100_000), expect: 'body' },
  { kind: 'body', label: 'source nested 20k deep', contentType: 'application/json', payload: `{"source":${'{"re":'.repeat(20_000)}1${'}'.repeat(20_000)},"load":12,"frequencyHz":1e8}`, expect: 'source' },
];


const caseArb: fc.Arbitrary<MatchCase> = fc.oneof(
  { weight: 19, arbitrary: fc.nat({ max: BASES.length - 1 }).chain((base) => fc.array(breaksFor(BASES[base]), { minLength: 1, maxLength: 3 }).map((breaks): MatchCase => ({ kind: 'fields', base, breaks }))) },
  { weight: 1, arbitrary: pick(BODY_BREAKS) },
);

/** The body of a field case, and the top-level names that must be named (one set per break). */
function buildBody(c: FieldCase): { body: Body; required: string[][]; allowed: Set<string> } {
  const body: Body = structuredClone(BASES[c.base]);
  // A relative break counts only alone; with others it could be hidden by them, so leave it out.
  const breaks = c.breaks.length > 1 ? c.breaks.filter((b) => !b.alone) : c.breaks;
  const used = breaks.length > 0 ? breaks : [c.breaks[0]];
  // Later breaks of the same field replace earlier ones.
  const last = new Map(used.map((b) => [b.field, b]));
  for (const b of last.values()) {
    if (b.value === 'delete') delete body[b.field];
    else Object.defineProperty(body, b.field, { value: b.value, enumerable: true, writable: true, configurable: true });
  }
  const allowed = new Set([...last.values()].flatMap((b) => b.names));
  // With a measured load file given (even a broken one), the typed load is not read: a missing one is
  // no problem, and a broken one is covered by the "either, not both" problem on loadTouchstone.
  if (body.loadTouchstone != null && last.has('loadTouchstone')) last.delete('load');
  const required = [...last.values()].map((b) => b.names);
  // A band is checked around the frequency, so a broken frequency may also make the band reach outside 1 Hz to 1 THz.
  if (allowed.has('frequencyHz') && body.bandwidthHz !== undefined) allowed.add('bandwidthHz');
  return { body, required, allowed };
}

/** The top-level name of a detail's field path (`loadTouchstone.text` -> `loadTouchstone`). */
function topName(field: string, known: Set<string>): string {
  if (known.has(field)) return field;
  const dot = field.indexOf('.');
  return dot > 0 ? field.slice(0, dot) : field;
}

let t: TestApp;
let server: Server;
let designer: { id: number; token: string };

async function count(table: string): Promise<number> {
  const [{ n }] = await t.sequelize.query<{ n: string }>(`SELECT count(*) AS n FROM ${table}`, { type: QueryTypes.SELECT });
  return Number(n);
}

function sendSolve(payload: string | Buffer, contentType: string | null, contentEncoding?: string): request.Test {
  let req = request(server).post('/api/matches/solve').set('Authorization', `Bearer ${designer.token}`);
  if (contentType) req = req.set('Content-Type', contentType);
  if (contentEncoding) req = req.set('Content-Encoding', contentEncoding);
  // Bytes as they are (superagent would otherwise write a Buffer as JSON).
  return req.serialize((body: unknown) => body as string).send(payload as string);
}

function sendSave(requestBody: unknown): request.Test {
  return request(server)
    .post('/api/matches')
    .set('Authorization', `Bearer ${designer.token}`)
    .set('Content-Type', 'application/json')
    .send(JSON.stringify({ name: 'malformed', request: requestBody, chosen: { placement: 'shunt-at-source', solution: 1, rank: 1 } }));
}

beforeAll(async () => {
  t = await startTestApp();
  designer = await t.addUser('designer');
  const stores = await t.addUser('stores');
  server = createServer(t.app);
  await new Promise<void>((ready) => server.listen(0, '127.0.0.1', () => ready()));
  const stock = await request(server).post('/api/stock/imports').set('Authorization', `Bearer ${stores.token}`).attach('file', readFileSync(join(ROOT, 'seeds', 'demo-stock.csv')), 'demo-stock.csv');
  expect(stock.status).toBe(200);
});
afterAll(async () => {
  server?.closeAllConnections();
  await new Promise<void>((done) => (server ? server.close(() => done()) : done()));
  await t?.close();
});

describe('1,000 malformed match requests', () => {
  it('solves and saves each valid request the breaks start from', async () => {
    for (const base of BASES) {
      const res = await sendSolve(JSON.stringify(base), 'application/json');
      expect(res.status, JSON.stringify(res.body).slice(0, 400)).toBe(200);
      expect(Array.isArray(res.body.networks)).toBe(true);
    }
    // A save of a valid request does grow the table (so the count below can see a save).
    const before = await count('matches');
    const network = (await sendSolve(JSON.stringify(BASES[1]), 'application/json')).body.networks.find((n: { fits: unknown[] }) => n.fits.length > 0);
    expect(network).toBeDefined();
    const saved = await request(server)
      .post('/api/matches')
      .set('Authorization', `Bearer ${designer.token}`)
      .send({ name: 'valid', request: BASES[1], chosen: { placement: network.placement, solution: network.solution, rank: 1 } });
    expect(saved.status, JSON.stringify(saved.body).slice(0, 400)).toBe(201);
    expect(await count('matches')).toBe(before + 1);
  });

  it('never answers 5xx, answers 400 naming each broken field and only those, and saves nothing', async () => {
    // Every whole-body break once, then the seeded sample.
    const cases: MatchCase[] = [...BODY_BREAKS, ...fc.sample(caseArb, { seed: SEED, numRuns: REQUESTS - BODY_BREAKS.length })];
    const matchesBefore = await count('matches');
    const auditBefore = await count('audit_entries');
    const failures: string[] = [];
    const tally: Record<string, number> = {};
    const namedFields = new Set<string>();

    const check = (i: number, route: 'solve' | 'save', c: MatchCase, res: request.Response, built: ReturnType<typeof buildBody> | null) => {
      const fail = (why: string): void => void failures.push(`#${i} ${route} ${c.kind === 'body' ? c.label : JSON.stringify(c.breaks.map((b) => ({ field: b.field, value: typeof b.value === 'string' && b.value.length > 40 ? `${b.value.length} chars` : b.value })))?.slice(0, 300)}: ${why}`);
      tally[`${route} ${res.status}`] = (tally[`${route} ${res.status}`] ?? 0) + 1;
      if (res.status >= 500) return fail(`answered ${res.status}: ${res.text.slice(0, 300)}`);
      const error = res.body?.error;
      if (typeof error?.message !== 'string' || error.message.length < 10) return fail(`answered ${res.status} without an error message: ${res.text.slice(0, 200)}`);
      if (c.kind === 'body') {
        const want =
          c.expect === 'invalid_json' ? [400, 'invalid_json']
          : c.expect === 'too_large' ? [413, 'too_large']
          : c.expect === 'unsupported_charset' || c.expect === 'unsupported_encoding' ? [415, c.expect]
          : c.expect === 'invalid_body' ? [400, 'invalid_body']
          : [400, 'invalid_input'];
        if (res.status !== want[0] || error.code !== want[1]) return fail(`expected ${want.join(' ')}, got ${res.status} ${error.code}: ${error.message}`);
        const fields = (error.details ?? []).map((d: { field: string }) => d.field);
        const named = { body: ['body'], required: ['source', 'frequencyHz'], source: ['source'] }[c.expect as 'body'];
        if (named && !named.every((f) => fields.includes(f))) fail(`details do not name ${named.join(' and ')}: ${JSON.stringify(fields)}`);
        if (c.expect === 'invalid_json' && !/JSON/.test(error.message)) fail(`the message does not say the body is not JSON: ${error.message}`);
        return;
      }
      if (res.status !== 400 || error.code !== 'invalid_input') return fail(`expected 400 invalid_input, got ${res.status} ${error.code}: ${error.message.slice(0, 200)}`);
      const details = error.details as { field: string; message: string }[] | undefined;
      if (!Array.isArray(details) || details.length === 0) return fail('a 400 without details');
      const { required, allowed } = built!;
      const prefix = route === 'save' ? 'request.' : '';
      const names = details.map((d) => {
        if (typeof d.field !== 'string' || typeof d.message !== 'string' || d.message === '') fail(`a detail without field or message: ${JSON.stringify(d)}`);
        // On the save route the request sits under `request`, and every detail says so.
        if (route === 'save' && !d.field.startsWith(prefix)) fail(`a save detail names ${JSON.stringify(d.field)}, not a field under request.`);
        const field = route === 'save' ? d.field.slice(prefix.length) : d.field;
        namedFields.add(d.field);
        return topName(field, allowed);
      });
      for (const set of required) if (!set.some((name) => names.includes(name))) fail(`no detail names ${set.join(' or ')}: ${JSON.stringify(details.map((d) => d.field))}`);
      for (const name of names) if (!allowed.has(name)) fail(`a detail names ${JSON.stringify(name)}, which was not broken (broken: ${[...allowed].join(', ')})`);
    };

    for (let at = 0; at < cases.length; at += BATCH) {
      const batch = cases.slice(at, at + BATCH).map((c, k) => ({ c, i: at + k, built: c.kind === 'fields' ? buildBody(c) : null }));
      const solveAnswers = await Promise.all(batch.map(({ c, built }) => (c.kind === 'body' ? sendSolve(c.payload, c.contentType, c.contentEncoding) : sendSolve(JSON.stringify(built!.body), 'application/json'))));
      batch.forEach((b, k) => check(b.i, 'solve', b.c, solveAnswers[k], b.built));
      const saves = batch.filter((b) => b.i % SAVE_EVERY === 0 && b.c.kind === 'fields');
      const saveAnswers = await Promise.all(saves.map((b) => sendSave(b.built!.body)));
      saves.forEach((b, k) => check(b.i, 'save', b.c, saveAnswers[k], b.built));
      if (failures.length > 20) break;
    }
    expect(failures.slice(0, 20)).toEqual([]);
    expect(await count('matches')).toBe(matchesBefore);
    expect(await count('audit_entries')).toBe(auditBefore);
    // The run reached what it set out to: field problems on both routes and every body outcome.
    expect(tally['solve 400']).toBeGreaterThan(900);
    expect(tally['solve 413']).toBeGreaterThan(0);
    expect(tally['save 400']).toBeGreaterThan(150);
    for (const field of ['source', 'load', 'frequencyHz', 'bandwidthHz', 'powerW', 'objective', 'loadTouchstone.text', 'zzPadding']) expect(namedFields.has(field), field).toBe(true);
    for (const field of ['request.source', 'request.frequencyHz']) expect(namedFields.has(field), field).toBe(true);
  }, 300_000);
});
