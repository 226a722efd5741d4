/**
 * Property-based fuzzing of the importers with fast-check, shared by the unit tests (a few
 * hundred runs) and bench/import-fuzz.bench.ts (tens of thousands). Inputs are valid files
 * cut short, garbled, spliced, or plain random text, fed in random chunk sizes, read with
 * the mapping detected for the clean file or for the damaged one.
 */
import fc from 'fast-check';
import type { ImportResult, SourceMapping } from '../../../../shared-types/import.ts';
import { detectSource, importEvents, importTracking, isAbortError } from '../../../../engine/import/index.ts';
import { coords, synthFrames, writeJsonl, writeLong, writeWide } from './synthetic.ts';

const small = synthFrames({ rate: 10, periodS: 1, periods: 2, firstFrames: [0, 500] });

export const seeds = {
  trackingCsv: [writeWide(small, coords({})), writeLong(small, coords({ unit: 'cm', origin: 'bottom_left' })), writeWide(small, coords({ unit: 'normalised', origin: 'bottom_left' }), { delimiter: ';' })],
  trackingJsonl: [writeJsonl(small, coords({})), writeJsonl(small, coords({ unit: 'normalised', origin: 'bottom_left' }))],
  eventsCsv: [
    'id,period,clock,team,player,event,x,y,end_x,end_y\n1,1,00:00.0,Amber XI,9,Kick Off,52.5,34,45.2,30.1\n2,1,00:02.4,Amber XI,6,Pass,45.2,30.1,60.8,12.4\n3,1,03:12.5,Slate XI,1,Goal Kick,5.5,24.84,48,40\n4,1,"45:00.0",,,Half End,,,,\n5,2,45:00.0,Slate XI,9,kick off,52.5,34,55,38\n6,2,47:33.3,Amber XI,3,"Free, Kick",30,20,60,25\n',
    'period\tsecs\taction\tteam\n1\t0\tkickoff\thome\n1\t61.5\tpass\thome\n2\t0\tkickoff\taway\n2\t30.25\tcorner\taway\n',
  ],
  eventsJson: [
    '[{"when":"2026-03-14T15:00:02Z","half":1,"type":"period start"},{"when":"2026-03-14T15:00:03.5Z","half":1,"type":"kickoff","side":"home","x":0.5,"y":0.5},{"when":"2026-03-14T16:03:00+01:00","half":2,"type":"kick-off","side":"away","x":0.5,"y":0.5}]',
    '{"t":"00:01","period":1,"event":"pass","team":"A"}\n{"t":"00:05","period":1,"event":"shot","team":"B"}\n{"t":"45:10","period":2,"event":"corner","team":"A"}\n',
  ],
};

/** A damaged version of a seed text. */
export function damaged(seedTexts: string[]): fc.Arbitrary<string> {
  const seed = fc.constantFrom(...seedTexts);
  const noise = fc.string({ unit: 'binary', maxLength: 12 });
  return fc.oneof(
    // cut short
    fc.tuple(seed, fc.double({ min: 0, max: 1, noNaN: true })).map(([s, f]) => s.slice(0, Math.floor(s.length * f))),
    // garbled in a few places
    fc.tuple(seed, fc.array(fc.tuple(fc.double({ min: 0, max: 1, noNaN: true }), fc.nat(8), noise), { minLength: 1, maxLength: 6 })).map(([s, edits]) => {
      let t = s;
      for (const [f, del, ins] of edits) {
        const at = Math.floor(t.length * f);
        t = t.slice(0, at) + ins + t.slice(at + del);
      }
      return t;
    }),
    // two seeds spliced
    fc.tuple(seed, seed, fc.double({ min: 0, max: 1, noNaN: true })).map(([a, b, f]) => a.slice(0, Math.floor(a.length * f)) + b.slice(Math.floor(b.length * f))),
    // lines shuffled about
    fc.tuple(seed, fc.nat(50), fc.nat(50)).map(([s, i, j]) => {
      const l = s.split('\n');
      if (l.length > 2) [l[1 + (i % (l.length - 1))], l[1 + (j % (l.length - 1))]] = [l[1 + (j % (l.length - 1))], l[1 + (i % (l.length - 1))]];
      return l.join('\n');
    }),
    // random text
    fc.string({ unit: 'binary', maxLength: 300 }),
    fc.string({ unit: fc.constantFrom(...',;\t\n\r"{}[]:.-0123456789abcxyz_ '.split('')), maxLength: 400 }),
  );
}

async function* chunksOf(text: string, size: number): AsyncIterable<string> {
  for (let i = 0; i < text.length; i += size) yield text.slice(i, i + size);
  if (!text.length) return;
}

/** The contract every import result must meet, whatever the input. Returns what is wrong, or null. */
export function contractBroken(r: ImportResult<unknown>): string | null {
  if (typeof r.ok !== 'boolean') return 'ok is not a boolean';
  if (r.ok && r.data === undefined) return 'ok without data';
  if (!r.ok && r.data !== undefined) return 'partial data with ok:false';
  if (!r.ok && !r.problems.some((p) => p.severity === 'error')) return 'failed without an error message';
  if (r.ok && r.problems.some((p) => p.severity === 'error')) return 'ok despite an error';
  for (const p of r.problems) if (!p.message || !p.file) return 'a problem without message or file';
  return null;
}

const cleanMappings: Partial<Record<Target, SourceMapping>> = {};

export type Target = 'trackingCsv' | 'trackingJsonl' | 'eventsCsv' | 'eventsJson';

/** One fuzz case: detect, import, check the contract. Throws (failing the property) on a broken contract or a crash. */
export async function runCase(target: Target, text: string, chunkSize: number, useCleanMapping: boolean): Promise<void> {
  const clean = (cleanMappings[target] ??= detectSource('seed', seeds[target][0]).mapping as SourceMapping);
  const d = detectSource(target.startsWith('events') ? 'log.csv' : 'trk.csv', text);
  if (d.kind === 'unknown' && !d.problems.length) throw new Error('unknown detection without a problem');
  if (d.kind !== 'unknown' && !d.mapping) throw new Error('detection without a mapping');
  const mapping = useCleanMapping || !d.mapping ? clean : d.mapping;
  const opts = { fileName: 'fuzz', bytesTotal: text.length };
  try {
    const r = mapping.kind === 'tracking' ? await importTracking(chunksOf(text, chunkSize), { ...opts, mapping }) : await importEvents(chunksOf(text, chunkSize), { ...opts, mapping });
    const broken = contractBroken(r);
    if (broken) throw new Error(`${broken}: ${JSON.stringify(r.problems.slice(0, 3))}`);
  } catch (e) {
    if (isAbortError(e)) return;
    throw e;
  }
}

/** Runs `numRuns` cases for one target; returns the count tried. */
export async function fuzzImporter(target: Target, numRuns: number, seed?: number): Promise<number> {
  let tried = 0;
  await fc.assert(
    fc.asyncProperty(damaged(seeds[target]), fc.integer({ min: 1, max: 700 }), fc.boolean(), async (text, size, cleanMapping) => {
      tried++;
      await runCase(target, text, size, cleanMapping);
    }),
    { numRuns, seed },
  );
  return tried;
}

/** detectSource on damaged heads of every kind: never throws, always a well-formed answer. */
export function fuzzDetect(numRuns: number, seed?: number): number {
  let tried = 0;
  const all = Object.values(seeds).flat();
  fc.assert(
    fc.property(damaged(all), fc.constantFrom('a.csv', 'b.tsv', 'c.json', 'd.jsonl', 'e.txt', ''), (text, name) => {
      tried++;
      const d = detectSource(name, text);
      if (!['tracking', 'events', 'unknown'].includes(d.kind)) throw new Error(`kind ${d.kind}`);
      if (!(d.confidence >= 0 && d.confidence <= 1)) throw new Error(`confidence ${d.confidence}`);
      if (d.kind === 'unknown' ? !d.problems.length : !d.mapping || d.mapping.kind !== d.kind) throw new Error('inconsistent detection');
      if (!Array.isArray(d.header) || !Array.isArray(d.preview) || !Array.isArray(d.clues)) throw new Error('malformed detection');
    }),
    { numRuns, seed },
  );
  return tried;
}
