import { type MatchFormValue, controlOfRequestField, readForm, readImpedance, readMeasuredFile, readQuantity, requestProblems, solveRequestOf } from './field-reading.js';

/** A two-point measured load, Z data in ohm (Touchstone 2.0 keywords): 10 - j40 at 860 MHz, 14 - j30 at 880 MHz. */
const MEASURED = {
  fileName: 'ant.s1p',
  text: ['[Version] 2.0', '# MHz Z RI R 50', '[Number of Ports] 1', '[Number of Frequencies] 2', '[Network Data]', '860 10 -40', '880 14 -30', '[End]'].join('\n'),
};

const FILLED: MatchFormValue = {
  source: '50',
  load: '12-j35',
  sourceFile: null,
  loadFile: null,
  frequency: '868MHz',
  band: '',
  power: '',
  quantity: 1,
  combinations: false,
  objective: 'worst-case',
  location: '',
};

describe('readImpedance', () => {
  it('reads the accepted complex forms as ohms', () => {
    expect(readImpedance('12-j35', 'load')).toEqual({ kind: 'value', shown: '12 - j35 Ω' });
    expect(readImpedance('12 - 35j', 'load')).toEqual({ kind: 'value', shown: '12 - j35 Ω' });
    expect(readImpedance('50', 'source')).toEqual({ kind: 'value', shown: '50 Ω' });
    expect(readImpedance('  ', 'source')).toEqual({ kind: 'empty' });
  });

  it('gives the engine message, without the field prefix, for text it cannot read', () => {
    const reading = readImpedance('12-j3x', 'load');
    expect(reading.kind).toBe('problem');
    const message = reading.kind === 'problem' ? reading.message : '';
    expect(message).toContain('"12-j3x"');
    expect(message).toContain('write it like');
    expect(message.startsWith('load:')).toBe(false);
  });
});

describe('readQuantity', () => {
  it('reads frequencies and powers in engineering notation', () => {
    expect(readQuantity('868MHz', 'frequency', 'frequencyHz')).toEqual({ kind: 'value', shown: '868 MHz' });
    expect(readQuantity('2.45 GHz', 'frequency', 'frequencyHz')).toEqual({ kind: 'value', shown: '2.45 GHz' });
    expect(readQuantity('100mW', 'power', 'powerW')).toEqual({ kind: 'value', shown: '100 mW' });
  });

  it('says "mhz" is ambiguous rather than reading millihertz', () => {
    const reading = readQuantity('868mhz', 'frequency', 'frequencyHz');
    expect(reading.kind === 'problem' && reading.message).toContain('ambiguous');
  });
});

describe('requestProblems', () => {
  it('finds nothing wrong with a complete request', () => {
    expect(requestProblems(FILLED)).toEqual({});
  });

  it('refuses a load whose resistance is not above 0 Ω', () => {
    expect(requestProblems({ ...FILLED, load: '-5+j3' }).load).toContain('must be greater than 0 Ω');
  });

  it('asks for a band when the objective is the band', () => {
    expect(requestProblems({ ...FILLED, objective: 'band' }).band).toContain('needs a bandwidth');
    expect(requestProblems({ ...FILLED, objective: 'band', band: '10MHz' })).toEqual({});
  });

  it('asks for a build quantity when it is blank, and a whole one when it is not', () => {
    expect(requestProblems({ ...FILLED, quantity: null }).quantity).toContain('how many boards');
    expect(requestProblems({ ...FILLED, quantity: 2.5 }).quantity).toContain('whole number');
  });

  it('lets the request-wide problem win over the field reading', () => {
    const readings = readForm({ ...FILLED, source: '0+j50' });
    expect(readings.source?.kind).toBe('problem');
  });
});

describe('solveRequestOf', () => {
  it('sends text as typed and leaves blank optional fields out', () => {
    expect(solveRequestOf({ ...FILLED, load: ' 12 - 35j ' })).toEqual({
      source: '50',
      load: '12 - 35j',
      frequencyHz: '868MHz',
      buildQuantity: 1,
      combinations: false,
      objective: 'worst-case',
    });
    expect(solveRequestOf({ ...FILLED, band: '10MHz', power: '0.5W', location: 'Shelf B' })).toMatchObject({
      bandwidthHz: '10MHz',
      powerW: '0.5W',
      location: 'Shelf B',
    });
  });
});

describe('controlOfRequestField', () => {
  it('maps request fields to form controls', () => {
    expect(controlOfRequestField('frequencyHz')).toBe('frequency');
    expect(controlOfRequestField('bandwidthHz')).toBe('band');
    expect(controlOfRequestField('load.re')).toBe('load');
    expect(controlOfRequestField('fitsPerNetwork')).toBeNull();
    expect(controlOfRequestField(undefined)).toBeNull();
  });
});

describe('a measured load file', () => {
  it('reads as its points and range, and the impedance at f0 interpolated (hand: t = 0.4, 11.6 - j36)', () => {
    expect(readMeasuredFile(MEASURED, 'loadTouchstone', '868MHz')).toEqual({ kind: 'value', shown: '2 points, 860 MHz to 880 MHz; 11.6 - j36 Ω at 868 MHz' });
    expect(readMeasuredFile(MEASURED, 'loadTouchstone', '')).toEqual({ kind: 'value', shown: '2 points, 860 MHz to 880 MHz' });
  });

  it('says which line of the file is wrong', () => {
    const reading = readMeasuredFile({ fileName: 'bad.s1p', text: MEASURED.text.replace('880 14', '850 14') }, 'loadTouchstone', '868MHz');
    expect(reading.kind).toBe('problem');
    expect(reading.kind === 'problem' && reading.message).toMatch(/"bad\.s1p" line 7/);
  });

  it('goes in the request in place of the typed load, and its problems show under the load and the frequency', () => {
    const value = { ...FILLED, load: 'ignored', loadFile: MEASURED };
    const request = solveRequestOf(value);
    expect(request.load).toBeUndefined();
    expect(request.loadTouchstone).toEqual(MEASURED);
    expect(controlOfRequestField('loadTouchstone.text')).toBe('load');
    expect(requestProblems({ ...value, frequency: '915MHz' }).frequency).toMatch(/outside the measured data \(860 MHz to 880 MHz\)/);
  });
});
