/**
 * Splitting CSV text into records and fields (src/data/csv.ts): text without quotation marks is
 * split directly, text with quotes goes to papaparse. The outside check is papaparse itself (the
 * registry's RFC 4180 parser, called here with the options the module uses): on generated
 * quote-free texts, including blank lines, empty fields, trailing delimiters and a missing final
 * line end, the direct split must give exactly papaparse's records.
 */
import { describe, expect, it } from 'vitest';
import Papa from 'papaparse';
import { parseCsv, splitRecords } from '../../src/data/csv.js';
import { seededRandom } from '../helpers/reference.js';

function papa(text: string, delimiter: string): string[][] {
  return Papa.parse<string[]>(text, { delimiter, newline: '\n', skipEmptyLines: false }).data;
}

/** A quote-free text of random fields (digits, letters, spaces, signs, points, empty), lines and line ends. */
function randomText(seed: number, delimiter: string): string {
  const r = seededRandom(seed);
  const alphabet = ['1', '2.5', '-3e-4', 'NA', ' 7 ', '', 'a b', '.', ',', ';', '\t', 'x', '0'];
  const lines: string[] = [];
  const rows = 1 + Math.floor(r() * 12);
  for (let i = 0; i < rows; i++) {
    const width = Math.floor(r() * 5);
    const fields = Array.from({ length: width }, () => alphabet[Math.floor(r() * alphabet.length)]);
    lines.push(fields.join(delimiter));
  }
  return lines.join('\n') + (r() < 0.5 ? '\n' : '') + (r() < 0.2 ? '\n\n' : '');
}

describe('splitting CSV text against papaparse', () => {
  for (const delimiter of [',', ';', '\t']) {
    it(`quote-free texts split as papaparse splits them (delimiter ${JSON.stringify(delimiter)}, 300 texts)`, () => {
      for (let seed = 1; seed <= 300; seed++) {
        const text = randomText(seed, delimiter);
        expect(splitRecords(text, delimiter, 'the text', undefined), `seed ${seed}: ${JSON.stringify(text)}`).toEqual(papa(text, delimiter));
      }
    });
  }

  it('edge texts: empty, one line end, blank lines, only delimiters', () => {
    for (const text of ['', '\n', '\n\n', 'a', 'a\n', ',,', ',\n,\n', 'a,b\n\n1,2\n', ' , \n']) {
      expect(splitRecords(text, ',', 'the text', undefined), JSON.stringify(text)).toEqual(papa(text, ','));
    }
  });

  it('text with quotes still goes through papaparse: embedded delimiters and line ends', () => {
    const text = 'name,y\n"a, b",1.5\n"two\nlines",2\n';
    expect(splitRecords(text, ',', 'the text', undefined)).toEqual([['name', 'y'], ['a, b', '1.5'], ['two\nlines', '2'], ['']]);
    expect(parseCsv(text).rows).toEqual([['a, b', '1.5'], ['two\nlines', '2']]);
  });

  it('an unclosed quote is still refused with CSV_MALFORMED', () => {
    expect(() => splitRecords('y\n"1\n', ',', 'the text', undefined)).toThrow(expect.objectContaining({ code: 'CSV_MALFORMED' }));
  });
});
