/**
 * Accuracy of `syncMatch` on simulated matches (fixtures/sim), through the importers on
 * the written text so the whole path is measured. Prints, per case: share of events
 * within 1 frame / 0.2 s / 0.5 s / 1 s of the truth for the raw logged times (mapped by
 * the TRUE clock, i.e. tagging error alone) and for ours, by kind; restart detection
 * precision / recall / kind accuracy; clock fit offset and drift errors; time taken.
 * It never fails: goals are shown as met / not met.
 *
 *   npm run bench:sync            (all cases)
 *   npm run bench:sync -- quick   (skip the full-length match)
 */
import { readFileSync } from 'node:fs';
import { buildTruth, simulateMatch, trueToSource, writeEvents, writeTracking, type Truth } from '../fixtures/sim/index.ts';
import type { EventsWriteOptions, TrackingWriteOptions } from '../fixtures/sim/index.ts';
import { detectSource, importEvents, importTracking, textChunks } from '../engine/import/index.ts';
import { syncMatch } from '../engine/sync.ts';
import type { EventLog, EventMapping, TrackingData, TrackingMapping } from '../shared-types/index.ts';

interface Case {
  name: string;
  seed?: number;
  periodSeconds?: number[];
  tracking?: TrackingWriteOptions;
  events?: EventsWriteOptions;
  files?: { tracking: string; events: string; truth: string };
}

const CASES: Case[] = [
  { name: 'demo (fixtures/demo)', files: { tracking: 'fixtures/demo/tracking.csv', events: 'fixtures/demo/events.csv', truth: 'fixtures/demo/truth.json' } },
  { name: 'offset seconds, 25 Hz wide', seed: 101, periodSeconds: [600, 600], tracking: { rate: 25, driftPpm: 40 }, events: { offsetS: [-2.1, -3.4] } },
  { name: 'offset minutes, +300 ppm', seed: 102, periodSeconds: [600, 600], tracking: { rate: 25, driftPpm: 300 }, events: { offsetS: [-185.5, -95.2], driftPpm: 0 } },
  { name: 'drift -300 ppm log, 10 Hz', seed: 103, periodSeconds: [600, 600], tracking: { rate: 10, driftPpm: -40 }, events: { offsetS: [-30, -12], driftPpm: -300 } },
  { name: '10 Hz long layout, cm', seed: 104, periodSeconds: [600, 600], tracking: { rate: 10, layout: 'long', unit: 'cm' }, events: { clock: 'seconds' } },
  { name: '25 Hz long, alt log names', seed: 105, periodSeconds: [600, 600], tracking: { rate: 25, layout: 'long' }, events: { variant: 'alt', offsetS: [-61.3, -7.7] } },
  { name: 'no ball (formation only)', seed: 106, periodSeconds: [600, 600], tracking: { rate: 25, ballAbsent: true }, events: { offsetS: [-40, -25] } },
  { name: 'noisy tagger (1 s jitter)', seed: 107, periodSeconds: [600, 600], tracking: { rate: 25, driftPpm: -150 }, events: { jitterSdS: 1.0, offsetS: [-120, -5] } },
  { name: 'full-length match', seed: 108, periodSeconds: [2820, 2940], tracking: { rate: 25, driftPpm: 80 }, events: { offsetS: [-75.4, -33.3], driftPpm: -120 } },
];

const quick = process.argv.includes('quick');

/** The writer's own coordinate frame for event logs (fixtures/sim/events-writer.ts): metres from the bottom-left corner. */
function eventFrameFix(m: EventMapping): string | null {
  const c = m.coordinates;
  if (c.unit === 'm' && c.origin === 'bottom_left' && !c.yDown) return null;
  m.coordinates = { ...c, unit: 'm', origin: 'bottom_left', yDown: false };
  return `event coordinates detected as ${c.unit}/${c.origin}; set to m/bottom_left as the writer documents`;
}

async function load(c: Case) {
  let trackingText: string, eventsText: string, truth: Truth;
  if (c.files) {
    trackingText = readFileSync(c.files.tracking, 'utf8');
    eventsText = readFileSync(c.files.events, 'utf8');
    truth = JSON.parse(readFileSync(c.files.truth, 'utf8')) as Truth;
  } else {
    const world = simulateMatch({ seed: c.seed!, periodSeconds: c.periodSeconds! });
    const trk = writeTracking(world, c.tracking);
    const evt = writeEvents(world, c.events);
    trackingText = trk.text;
    eventsText = evt.text;
    truth = buildTruth(world, { tracking: trk.meta, events: evt.meta });
  }
  const notes: string[] = [];
  const dt = detectSource('tracking.csv', trackingText.slice(0, 65536));
  if (dt.kind !== 'tracking') throw new Error(`tracking not detected: ${dt.clues.join('; ')}`);
  const tr = await importTracking(textChunks(trackingText), { fileName: 'tracking.csv', mapping: dt.mapping as TrackingMapping });
  if (!tr.ok) throw new Error(`tracking import failed: ${tr.problems.map((p) => p.message).join('; ')}`);
  const de = detectSource('events.csv', eventsText.slice(0, 65536));
  if (de.kind !== 'events') throw new Error(`events not detected: ${de.clues.join('; ')}`);
  const em = de.mapping as EventMapping;
  const fix = eventFrameFix(em);
  if (fix) notes.push(fix);
  const er = await importEvents(textChunks(eventsText), { fileName: 'events.csv', mapping: em });
  if (!er.ok) throw new Error(`events import failed: ${er.problems.map((p) => p.message).join('; ')}`);
  return { tracking: tr.data as TrackingData, log: er.data as EventLog, truth, notes };
}

const pct = (a: number[], th: number) => (a.length ? `${((a.filter((v) => v <= th).length / a.length) * 100).toFixed(0)}%` : '-').padStart(5);

interface Totals { [goal: string]: { met: number; of: number } }
const totals: Totals = {};
const goal = (name: string, ok: boolean) => {
  totals[name] ??= { met: 0, of: 0 };
  totals[name].of++;
  if (ok) totals[name].met++;
  return ok ? 'met' : 'NOT met';
};

for (const c of CASES) {
  if (quick && c.name === 'full-length match') continue;
  console.log(`\n## ${c.name}`);
  let data;
  try {
    data = await load(c);
  } catch (e) {
    console.log(`  skipped: ${(e as Error).message}`);
    continue;
  }
  const { tracking, log, truth, notes } = data;
  for (const n of notes) console.log(`  note: ${n}`);
  const frames = tracking.periods.reduce((s, p) => s + p.frameCount, 0);
  syncMatch(tracking, log); // warm-up run, so the timing is of the engine, not of the JIT
  const t0 = performance.now();
  const res = syncMatch(tracking, log);
  const ms = performance.now() - t0;
  console.log(`  ${log.events.length} events, ${frames} frames at ${tracking.rate} Hz, ball ${tracking.ballIndex >= 0 ? 'yes' : 'no'}: syncMatch ${ms.toFixed(0)} ms`);
  if (c.name === 'full-length match') console.log(`  goal full match <= 2 s: ${goal('full match <= 2 s', ms <= 2000)}`);

  // Events: raw (logged time through the true clock) vs ours, against the true moment.
  const frame = 1 / tracking.rate;
  const byKind = new Map<string, { raw: number[]; ours: number[] }>();
  let gkN = 0, gkOk = 0;
  log.events.forEach((e, i) => {
    const te = truth.events.find((x) => x.row === e.row);
    if (!te || e.kind === 'period_start' || e.kind === 'period_end') return;
    const src = trueToSource(truth, 'tracking', te.trueT);
    if (!src || src.period !== e.period) return;
    const E = truth.clocks.events!.segments.find((s) => s.period === e.period)!;
    const loggedTrue = E.offset + E.rate * e.t;
    const raw = trueToSource(truth, 'tracking', loggedTrue);
    const c = res.corrections[i];
    const k = byKind.get(e.kind) ?? { raw: [], ours: [] };
    k.raw.push(raw ? Math.abs(raw.t - src.t) : Infinity);
    const err = c.trackingPeriod === src.period ? Math.abs(c.trackingTime - src.t) : Infinity;
    k.ours.push(err);
    byKind.set(e.kind, k);
    if (te.fault?.kind === 'goal_kick_off') {
      gkN++;
      if (err <= 0.2 && c.x !== undefined && Math.hypot(c.x - te.trueX, c.y! - te.trueY) <= 2) gkOk++;
    }
  });
  console.log('  kind          n |  raw: 1fr  0.2s  0.5s    1s |  ours: 1fr  0.2s  0.5s    1s');
  for (const [kind, k] of [...byKind].sort((a, b) => b[1].raw.length - a[1].raw.length))
    console.log(`  ${kind.padEnd(11)} ${String(k.raw.length).padStart(3)} |     ${pct(k.raw, frame)} ${pct(k.raw, 0.2)} ${pct(k.raw, 0.5)} ${pct(k.raw, 1)} |      ${pct(k.ours, frame)} ${pct(k.ours, 0.2)} ${pct(k.ours, 0.5)} ${pct(k.ours, 1)}`);
  const passes = byKind.get('pass')?.ours ?? [];
  const restartErrs = ['kick_off', 'goal_kick', 'corner', 'throw_in', 'free_kick', 'penalty'].flatMap((k) => byKind.get(k)?.ours ?? []);
  const share = (a: number[], th: number) => (a.length ? a.filter((v) => v <= th).length / a.length : NaN);
  console.log(`  goal passes within 0.2 s >= 90%: ${(share(passes, 0.2) * 100).toFixed(1)}% ${goal('passes 0.2 s >= 90%', share(passes, 0.2) >= 0.9)}`);
  console.log(`  goal restarts within 0.2 s >= 95%: ${(share(restartErrs, 0.2) * 100).toFixed(1)}% ${goal('restarts 0.2 s >= 95%', share(restartErrs, 0.2) >= 0.95)}`);
  if (gkN) console.log(`  goal mistimed goal kicks within 0.2 s and 2 m >= 95%: ${gkOk}/${gkN} ${goal('mistimed goal kicks >= 95%', gkOk / gkN >= 0.95)}`);

  // Restart detection against the simulator's restarts.
  const found = res.trackingAnchors.filter((a) => a.kind !== 'period_start' && a.kind !== 'period_end');
  const truthR = truth.restarts.map((r) => ({ kind: r.kind, src: trueToSource(truth, 'tracking', r.playedT) })).filter((r) => r.src);
  const used = new Set<number>();
  let tp = 0, kindOk = 0;
  const signed: number[] = [];
  for (const a of found) {
    let best = -1, bd = Infinity;
    truthR.forEach((r, i) => {
      const d = r.src!.period === a.period ? Math.abs(r.src!.t - a.t) : Infinity;
      if (!used.has(i) && d < bd) { bd = d; best = i; }
    });
    if (best >= 0 && bd <= 1) {
      used.add(best);
      tp++;
      signed.push(a.t - truthR[best].src!.t);
      if (truthR[best].kind === a.kind) kindOk++;
    }
  }
  const P = found.length ? tp / found.length : NaN, R = truthR.length ? tp / truthR.length : NaN;
  signed.sort((a, b) => a - b);
  console.log(`  restarts: ${found.length} found, ${truthR.length} true; precision ${P.toFixed(3)} ${goal('restart precision >= 0.98', P >= 0.98)}, recall ${R.toFixed(3)} ${goal('restart recall >= 0.95', R >= 0.95)}, kind accuracy ${(kindOk / Math.max(1, tp)).toFixed(3)}; median signed time error ${(signed[signed.length >> 1] ?? NaN).toFixed(3)} s`);

  // Clock fit against the true clocks: t_trk = (oE - oT)/rT + (rE/rT) t_evt.
  for (const s of res.fit.segments) {
    const E = truth.clocks.events!.segments.find((x) => x.period === s.period);
    const T = truth.clocks.tracking!.segments.find((x) => x.period === s.period);
    if (!E || !T) continue;
    const offTrue = (E.offset - T.offset) / T.rate;
    const rateTrue = E.rate / T.rate;
    const offErr = (s.offset - offTrue) * 1000;
    const driftErr = s.driftPpm - (rateTrue - 1) * 1e6;
    console.log(`  fit period ${s.period} [${s.fromT.toFixed(0)}, ${s.toT.toFixed(0)}] s: offset error ${offErr.toFixed(1)} ms (SE ${(s.offsetSe * 1000).toFixed(0)} ms) ${goal('offset error <= 40 ms', Math.abs(offErr) <= 40)}, drift error ${driftErr.toFixed(1)} ppm (SE ${(s.rateSe * 1e6).toFixed(0)}) ${goal('drift error <= 10 ppm', Math.abs(driftErr) <= 10)}; ${s.points.filter((p) => p.used).length} points used`);
  }
  const coarse = res.coarse.map((m) => `p${m.period} ${m.offset.toFixed(2)} s (margin ${m.margin.toFixed(2)})`).join(', ');
  console.log(`  coarse alignment: ${coarse || 'none'}`);
}

console.log('\n## goals over all cases');
for (const [name, t] of Object.entries(totals)) console.log(`  ${name.padEnd(30)} met in ${t.met} of ${t.of}`);
