import fc from 'fast-check';
import Papa from 'papaparse';
import { describe, expect, it } from 'vitest';
import { CsvTokenizer } from '../../../engine/import/text/csv-tokenizer.ts';
import { parseNumber } from '../../../engine/import/text/numbers.ts';

function tokenize(text: string, chunkSize: number, delimiter = ','): { fields: string[][]; lines: number[] } {
  const fields: string[][] = [];
  const lines: number[] = [];
  const tok = new CsvTokenizer(delimiter, (rec) => {
    const r: string[] = [];
    for (let i = 0; i < rec.count; i++) r.push(rec.field(i));
    fields.push(r);
    lines.push(rec.line);
  });
  for (let i = 0; i < text.length; i += chunkSize) tok.push(text.slice(i, i + chunkSize));
  tok.end();
  return { fields, lines };
}

describe('CSV tokenizer: RFC 4180 examples', () => {
  it('plain fields, CRLF line ends, last line without a line break (RFC 4180 §2 rules 1-2)', () => {
    expect(tokenize('aaa,bbb,ccc\r\nzzz,yyy,xxx', 3).fields).toEqual([
      ['aaa', 'bbb', 'ccc'],
      ['zzz', 'yyy', 'xxx'],
    ]);
  });
  it('quoted fields with line breaks, commas and doubled quotes (RFC 4180 §2 rules 5-7)', () => {
    const text = '"aaa","b\r\nbb","ccc"\r\nzzz,"y,y","x""x"\r\n';
    for (const size of [1, 2, 5, 64]) {
      const { fields, lines } = tokenize(text, size);
      expect(fields).toEqual([
        ['aaa', 'b\r\nbb', 'ccc'],
        ['zzz', 'y,y', 'x"x'],
      ]);
      expect(lines).toEqual([1, 3]); // the second record starts on line 3 (the first spans two)
    }
  });
  it('tab-separated values', () => {
    expect(tokenize('a\tb\n1\t2\n', 4, '\t').fields).toEqual([
      ['a', 'b'],
      ['1', '2'],
    ]);
  });
  it('reports an unterminated quoted field at the end of the file', () => {
    let unterminated = false;
    const tok = new CsvTokenizer(',', (rec) => {
      unterminated ||= rec.unterminated;
    });
    tok.push('a,"b\n1,2\n');
    tok.end();
    expect(unterminated).toBe(true);
  });
});

describe('CSV tokenizer agrees with papaparse (reference library) on random CSV', () => {
  const field = fc.oneof(
    fc.stringMatching(/^[a-z0-9 .\-]{0,6}$/),
    fc.string({ maxLength: 6 }).map((s) => '"' + s.replace(/"/g, '""') + '"'),
  );
  const record = fc.array(field, { minLength: 1, maxLength: 5 });
  it('same fields for any chunking (300 cases)', () => {
    let cases = 0;
    fc.assert(
      fc.property(fc.array(record, { minLength: 1, maxLength: 6 }), fc.integer({ min: 1, max: 40 }), fc.constantFrom('\n', '\r\n'), (recs, size, eol) => {
        cases++;
        // Keep the comparison to records papaparse reads the same way: no empty lines.
        const lines = recs.map((r) => r.join(',')).filter((l) => l.length > 0);
        fc.pre(lines.length > 0);
        const text = lines.join(eol) + eol;
        const ours = tokenize(text, size).fields;
        const ref = Papa.parse<string[]>(text, { delimiter: ',', newline: eol as '\n' | '\r\n', skipEmptyLines: false }).data;
        // papaparse reads the final line break as the start of one more, empty record.
        const last = ref[ref.length - 1];
        if (last && last.length === 1 && last[0] === '') ref.pop();
        expect(ours).toEqual(ref);
      }),
      { numRuns: 300 },
    );
    console.log(`csv tokenizer vs papaparse: ${cases} cases tried`);
  });
});

describe('number parsing agrees with Number() (ECMAScript, reference)', () => {
  it('on random decimal text (300 cases)', () => {
    fc.assert(
      fc.property(fc.double({ noNaN: true, noDefaultInfinity: true, min: -1e6, max: 1e6 }), fc.integer({ min: 0, max: 6 }), (v, digits) => {
        const s = v.toFixed(digits);
        expect(parseNumber(s)).toBeCloseTo(Number(s), 9);
      }),
      { numRuns: 300 },
    );
  });
  it('missing and invalid text gives NaN; exponents go through Number()', () => {
    for (const s of ['', 'NaN', 'NA', 'abc', '1.2.3', '--1', '1e']) expect(parseNumber(s)).toBeNaN();
    expect(parseNumber('1.5e3')).toBe(1500);
    expect(parseNumber(' -42.25 ')).toBe(-42.25);
  });
});
