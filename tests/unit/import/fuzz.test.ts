import { describe, expect, it } from 'vitest';
import { fuzzDetect, fuzzImporter, type Target } from './helpers/fuzz.ts';

// Property-based fuzzing (fast-check): random, truncated and garbled input never throws
// (other than abort), always yields ok data or at least one error message, and never
// returns partial data with ok:false. CI runs 300 cases each; bench/import-fuzz.bench.ts
// runs 10,000 or more.
const RUNS = 300;

describe('import fuzzing (fast-check property-based testing)', () => {
  for (const target of ['trackingCsv', 'trackingJsonl', 'eventsCsv', 'eventsJson'] as Target[]) {
    it(`${target}: ${RUNS} damaged inputs keep the all-or-nothing contract`, async () => {
      const tried = await fuzzImporter(target, RUNS);
      console.log(`fuzz ${target}: ${tried} cases tried`);
      expect(tried).toBeGreaterThanOrEqual(RUNS);
    });
  }
  it(`detectSource: ${RUNS} damaged heads give a well-formed detection`, () => {
    const tried = fuzzDetect(RUNS);
    console.log(`fuzz detectSource: ${tried} cases tried`);
    expect(tried).toBeGreaterThanOrEqual(RUNS);
  });
});
