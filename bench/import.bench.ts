/**
 * Import benchmark (prints figures, never fails): a full-length match's tracking
 * (2 x 45 min + stoppage, 25 Hz, 23 objects) in long and wide CSV, imported by
 * engine/import (parse + normalise), beside papaparse and d3-dsv parsing the same text in
 * the same run. Goals: >= 2x papaparse; parse + normalise <= 5 s.
 *
 * Run: npm run bench -- import   (or: npx tsx --expose-gc bench/import.bench.ts)
 * WM_BENCH_GENERATOR=own uses the small generator in tests/unit/import/helpers instead of
 * fixtures/sim (faster to generate; simpler motion).
 */
import { csvParseRows } from 'd3-dsv';
import Papa from 'papaparse';
import type { TrackingMapping } from '../shared-types/import.ts';
import { detectSource, importTracking, textChunks } from '../engine/import/index.ts';
import { CsvTokenizer } from '../engine/import/text/csv-tokenizer.ts';

const PERIOD_SECONDS = [2820, 2940]; // 47 and 49 minutes: 45 + stoppage (Law 7)
const CHUNK = 1 << 20;

const gc = (globalThis as { gc?: () => void }).gc ?? (() => {});
const mb = (bytes: number) => bytes / 1e6;

async function generate(): Promise<{ source: string; wide: string; long: string }> {
  const t0 = performance.now();
  if (process.env.WM_BENCH_GENERATOR !== 'own') {
    try {
      const sim = await import('../fixtures/sim/index.ts');
      const world = sim.simulateMatch({ seed: 7, periodSeconds: PERIOD_SECONDS });
      const wide = sim.writeTracking(world, { layout: 'wide', rate: 25 }).text;
      const long = sim.writeTracking(world, { layout: 'long', rate: 25 }).text;
      return { source: `fixtures/sim (generated in ${((performance.now() - t0) / 1000).toFixed(1)} s)`, wide, long };
    } catch (e) {
      console.log(`fixtures/sim not usable (${(e as Error).message}); using the small generator`);
    }
  }
  const { synthFrames, writeWide, writeLong, coords } = await import('../tests/unit/import/helpers/synthetic.ts');
  const s = synthFrames({ rate: 25, periodS: PERIOD_SECONDS[0], periods: 1 });
  const s2 = synthFrames({ rate: 25, periodS: PERIOD_SECONDS[1], periods: 2 });
  const frames = [...s.frames, ...s2.frames.filter((f) => f.period === 2)];
  const all = { objects: s.objects, frames };
  return { source: 'tests/unit/import/helpers/synthetic.ts', wide: writeWide(all, coords({})), long: writeLong(all, coords({})) };
}

interface Figure {
  name: string;
  seconds: number;
  rows: number;
  peakHeapMB?: number;
  peakRssMB?: number;
}

function time<T>(fn: () => T): [T, number] {
  const t0 = performance.now();
  const r = fn();
  return [r, (performance.now() - t0) / 1000];
}

async function benchOne(label: string, text: string): Promise<void> {
  const bytes = text.length; // ASCII: characters = bytes
  const dataRows = text.split('\n', 3).length ? countLines(text) - 1 : 0;
  console.log(`\n--- ${label}: ${mb(bytes).toFixed(1)} MB, ${dataRows.toLocaleString()} data rows`);
  const figures: Figure[] = [];

  // engine/import: detect on the head, then the full streaming import (parse + normalise).
  gc();
  const base = process.memoryUsage();
  let peakHeap = base.heapUsed;
  let peakRss = base.rss;
  const mapping = detectSource(`${label}.csv`, text.slice(0, 65536)).mapping as TrackingMapping;
  const t0 = performance.now();
  const r = await importTracking(textChunks(text, CHUNK), {
    fileName: `${label}.csv`,
    mapping,
    bytesTotal: bytes,
    onProgress: () => {
      const m = process.memoryUsage();
      peakHeap = Math.max(peakHeap, m.heapUsed);
      peakRss = Math.max(peakRss, m.rss);
    },
  });
  const seconds = (performance.now() - t0) / 1000;
  const m = process.memoryUsage();
  peakHeap = Math.max(peakHeap, m.heapUsed);
  peakRss = Math.max(peakRss, m.rss);
  const frames = r.data?.periods.reduce((a, p) => a + p.frameCount, 0) ?? 0;
  console.log(`import ok=${r.ok} rows=${r.rows} frames=${frames} objects=${r.data?.objects.length} problems=${r.problems.length}${r.ok ? '' : ' ' + JSON.stringify(r.problems.slice(0, 2))}`);
  figures.push({ name: 'engine/import (parse + normalise)', seconds, rows: r.rows, peakHeapMB: mb(peakHeap - base.heapUsed), peakRssMB: mb(peakRss - base.rss) });

  // engine/import tokenizer alone, reading every field as a number (what the importer does).
  gc();
  {
    let sum = 0;
    let rows = 0;
    const [, s] = time(() => {
      const tok = new CsvTokenizer(',', (rec) => {
        rows++;
        for (let i = 0; i < rec.count; i++) {
          const v = rec.num(i);
          if (v === v) sum += v;
        }
      });
      for (let i = 0; i < text.length; i += CHUNK) tok.push(text.slice(i, i + CHUNK));
      tok.end();
    });
    figures.push({ name: 'engine/import tokenizer + numbers', seconds: s, rows: rows - 1 });
    if (!Number.isFinite(sum)) console.log('(checksum not finite)');
  }

  // papaparse, the same text, strings (its fast path) and with numbers (dynamicTyping).
  gc();
  {
    const [res, s] = time(() => Papa.parse<string[]>(text, { delimiter: ',', skipEmptyLines: true }));
    figures.push({ name: 'papaparse (strings)', seconds: s, rows: res.data.length - 1 });
  }
  gc();
  {
    const [res, s] = time(() => Papa.parse<unknown[]>(text, { delimiter: ',', skipEmptyLines: true, dynamicTyping: true }));
    figures.push({ name: 'papaparse (dynamicTyping numbers)', seconds: s, rows: res.data.length - 1 });
  }
  gc();
  {
    const [res, s] = time(() => csvParseRows(text));
    figures.push({ name: 'd3-dsv csvParseRows (strings)', seconds: s, rows: res.length - 1 });
  }
  gc();

  const papa = figures.find((f) => f.name === 'papaparse (strings)')!.seconds;
  const d3 = figures.find((f) => f.name.startsWith('d3-dsv'))!.seconds;
  console.log('what'.padEnd(38), 'seconds'.padStart(8), 'MB/s'.padStart(8), 'rows/s'.padStart(12), 'vs papaparse'.padStart(13), 'vs d3-dsv'.padStart(10), '  peak heap / rss');
  for (const f of figures) {
    console.log(
      f.name.padEnd(38),
      f.seconds.toFixed(2).padStart(8),
      (mb(bytes) / f.seconds).toFixed(1).padStart(8),
      Math.round(f.rows / f.seconds).toLocaleString().padStart(12),
      `${(papa / f.seconds).toFixed(2)}x`.padStart(13),
      `${(d3 / f.seconds).toFixed(2)}x`.padStart(10),
      f.peakHeapMB !== undefined ? `  +${f.peakHeapMB.toFixed(0)} MB / +${f.peakRssMB!.toFixed(0)} MB` : '',
    );
  }
  const ours = figures[0].seconds;
  console.log(`goal parse + normalise <= 5 s: ${ours.toFixed(2)} s ${ours <= 5 ? '(met)' : '(NOT met)'}; goal >= 2x papaparse: ${(papa / ours).toFixed(2)}x ${papa / ours >= 2 ? '(met)' : '(NOT met)'}`);
}

function countLines(text: string): number {
  let n = 0;
  for (let i = text.indexOf('\n'); i !== -1; i = text.indexOf('\n', i + 1)) n++;
  return n;
}

const { source, wide, long } = await generate();
console.log(`tracking generated by ${source}; ${PERIOD_SECONDS.join(' + ')} s at 25 Hz, 23 objects; node ${process.version}`);
await benchOne('wide', wide);
await benchOne('long', long);
