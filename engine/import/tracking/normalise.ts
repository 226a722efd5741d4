/**
 * Lays collected tracking samples out per period: consecutive frames at the nominal rate
 * from each period's first frame, missing frames as NaN with present = 0, coordinates in
 * centre-origin metres, and which way the home team attacks in each period.
 */
import type { TrackingData, TrackingPeriod } from '../../../shared-types/domain.ts';
import type { TrackingMapping } from '../../../shared-types/import.ts';
import { makeConverter } from '../coordinates.ts';
import type { ProblemLog } from '../text/problems.ts';
import type { FrameStore } from './frame-store.ts';
import { niceRate } from './detect.ts';

/** Larger than any real match (about 20 x a full match of 23 objects at 25 Hz): guards memory against garbage frame numbers. */
const MAX_CELLS = 80_000_000;
/** Positions this far beyond the lines are flagged (metres; players warm up behind the goal, a few metres). */
const OFF_PITCH_MARGIN_M = 15;
/** Seconds at the start of a period used to see which half each team stands in (kick-off shape, Law 8). */
const KICK_OFF_WINDOW_S = 5;

export function clockLabel(period: number, seconds: number): string {
  if (!Number.isFinite(seconds) || seconds < 0) return `period ${period}`;
  const m = Math.floor(seconds / 60);
  const s = seconds - m * 60;
  return `period ${period} ${String(m).padStart(2, '0')}:${s.toFixed(2).padStart(5, '0')}`;
}

function measureRate(store: FrameStore): number | undefined {
  const n = store.entries;
  const f = store.entryFrame.data;
  const t = store.entryTime.data;
  const rates: number[] = [];
  for (let i = 1; i < n && rates.length < 5000; i++) {
    const dt = t[i] - t[i - 1];
    const df = f[i] === f[i] ? f[i] - f[i - 1] : 1;
    if (dt > 0 && df > 0 && dt < 5) rates.push(df / dt);
  }
  if (!rates.length) return undefined;
  rates.sort((a, b) => a - b);
  return niceRate(rates[rates.length >> 1]);
}

/** Period of each entry (0 = dropped), from the column, frame ranges or gaps in time. */
function assignPeriods(store: FrameStore, mapping: TrackingMapping, rate: number, log: ProblemLog): Int16Array {
  const n = store.entries;
  const out = new Int16Array(n);
  const f = store.entryFrame.data;
  const t = store.entryTime.data;
  const spec = mapping.periods;
  if (spec.from === 'column') {
    out.set(store.entryPeriod.data.subarray(0, n));
  } else if (spec.from === 'frames') {
    for (let i = 0; i < n; i++) {
      const k = spec.ranges.findIndex(([a, b]) => f[i] >= a && f[i] <= b);
      out[i] = k + 1;
      if (k === -1) log.warn('outside-ranges', { line: store.entryLine.data[i], message: `Frame ${f[i]} is in none of the period frame ranges; skipped.`, hint: 'Widen the ranges in the mapping if it belongs to a period.' });
    }
  } else {
    const gapS = spec.minGapS > 0 ? spec.minGapS : 60;
    let p = 1;
    for (let i = 0; i < n; i++) {
      if (i > 0) {
        const useTime = t[i] === t[i] && t[i - 1] === t[i - 1];
        const jump = useTime ? t[i] - t[i - 1] : (f[i] - f[i - 1]) / rate;
        if (jump > gapS || jump < 0) p++;
      }
      out[i] = Math.min(p, 5);
    }
    if (p > 5) log.warn('many-periods', { message: `Time gaps split the file into ${p} parts; parts after the fifth were joined to period 5.`, hint: 'Raise the gap length in the mapping, or use a period column.' });
  }
  return out;
}

export function normaliseTracking(store: FrameStore, mapping: TrackingMapping, log: ProblemLog): TrackingData | null {
  const n = store.entries;
  if (n === 0) {
    log.error('no-frames', { message: 'No usable tracking frames in the file.', hint: 'Check that the mapping points at the right columns.' });
    return null;
  }
  let rate = mapping.rate && mapping.rate > 0 ? mapping.rate : measureRate(store);
  if (!rate) {
    rate = 25;
    log.warn('rate', { message: 'No rate given and none measurable from the time column; assumed 25 Hz (common practice).', hint: 'Set the rate in the mapping.' });
  }
  const frames = store.entryFrame.data;
  const times = store.entryTime.data;
  for (let i = 0; i < n; i++) if (frames[i] !== frames[i]) frames[i] = Math.round(times[i] * rate);
  const periodOf = assignPeriods(store, mapping, rate, log);

  // First and last frame per period, and order checks in file order.
  const first = new Map<number, number>();
  const last = new Map<number, number>();
  const dropped = new Uint8Array(n);
  for (let i = 0; i < n; i++) {
    const p = periodOf[i];
    if (!p) {
      dropped[i] = 1;
      continue;
    }
    const prev = last.get(p);
    const fr = frames[i];
    if (prev !== undefined && fr <= prev) {
      const line = store.entryLine.data[i];
      if (fr === prev) {
        log.warn('duplicate-frame', { line, time: clockLabel(p, (fr - first.get(p)!) / rate), message: `Frame ${fr} of period ${p} appears twice; the first copy is kept.`, hint: 'Remove the repeated rows.' });
      } else {
        log.error('non-monotonic', {
          line,
          time: clockLabel(p, (fr - first.get(p)!) / rate),
          message: `Frame ${fr} of period ${p} comes after frame ${prev}: frames go backwards.`,
          hint: 'Sort the file by period and frame, or check whether two files were joined.',
        });
      }
      dropped[i] = 1;
      continue;
    }
    if (prev === undefined) first.set(p, fr);
    last.set(p, fr);
  }
  if (log.hasErrors()) return null;

  const objects = store.objects;
  const nObj = objects.length;
  if (nObj === 0) {
    log.error('no-objects', { message: 'No objects (players or ball) found.', hint: 'Check the object id or x/y columns in the mapping.' });
    return null;
  }
  const periodIds = [...first.keys()].sort((a, b) => a - b);
  // A span far beyond the frames present means a jump in the frame numbers, not a gap in
  // the recording (20 minutes of gap allowed, beyond four times the frames present).
  const entriesIn = new Map<number, number>();
  for (let i = 0; i < n; i++) if (!dropped[i]) entriesIn.set(periodOf[i], (entriesIn.get(periodOf[i]) ?? 0) + 1);
  for (const p of periodIds) {
    const span = last.get(p)! - first.get(p)! + 1;
    if (span > 4 * entriesIn.get(p)! + rate * 1200) {
      let worst = 0;
      let line = 0;
      let prev = -1;
      for (let i = 0; i < n; i++) {
        if (dropped[i] || periodOf[i] !== p) continue;
        if (prev !== -1 && frames[i] - frames[prev] > worst) {
          worst = frames[i] - frames[prev];
          line = store.entryLine.data[i];
        }
        prev = i;
      }
      log.error('frame-jump', {
        line,
        message: `Period ${p}: frame numbers jump by ${worst} (${(worst / rate / 60).toFixed(1)} min at ${rate} Hz) with only ${entriesIn.get(p)} frames present.`,
        hint: 'Check the frame column, or split periods at this gap (periods from time gaps).',
      });
    }
  }
  if (log.hasErrors()) return null;
  let cells = 0;
  for (const p of periodIds) cells += (last.get(p)! - first.get(p)! + 1) * nObj;
  if (cells > MAX_CELLS) {
    log.error('too-many-frames', {
      message: `Frame numbers span ${cells / nObj} frames, far more than a match has.`,
      hint: 'Check the frame column (it may hold something else, like a timestamp in ms).',
    });
    return null;
  }

  const ballIndex = objects.findIndex((o) => o.role === 'ball' || o.id === mapping.ballId);
  if (ballIndex >= 0) objects[ballIndex].role = 'ball';
  const count = store.sampleCount;
  const sE = store.sampleEntry;
  const sO = store.sampleObject;
  const sX = store.sampleX;
  const sY = store.sampleY;
  const sZ = store.sampleZ;
  let hasZ = false;
  for (let k = 0; k < count && !hasZ; k++) hasZ = sO[k] === ballIndex && sZ[k] === sZ[k];
  const periods = new Map<number, TrackingPeriod>();
  for (const p of periodIds) {
    const frameCount = last.get(p)! - first.get(p)! + 1;
    const x = new Float32Array(frameCount * nObj).fill(NaN);
    const y = new Float32Array(frameCount * nObj).fill(NaN);
    const tp: TrackingPeriod = { period: p, firstFrame: first.get(p)!, frameCount, present: new Uint8Array(frameCount), x, y, homeAttacks: 'positive_x' };
    if (hasZ) tp.ballZ = new Float32Array(frameCount).fill(NaN);
    periods.set(p, tp);
  }
  for (let i = 0; i < n; i++) if (!dropped[i]) periods.get(periodOf[i])!.present[frames[i] - first.get(periodOf[i])!] = 1;

  // The conversion inlined as scale and shift (see coordinates.ts), for speed on millions of samples.
  const [x0, sx] = affine(makeConverter(mapping.coordinates).x);
  const [y0, sy] = affine(makeConverter(mapping.coordinates).y);
  const zScale = unitScale(mapping);
  const halfL = mapping.coordinates.pitch.length / 2 + OFF_PITCH_MARGIN_M;
  const halfW = mapping.coordinates.pitch.width / 2 + OFF_PITCH_MARGIN_M;
  let finite = 0;
  let off = 0;
  let dupObjects = 0;
  let k = 0;
  // Samples are in entry order: walk entries, and each entry's run of samples.
  for (let e = 0; e < n; e++) {
    const runStart = k;
    while (k < count && sE[k] === e) k++;
    if (dropped[e]) continue;
    const tp = periods.get(periodOf[e])!;
    const px = tp.x;
    const py = tp.y;
    const f = frames[e] - tp.firstFrame;
    const rowBase = f * nObj;
    for (let j = runStart; j < k; j++) {
      const o = sO[j];
      const idx = rowBase + o;
      const rx = sX[j];
      const ry = sY[j];
      if (px[idx] === px[idx]) {
        if (dupObjects++ < 20) log.warn('duplicate-object', { line: store.entryLine.data[e], message: `${objects[o].id} appears twice in frame ${frames[e]}; the first is kept.`, hint: 'Remove the repeated rows.' });
        continue;
      }
      if (rx !== rx || ry !== ry) continue;
      const cx = x0 + rx * sx;
      const cy = y0 + ry * sy;
      px[idx] = cx;
      py[idx] = cy;
      if (o === ballIndex && tp.ballZ) tp.ballZ[f] = sZ[j] * zScale;
      finite++;
      if (cx > halfL || cx < -halfL || cy > halfW || cy < -halfW) {
        off++;
        log.warn('off-pitch', {
          line: store.entryLine.data[e],
          time: clockLabel(tp.period, f / rate),
          message: `${objects[o].id} at (${cx.toFixed(1)}, ${cy.toFixed(1)}) m is more than ${OFF_PITCH_MARGIN_M} m off the pitch.`,
          hint: 'Check units and origin in the mapping if many positions are off.',
        });
      }
    }
  }
  if (finite > 0 && off > finite / 2) {
    log.error('mostly-off-pitch', {
      message: `${off} of ${finite} positions are far off a ${mapping.coordinates.pitch.length} x ${mapping.coordinates.pitch.width} m pitch.`,
      hint: 'The unit or origin in the mapping is probably wrong (m / cm / normalised; centre or corner).',
    });
    return null;
  }

  const out: TrackingPeriod[] = [];
  for (const p of periodIds) {
    const tp = periods.get(p)!;
    const missing = tp.frameCount - tp.present.reduce((a, b) => a + b, 0);
    if (missing > 0) log.warn('missing-frames', { message: `Period ${p}: ${missing} of ${tp.frameCount} frames are missing; they are kept as gaps.`, hint: 'Nothing to do unless the gaps are long.' });
    tp.homeAttacks = homeAttacks(tp, objects, rate, log);
    out.push(tp);
  }
  return { rate, pitch: mapping.coordinates.pitch, objects, ballIndex, periods: out };
}

/** Shift and scale of a linear map v -> a + b v, read off the converter at 0 and 1. */
function affine(f: (v: number) => number): [number, number] {
  const a = f(0);
  return [a, f(1) - a];
}

/** Height uses the length unit (normalised grids give no height unit; taken as metres). */
function unitScale(m: TrackingMapping): number {
  const u = m.coordinates.unit;
  return u === 'cm' ? 0.01 : u === 'mm' ? 0.001 : 1;
}

/**
 * Which way home attacks: at kick-off each team stands in its own half (Law 8), so the
 * team whose players' mean x is lower attacks towards positive x.
 */
function homeAttacks(tp: TrackingPeriod, objects: FrameStore['objects'], rate: number, log: ProblemLog): TrackingPeriod['homeAttacks'] {
  const nObj = objects.length;
  const kickOffFrames = Math.min(tp.frameCount, Math.max(1, Math.round(KICK_OFF_WINDOW_S * rate)));
  const sum = { home: 0, away: 0 };
  const count = { home: 0, away: 0 };
  for (let f = 0; f < kickOffFrames; f++) {
    for (let o = 0; o < nObj; o++) {
      const team = objects[o].team;
      if (!team || objects[o].role !== 'player') continue;
      const v = tp.x[f * nObj + o];
      if (v === v) {
        sum[team] += v;
        count[team]++;
      }
    }
  }
  if (!count.home || !count.away) {
    const guess = tp.period % 2 === 1 ? 'positive_x' : 'negative_x';
    log.warn('direction', { time: clockLabel(tp.period, 0), message: `Period ${tp.period}: cannot see both teams in the first seconds; home taken to attack ${guess}.`, hint: 'Objects need team ids (home_7, away_11) or a team column.' });
    return guess;
  }
  return sum.home / count.home < sum.away / count.away ? 'positive_x' : 'negative_x';
}
