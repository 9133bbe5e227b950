/**
 * Bad Touchstone files: each gets its own TouchstoneError naming the line (1-based, as an editor
 * counts) and saying what is wrong. The rules broken are those of the Touchstone File Format
 * Specification Version 2.0 (IBIS Open Forum, 2009): option line fields and defaults ("Option
 * Line"), one data line per frequency for 1- and 2-ports and increasing frequencies ("Network
 * Data"), keyword order and required keywords ("[Version]" to "[End]").
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { TouchstoneError, isTouchstoneError, readOnePortTouchstone, readTwoPortTouchstone } from '../../shared/touchstone/index.js';

const fixture = (name: string): string => readFileSync(new URL(`../fixtures/touchstone/${name}`, import.meta.url), 'utf8');

interface BadFile {
  what: string;
  text: string;
  ports?: 1 | 2;
  line: number;
  says: RegExp;
}

const v2 = (...lines: string[]): string => ['[Version] 2.0', ...lines].join('\n');

const BAD_FILES: BadFile[] = [
  { what: 'unknown option-line field', text: '! c\n# MHz S XY R 50\n1 0 0', line: 2, says: /bad option line: "XY" is not a frequency unit/ },
  { what: 'R without a value', text: '# MHz S MA R\n1 0 0', line: 1, says: /bad option line: "R" must be followed by the reference resistance/ },
  { what: 'R of zero ohms', text: '# MHz S MA R 0\n1 0 0', line: 1, says: /bad option line: reference resistance "0" must be a positive/ },
  { what: 'two frequency units', text: '# MHz GHz S MA\n1 0 0', line: 1, says: /bad option line: two frequency units/ },
  { what: 'THz, which Touchstone lacks', text: '# THz S MA\n1 0 0', line: 1, says: /"THz" is not a Touchstone frequency unit/ },
  { what: 'H-parameters (spec Example 11)', text: fixture('spec-example-11-v1-two-port-h-ma.s2p'), ports: 2, line: 3, says: /hybrid H-parameters\) is not read here/ },
  { what: 'a second option line', text: '# MHz S MA R 50\n1 0 0\n# GHz S RI\n2 0 0', line: 3, says: /a second option line \(the first is on line 1\)/ },
  { what: 'data before the option line', text: '! c\n1 0.5 0\n# MHz S MA', line: 2, says: /missing option line: data before the option line/ },
  { what: 'four values on a one-port line', text: '# MHz S MA\n1 0.5 0\n2 0.5 0 7', line: 3, says: /wrong column count: expected 3 values \(frequency and one pair\), found 4/ },
  { what: 'a lone value', text: '# MHz S MA\n1 0.5 0\n2', line: 3, says: /wrong column count: expected 3 values \(frequency and one pair\), found 1/ },
  { what: 'a 2-port file given as a one-port (spec Example 13)', text: fixture('spec-example-13-v1-two-port-s-ri.s2p'), line: 5, says: /more than one port: 9 values is a 2-port data line/ },
  { what: '[Number of Ports] 2 given as a one-port (spec Example 17)', text: fixture('spec-example-17-v2-two-port-s-ma-noise.s2p'), line: 6, says: /more than one port where one is expected: \[Number of Ports\] 2/ },
  { what: 'a one-port file given as a two-port', text: '# GHz S MA\n1 0.5 0', ports: 2, line: 2, says: /wrong column count: expected 9 values \(frequency and four pairs\), found 3/ },
  { what: 'a repeated frequency', text: '# MHz S MA\n1 0.5 0\n2 0.5 0\n2 0.5 0', line: 4, says: /non-increasing frequency: 2 MHz is not above the previous point 2 MHz \(line 3\)/ },
  { what: 'a falling frequency', text: '# kHz S MA\n5 0.5 0\n\n! gap\n4 0.5 0', line: 5, says: /non-increasing frequency: 4 kHz is not above the previous point 5 kHz \(line 2\)/ },
  { what: 'a negative frequency', text: '# MHz S MA\n-1 0.5 0', line: 2, says: /negative frequency -1/ },
  { what: 'a decimal comma', text: '# MHz S MA\n1 0,5 0', line: 2, says: /non-numeric value "0,5" \(value 2 of the data line\)/ },
  { what: 'a word among the numbers', text: '# MHz S MA\n1 0.5 0\n2 0.5 zero', line: 3, says: /non-numeric value "zero" \(value 3 of the data line\)/ },
  { what: 'a number beyond double range', text: '# MHz S MA\n1 1e999 0', line: 2, says: /value "1e999" \(value 2 of the data line\) is out of range/ },
  { what: 'an option line and no data', text: '! c\n# MHz S MA\n! nothing here\n', line: 3, says: /missing data: the option line \(line 2\) is not followed by any data line/ },
  { what: 'an empty file', text: '\n\n', line: 1, says: /missing data: the file has no option line and no data/ },
  { what: 'a version 2.0 keyword in a version 1 file', text: '# MHz S MA\n[Number of Ports] 1\n1 0 0', line: 2, says: /keyword \[Number of Ports\] in a version 1 file/ },
  { what: 'an unknown keyword', text: v2('# MHz S MA', '[Number of Ports] 1', '[Number of Frequencies] 1', '[Colour] blue', '[Network Data]', '1 0 0', '[End]'), line: 5, says: /unknown keyword "\[Colour\]"/ },
  { what: 'a keyword without its closing bracket', text: v2('# MHz S MA', '[Number of Ports 1'), line: 3, says: /keyword without a closing "\]"/ },
  { what: 'an unsupported [Version]', text: '[Version] 3.0\n# MHz S MA', line: 1, says: /\[Version\] 3.0 is not supported/ },
  { what: '[Version] not followed by the option line', text: v2('[Number of Ports] 1'), line: 2, says: /missing option line: \[Version\] \(line 1\) must be followed by the option line/ },
  { what: '[Number of Ports] missing after the option line', text: v2('# MHz S MA', '[Number of Frequencies] 1'), line: 3, says: /missing \[Number of Ports\]: it must follow the option line \(line 2\)/ },
  { what: '[Network Data] without [Number of Frequencies]', text: v2('# MHz S MA', '[Number of Ports] 1', '[Network Data]', '1 0 0', '[End]'), line: 4, says: /missing \[Number of Frequencies\]/ },
  { what: 'fewer data lines than declared', text: v2('# MHz S MA', '[Number of Ports] 1', '[Number of Frequencies] 3', '[Network Data]', '1 0 0', '2 0 0', '[End]'), line: 8, says: /missing data: \[Number of Frequencies\] 3 \(line 4\) but only 2 data lines before \[End\]/ },
  { what: 'more data lines than declared', text: v2('# MHz S MA', '[Number of Ports] 1', '[Number of Frequencies] 1', '[Network Data]', '1 0 0', '2 0 0', '[End]'), line: 7, says: /more data lines than \[Number of Frequencies\] 1 \(line 4\) declares/ },
  { what: 'a version 2.0 file cut short before [End]', text: v2('# MHz S MA', '[Number of Ports] 1', '[Number of Frequencies] 1', '[Network Data]', '1 0 0', '! end of upload'), line: 7, says: /missing \[End\]: a version 2.0 file ends with \[End\]/ },
  { what: 'data before [Network Data]', text: v2('# MHz S MA', '[Number of Ports] 1', '[Number of Frequencies] 1', '1 0 0'), line: 5, says: /data before \[Network Data\]/ },
  { what: 'a bad [Reference] value', text: v2('# MHz S MA', '[Number of Ports] 1', '[Reference] fifty'), line: 4, says: /non-numeric value "fifty" in \[Reference\]/ },
  { what: 'a [Reference] that never gets its value', text: v2('# MHz S MA', '[Number of Ports] 1', '[Reference]', '[Number of Frequencies] 1'), line: 5, says: /\[Reference\] \(line 4\) has 0 of 1 values before \[Number of Frequencies\]/ },
  { what: '[Two-Port Data Order] in a one-port file', text: v2('# MHz S MA', '[Number of Ports] 1', '[Two-Port Data Order] 12_21'), line: 4, says: /\[Two-Port Data Order\] is only allowed in 2-port files/ },
  { what: 'a two-port file without [Two-Port Data Order]', text: v2('# MHz S MA', '[Number of Ports] 2', '[Number of Frequencies] 1', '[Network Data]'), ports: 2, line: 5, says: /missing \[Two-Port Data Order\]/ },
  { what: 'mixed-mode data', text: v2('# MHz S MA', '[Number of Ports] 1', '[Mixed-Mode Order] S1'), line: 4, says: /\[Mixed-Mode Order\]: mixed-mode data is not read here/ },
  { what: 'a keyword given twice', text: v2('# MHz S MA', '[Number of Ports] 1', '[Number of Frequencies] 1', '[Number of Frequencies] 1'), line: 5, says: /\[Number of Frequencies\] appears twice \(first on line 4\)/ },
  { what: 'a bad [Matrix Format]', text: v2('# MHz S MA', '[Number of Ports] 1', '[Matrix Format] Diagonal'), line: 4, says: /\[Matrix Format\] must be Full, Lower or Upper, found "Diagonal"/ },
  { what: 'content after [End]', text: v2('# MHz S MA', '[Number of Ports] 1', '[Number of Frequencies] 1', '[Network Data]', '1 0 0', '[End]', '2 0 0'), line: 8, says: /content after \[End\]: "2 0 0"/ },
  { what: 'an open circuit in S-data', text: '# MHz S RI\n1 0.5 0\n2 1 0', line: 3, says: /S11 = 1 is an open circuit: its impedance is infinite/ },
  { what: 'an open circuit in Y-data', text: '# MHz Y RI\n1 0 0', line: 2, says: /Y11 = 0 is an open circuit: its impedance is infinite/ },
];

function errorOf(bad: BadFile): TouchstoneError {
  try {
    if (bad.ports === 2) readTwoPortTouchstone(bad.text);
    else readOnePortTouchstone(bad.text);
  } catch (error) {
    if (isTouchstoneError(error)) return error;
    throw error;
  }
  throw new Error(`no error for ${bad.what}`);
}

describe('bad Touchstone files', () => {
  for (const bad of BAD_FILES) {
    it(`${bad.what}: line ${bad.line}`, () => {
      const error = errorOf(bad);
      expect(error).toBeInstanceOf(TouchstoneError);
      expect(error.line).toBe(bad.line);
      expect(error.reason).toMatch(bad.says);
      expect(error.message).toBe(`Touchstone line ${bad.line}: ${error.reason}`);
    });
  }

  it('gives every bad file its own message', () => {
    const reasons = BAD_FILES.map((bad) => errorOf(bad).reason);
    expect(new Set(reasons).size).toBe(reasons.length);
  });
});
