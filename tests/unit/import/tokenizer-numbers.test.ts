/**
 * The tokenizer reads plain decimals while it splits a row (the fused fast path). Whatever
 * the field, rec.num / nums / numsXY must give exactly what parseNumber gives on the field's
 * own text (parseNumber is itself checked against Number(), ECMAScript, in
 * csv-tokenizer.test.ts), for every delimiter and chunking.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { CsvTokenizer, type CsvRecord } from '../../../engine/import/text/csv-tokenizer.ts';
import { parseNumber } from '../../../engine/import/text/numbers.ts';

/** Plain decimals plus the awkward cases: signs, lone dots, exponents, spaces, long mantissas, missing tokens. */
const ODD = ['', '-', '.', '-.', '.5', '-.5', '5.', '-5.', '0', '-0', '+1', ' 1', '1 ', '1e3', '-2.5E-2', '1.2.3', '--1', 'NaN', 'NA', 'abc', '12a',
  '1234567890123456', '123456789012345', '0.000000000000001', '99999999999999.9', '-0.0', '00012.5'];
const fieldArb = fc.oneof(
  fc.constantFrom(...ODD),
  fc.double({ noNaN: true, noDefaultInfinity: true, min: -1e5, max: 1e5 }).chain((v) => fc.integer({ min: 0, max: 6 }).map((d) => v.toFixed(d))),
  fc.integer({ min: -100000, max: 100000 }).map(String),
);

function records(text: string, delimiter: string, chunk: number, onRec: (rec: CsvRecord) => void): void {
  const tok = new CsvTokenizer(delimiter, onRec);
  for (let i = 0; i < text.length; i += chunk) tok.push(text.slice(i, i + chunk));
  tok.end();
}

describe('tokenizer numbers read while splitting equal parseNumber on the field text', () => {
  it('num(), nums() and numsXY() on random rows, delimiters , ; tab | and chunkings (300 cases)', () => {
    fc.assert(
      fc.property(
        fc.array(fc.array(fieldArb, { minLength: 2, maxLength: 12 }), { minLength: 1, maxLength: 8 }),
        fc.constantFrom(',', ';', '\t', '|'),
        fc.integer({ min: 1, max: 40 }),
        fc.constantFrom('\n', '\r\n'),
        (rows, delimiter, chunk, eol) => {
          // Fields with the delimiter or a quote would be split or quoted: leave them out.
          const clean = rows.map((r) => r.map((f) => (f.includes(delimiter) ? '1' : f)));
          // A blank line is skipped by the tokenizer: give one-empty-field rows a value.
          const lines = clean.map((r) => (r.join('') === '' ? ['7', ...r.slice(1)] : r));
          const text = lines.map((r) => r.join(delimiter)).join(eol);
          let k = 0;
          records(text, delimiter, chunk, (rec) => {
            const want = lines[k++];
            expect(rec.count).toBe(want.length);
            const fields = Int32Array.from(want.map((_, i) => i));
            const out = new Float64Array(want.length);
            rec.nums(fields, out);
            const pairs = want.length >> 1;
            const xs = new Float32Array(pairs + 1);
            const ys = new Float32Array(pairs + 1);
            rec.numsXY(fields.subarray(0, 2 * pairs), xs, ys, 1);
            want.forEach((f, i) => {
              const ref = parseNumber(f);
              expect(Object.is(rec.num(i), ref) || (Number.isNaN(ref) && Number.isNaN(rec.num(i)))).toBe(true);
              expect(Object.is(out[i], ref) || (Number.isNaN(ref) && Number.isNaN(out[i]))).toBe(true);
              const slot = i % 2 === 0 ? xs[1 + (i >> 1)] : ys[1 + (i >> 1)];
              if (i < 2 * pairs) expect(Object.is(slot, Math.fround(ref)) || (Number.isNaN(ref) && Number.isNaN(slot))).toBe(true);
            });
          });
          expect(k).toBe(lines.length);
        },
      ),
      { numRuns: 300 },
    );
  });

  it('a delimiter that can be part of a number (".") still splits and reads fields by their text', () => {
    const got: number[][] = [];
    records('12.-3.4\n-.5.', '.', 3, (rec) => got.push(Array.from({ length: rec.count }, (_, i) => rec.num(i))));
    expect(got).toEqual([[12, -3, 4], [NaN, 5, NaN]]); // '-' alone is not a number
  });
});
