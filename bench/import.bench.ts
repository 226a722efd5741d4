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
  /** CPU seconds of this process (all threads): steadier than wall time on a shared machine. */
  cpu: number;
  rows: number;
  peakHeapMB?: number;
  peakRssMB?: number;
}

function time<T>(fn: () => T): [T, number, number] {
  const c0 = process.cpuUsage();
  const t0 = performance.now();
  const r = fn();
  const c = process.cpuUsage(c0);
  return [r, (performance.now() - t0) / 1000, (c.user + c.system) / 1e6];
}

async function benchOne(label: string, text: string): Promise<void> {
  const bytes = text.length; // ASCII: characters = bytes
  const dataRows = countLines(text) - 1;
  console.log(`\n--- ${label}: ${mb(bytes).toFixed(1)} MB, ${dataRows.toLocaleString()} data rows`);
  const figures: Figure[] = [];

  // engine/import: detect on the head, then the full streaming import (parse + normalise).
  gc();
  const base = process.memoryUsage();
  let peakHeap = base.heapUsed;
  let peakRss = base.rss;
  const mapping = detectSource(`${label}.csv`, text.slice(0, 65536)).mapping as TrackingMapping;
  const c0 = process.cpuUsage();
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
  const cu = process.cpuUsage(c0);
  const m = process.memoryUsage();
  peakHeap = Math.max(peakHeap, m.heapUsed);
  peakRss = Math.max(peakRss, m.rss);
  const frames = r.data?.periods.reduce((a, p) => a + p.frameCount, 0) ?? 0;
  console.log(`import ok=${r.ok} rows=${r.rows} frames=${frames} objects=${r.data?.objects.length} problems=${r.problems.length}${r.ok ? '' : ' ' + JSON.stringify(r.problems.slice(0, 2))}`);
  figures.push({ name: 'engine/import (parse + normalise)', seconds, cpu: (cu.user + cu.system) / 1e6, rows: r.rows, peakHeapMB: mb(peakHeap - base.heapUsed), peakRssMB: mb(peakRss) });

  // engine/import tokenizer alone, reading every field as a number (what the importer does).
  gc();
  {
    let sum = 0;
    let rows = 0;
    const [, s, cpu] = time(() => {
      const tok = new CsvTokenizer(',');
      const drain = () => {
        for (let rec = tok.next(); rec; rec = tok.next()) {
          rows++;
          for (let i = 0; i < rec.count; i++) {
            const v = rec.num(i);
            if (v === v) sum += v;
          }
        }
      };
      for (let i = 0; i < text.length; i += CHUNK) {
        tok.feed(text.slice(i, i + CHUNK));
        drain();
      }
      tok.finish();
      drain();
    });
    figures.push({ name: 'engine/import tokenizer + numbers', seconds: s, cpu, rows: rows - 1 });
    if (!Number.isFinite(sum)) console.log('(checksum not finite)');
  }

  // papaparse, the same text, strings (its fast path) and with numbers (dynamicTyping).
  gc();
  {
    const [res, s, cpu] = time(() => Papa.parse<string[]>(text, { delimiter: ',', skipEmptyLines: true }));
    figures.push({ name: 'papaparse (strings)', seconds: s, cpu, rows: res.data.length - 1 });
  }
  gc();
  {
    const [res, s, cpu] = time(() => Papa.parse<unknown[]>(text, { delimiter: ',', skipEmptyLines: true, dynamicTyping: true }));
    figures.push({ name: 'papaparse (dynamicTyping numbers)', seconds: s, cpu, rows: res.data.length - 1 });
  }
  gc();
  {
    const [res, s, cpu] = time(() => csvParseRows(text));
    figures.push({ name: 'd3-dsv csvParseRows (strings)', seconds: s, cpu, rows: res.length - 1 });
  }
  gc();

  // Ratios on CPU time (this process's own work), wall time printed beside it.
  const papa = figures.find((f) => f.name === 'papaparse (strings)')!.cpu;
  const papaNum = figures.find((f) => f.name.startsWith('papaparse (dynamic'))!.cpu;
  const d3 = figures.find((f) => f.name.startsWith('d3-dsv'))!.cpu;
  console.log(
    'what'.padEnd(36), 'wall s'.padStart(7), 'cpu s'.padStart(7), 'MB/s'.padStart(7), 'rows/s'.padStart(11),
    'vs papa'.padStart(8), 'vs papa#'.padStart(9), 'vs d3'.padStart(7), '  memory',
  );
  for (const f of figures) {
    console.log(
      f.name.padEnd(36),
      f.seconds.toFixed(2).padStart(7),
      f.cpu.toFixed(2).padStart(7),
      (mb(bytes) / f.cpu).toFixed(1).padStart(7),
      Math.round(f.rows / f.cpu).toLocaleString().padStart(11),
      `${(papa / f.cpu).toFixed(2)}x`.padStart(8),
      `${(papaNum / f.cpu).toFixed(2)}x`.padStart(9),
      `${(d3 / f.cpu).toFixed(2)}x`.padStart(7),
      f.peakHeapMB !== undefined ? `  heap +${f.peakHeapMB.toFixed(0)} MB, peak rss ${f.peakRssMB!.toFixed(0)} MB` : '',
    );
  }
  console.log('(MB/s and rows/s per CPU second; "papa#" = papaparse with dynamicTyping, i.e. also making numbers)');
  const ours = figures[0];
  console.log(
    `goal parse + normalise <= 5 s: ${ours.seconds.toFixed(2)} s wall, ${ours.cpu.toFixed(2)} s cpu ${ours.seconds <= 5 ? '(met)' : ours.cpu <= 5 ? '(met on cpu time; wall time inflated by other load)' : '(NOT met)'}`,
  );
  console.log(`goal >= 2x papaparse: ${(papa / ours.cpu).toFixed(2)}x its string parse, ${(papaNum / ours.cpu).toFixed(2)}x its number parse (full import incl. normalise)`);
  const tok = figures[1];
  console.log(`tokenizer + numbers alone: ${(papa / tok.cpu).toFixed(2)}x papaparse strings, ${(papaNum / tok.cpu).toFixed(2)}x papaparse numbers`);
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
