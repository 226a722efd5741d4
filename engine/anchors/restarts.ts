/**
 * Restarts seen in tracking: the ball goes dead (leaves the field or stops), is placed
 * and stands still, then is played. Each restart becomes an anchor at the moment the
 * ball is played, classified by where it stood (Law 1 geometry) and, for kick-offs, by
 * the formation (Law 8: everyone in their own half). Without ball data, kick-offs are
 * found from the formation alone, with lower confidence.
 */
import type { Anchor, Seconds, TeamSide, TrackingData, TrackingPeriod } from '../../shared-types/domain.ts';
import { savgolSeries } from '../kinematics/savgol.ts';
import { median } from '../fit/robust.ts';
import { outOfField, restartKindAt } from './geometry.ts';

export interface RestartOptions {
  /** Shortest stillness before a restart at a marked place, s. */
  minStillS?: Seconds;
  /** Shortest stillness for a free kick (anywhere else on the field), s. */
  freeKickMinStillS?: Seconds;
  /** Distance from the resting place that counts as "moved off", m (about 6 SD of ball noise). */
  moveDist?: number;
}

/** A tracking restart anchor, with what the refinement step needs beside the Anchor fields. */
export interface RestartAnchor extends Anchor {
  /** Frame index within the period's arrays (not the file's frame number). */
  frameIndex: number;
  /** Tracking time the ball came to rest at the spot. */
  stillFromT: Seconds;
  /** Object index of the nearest player when the ball was played (the taker). */
  takerIndex?: number;
  takerTeam?: TeamSide;
  takerShirt?: number;
}

const DEFAULTS: Required<RestartOptions> = { minStillS: 0.6, freeKickMinStillS: 0.9, moveDist: 0.45 };

/**
 * `detectRestarts(tracking) -> Anchor[]` (kick-offs, goal kicks, corners, throw-ins,
 * free kicks, penalties; plus period_start / period_end), sorted by period and time.
 */
export function detectRestarts(tracking: TrackingData, opts: RestartOptions = {}): RestartAnchor[] {
  const o = { ...DEFAULTS, ...opts };
  const out: RestartAnchor[] = [];
  for (const p of tracking.periods) {
    const found = tracking.ballIndex >= 0 ? restartsFromBall(tracking, p, o) : kickOffsFromFormation(tracking, p);
    out.push(...found);
    const firstKick = found.find((a) => a.kind === 'kick_off');
    if (firstKick)
      out.push({ ...firstKick, id: `trk-p${p.period}-start`, kind: 'period_start', note: 'first kick-off of the period' });
    const last = lastPresentFrame(p);
    if (last >= 0)
      out.push({
        id: `trk-p${p.period}-end`, source: 'tracking', kind: 'period_end', period: p.period, t: last / tracking.rate,
        confidence: 0.3, note: 'last tracked frame of the period (the whistle is usually a little earlier)',
        frameIndex: last, stillFromT: last / tracking.rate,
      });
  }
  return out.sort((a, b) => a.period - b.period || a.t - b.t);
}

function lastPresentFrame(p: TrackingPeriod): number {
  for (let f = p.frameCount - 1; f >= 0; f--) if (p.present[f]) return f;
  return -1;
}

/** Copy one object's coordinate out of the frame-major arrays. */
export function column(arr: Float32Array, objectIndex: number, objectCount: number, frames: number): Float64Array {
  const out = new Float64Array(frames);
  for (let f = 0; f < frames; f++) out[f] = arr[f * objectCount + objectIndex];
  return out;
}

function restartsFromBall(tracking: TrackingData, p: TrackingPeriod, o: Required<RestartOptions>): RestartAnchor[] {
  const { rate, pitch } = tracking;
  const nObj = tracking.objects.length;
  const n = p.frameCount;
  const bx = column(p.x, tracking.ballIndex, nObj, n);
  const by = column(p.y, tracking.ballIndex, nObj, n);
  const out: RestartAnchor[] = [];
  const runs = stillRuns(bx, by, rate, o.moveDist).filter((r) => (r.g - r.a + 1) / rate >= o.minStillS);
  for (let ri = 0; ri < runs.length; ri++) {
    const { a, g, px, py } = runs[ri];
    const dur = (g - a + 1) / rate;
    // Resting off the field is not a placed ball (a thrower may stand a little behind the touchline).
    if (Math.abs(px) > pitch.length / 2 + 0.5 || Math.abs(py) > pitch.width / 2 + 1.5) continue;
    const kick = kickMoment(bx, by, px, py, g + 1, n, rate, o.moveDist);
    if (!kick) continue; // never played: the ball came to rest after the whistle, say
    // A slow departure that stops again within 3 s is the ball being walked to its spot.
    const next = runs[ri + 1];
    if (kick.speed <= 7 && next && next.a / rate - kick.t < 3) continue;
    let kind = restartKindAt(px, py, pitch);
    const z = p.ballZ ? median(p.ballZ.subarray(a, g + 1).filter((v) => !Number.isNaN(v))) : NaN;
    // A ball held at hand height is a throw-in when at the touchline (Law 15, even near a
    // corner), otherwise a keeper's ball, not a placed one.
    if (z > 0.4 && kind !== 'throw_in') {
      if (Math.abs(py) >= pitch.width / 2 - 0.6) kind = 'throw_in';
      else continue;
    }
    // Restarts after the ball left the field need it to have left (Laws 15–17); a keeper
    // holding the ball in the goal area looks like a goal kick otherwise.
    // Held overhead at the touchline is a throw-in by itself (Law 15); so is a ball resting on the touchline itself: open play does not park a ball there.
    const heldForThrow = kind === 'throw_in' && (z > 1.5 || Math.abs(py) >= pitch.width / 2 - 0.25);
    if ((kind === 'goal_kick' || kind === 'corner' || kind === 'throw_in') && !heldForThrow && !wentOutBefore(bx, by, a, rate, pitch)) continue;
    // Set pieces other than kick-offs and throws are struck (the simulator and common
    // practice: passes leave at 8 m/s or more); a slower start is someone nudging the ball.
    if (kick.speed <= 6 && kind !== 'kick_off' && kind !== 'throw_in') continue;
    const frame0 = Math.min(n - 1, Math.max(0, Math.round(kick.t * rate)));
    let confidence = Math.min(1, 0.55 + 0.15 * Math.min(dur, 3) + (kick.clean ? 0.0 : -0.2));
    let note = `ball still ${dur.toFixed(1)} s at (${px.toFixed(1)}, ${py.toFixed(1)}), then played at ${kick.speed.toFixed(0)} m/s`;
    if (kind === 'kick_off') {
      const share = ownHalfShare(tracking, p, frame0);
      if (share !== undefined && share < 0.8) {
        kind = 'free_kick';
        note += `; only ${(share * 100).toFixed(0)}% in own half, so not a kick-off`;
      } else if (share !== undefined) {
        confidence = Math.max(confidence, 0.95);
        note += `; ${(share * 100).toFixed(0)}% of players in own half`;
      }
    }
    if (kind === 'free_kick') {
      if (dur < o.freeKickMinStillS) continue;
      // Law 13: opponents at least 9.15 m away (some leeway for tracking noise).
      const gap = nearestOpponentGap(tracking, p, frame0, px, py);
      if (gap !== undefined && gap < 8) continue;
      // Inside a penalty area only when the height shows the ball on the ground (see above).
      if (inPenaltyArea(px, py, pitch) && !(z <= 0.4)) continue;
    }
    const frame = frame0;
    const taker = nearestPlayer(tracking, p, frame, px, py);
    out.push({
      id: `trk-p${p.period}-${out.length + 1}`, source: 'tracking', kind, period: p.period, t: kick.t, x: px, y: py,
      confidence, note, frameIndex: frame, stillFromT: a / rate,
      takerIndex: taker?.index, takerTeam: taker?.team, takerShirt: taker?.shirt,
    });
  }
  return out;
}

/**
 * Stretches where the ball stays within `radius` of where it rests: frames a..g and the
 * mean resting place. Missing frames (NaN) up to half a second do not end a stretch, so
 * a dropped frame does not split a restart in two.
 */
export function stillRuns(bx: Float64Array, by: Float64Array, rate: number, radius: number) {
  const runs: { a: number; g: number; px: number; py: number }[] = [];
  const maxGap = Math.round(0.5 * rate);
  const n = bx.length;
  let f = 0;
  while (f < n) {
    if (Number.isNaN(bx[f])) { f++; continue; }
    let sx = bx[f], sy = by[f], cnt = 1, g = f, h = f + 1;
    while (h < n && h - g <= maxGap) {
      if (Number.isNaN(bx[h])) { h++; continue; }
      if (Math.hypot(bx[h] - sx / cnt, by[h] - sy / cnt) > radius) break;
      sx += bx[h]; sy += by[h]; cnt++; g = h; h++;
    }
    if (g > f) runs.push({ a: f, g, px: sx / cnt, py: sy / cnt });
    f = g + 1;
  }
  return runs;
}

/**
 * Whether the ball was off the field since it last flew (a pass or shot in the field)
 * before frame a: scanning back up to 40 s, an off-field frame must come before any
 * in-field movement faster than 8 m/s (fetching a ball back is slower than that).
 */
function wentOutBefore(bx: Float64Array, by: Float64Array, a: number, rate: number, pitch: { length: number; width: number }): boolean {
  const step = Math.max(1, Math.round(0.2 * rate));
  for (let f = a; f >= Math.max(0, a - 40 * rate); f--) {
    if (Number.isNaN(bx[f])) continue;
    if (outOfField(bx[f], by[f], pitch, 0.05)) return true;
    const e = f - step;
    if (e >= 0 && !Number.isNaN(bx[e]) && Math.hypot(bx[f] - bx[e], by[f] - by[e]) * (rate / step) > 8) return false;
  }
  return false;
}

function inPenaltyArea(x: number, y: number, pitch: { length: number; width: number }): boolean {
  return Math.abs(x) >= pitch.length / 2 - 16.5 && Math.abs(y) <= 7.32 / 2 + 16.5;
}

/**
 * When a resting ball at (px, py) is played: the first frame it is moveDist away, then a
 * straight-line fit of distance against time over the next frames, extrapolated back to
 * distance 0 — sub-frame, and free of the smoothing window's lag.
 */
export function kickMoment(bx: Float64Array, by: Float64Array, px: number, py: number, from: number, n: number,
  rate: number, moveDist: number, minSpeed = 4): { t: Seconds; clean: boolean; speed: number } | undefined {
  let f1 = -1;
  for (let f = from; f < n; f++) {
    if (Number.isNaN(bx[f])) continue;
    if (Math.hypot(bx[f] - px, by[f] - py) > moveDist) {
      f1 = f;
      break;
    }
  }
  if (f1 < 0) return undefined;
  // It must really leave: well away within half a second.
  const check = Math.min(n - 1, f1 + Math.round(0.5 * rate));
  let left = false;
  for (let f = f1; f <= check; f++) if (!Number.isNaN(bx[f]) && Math.hypot(bx[f] - px, by[f] - py) > 1.5) left = true;
  if (!left) return undefined;
  const k = Math.max(3, Math.round(0.25 * rate));
  const ts: number[] = [];
  const ds: number[] = [];
  for (let f = f1; f < Math.min(n, f1 + k); f++) {
    if (Number.isNaN(bx[f])) break;
    ts.push(f / rate);
    ds.push(Math.hypot(bx[f] - px, by[f] - py));
  }
  const lo = (f1 - 2) / rate;
  const hi = f1 / rate;
  if (ts.length < 2) return undefined;
  const mt = ts.reduce((s, v) => s + v, 0) / ts.length;
  const md = ds.reduce((s, v) => s + v, 0) / ds.length;
  let sxy = 0, sxx = 0;
  for (let i = 0; i < ts.length; i++) {
    sxy += (ts[i] - mt) * (ds[i] - md);
    sxx += (ts[i] - mt) ** 2;
  }
  const v = sxy / sxx;
  // Played, not carried: passes, shots and throws leave faster than anyone walks a ball back.
  if (!(v > minSpeed)) return undefined;
  const t = mt - md / v;
  return { t: Math.min(hi, Math.max(lo, t)), clean: t >= lo - 0.5 / rate && t <= hi + 0.5 / rate, speed: v };
}

export function nearestPlayer(tracking: TrackingData, p: TrackingPeriod, frame: number, x: number, y: number) {
  const nObj = tracking.objects.length;
  let best: { index: number; team?: TeamSide; shirt?: number; dist: number } | undefined;
  for (let i = 0; i < nObj; i++) {
    const ob = tracking.objects[i];
    if (ob.role !== 'player') continue;
    const px = p.x[frame * nObj + i];
    const py = p.y[frame * nObj + i];
    if (Number.isNaN(px)) continue;
    const d = Math.hypot(px - x, py - y);
    if (!best || d < best.dist) best = { index: i, team: ob.team, shirt: ob.shirt, dist: d };
  }
  return best;
}

/**
 * Distance from the ball to the nearest player of the side that is not taking the kick
 * (the taker's side is the nearest player's).
 */
export function nearestOpponentGap(tracking: TrackingData, p: TrackingPeriod, frame: number, x: number, y: number): number | undefined {
  const taker = nearestPlayer(tracking, p, frame, x, y);
  if (!taker?.team) return undefined;
  const nObj = tracking.objects.length;
  let best = Infinity;
  for (let i = 0; i < nObj; i++) {
    const ob = tracking.objects[i];
    if (ob.role !== 'player' || !ob.team || ob.team === taker.team) continue;
    const d = Math.hypot(p.x[frame * nObj + i] - x, p.y[frame * nObj + i] - y);
    if (d < best) best = d;
  }
  return Number.isFinite(best) ? best : undefined;
}

/** Share of players with a known team standing in their own half (Law 8), 0.5 m leeway. */
export function ownHalfShare(tracking: TrackingData, p: TrackingPeriod, frame: number): number | undefined {
  const nObj = tracking.objects.length;
  const homeSign = p.homeAttacks === 'positive_x' ? 1 : -1;
  let inOwn = 0, seen = 0;
  for (let i = 0; i < nObj; i++) {
    const ob = tracking.objects[i];
    if (ob.role !== 'player' || !ob.team) continue;
    const x = p.x[frame * nObj + i];
    if (Number.isNaN(x)) continue;
    const attack = ob.team === 'home' ? homeSign : -homeSign;
    seen++;
    if (attack * x <= 0.5) inOwn++;
  }
  return seen >= 6 ? inOwn / seen : undefined;
}

/**
 * Kick-offs without a ball: a stretch of at least 2 s with (nearly) every player in their
 * own half and nearly still, ended by a burst of movement. The anchor is the moment the
 * mean speed rises, which trails the kick by a few tenths of a second.
 */
function kickOffsFromFormation(tracking: TrackingData, p: TrackingPeriod): RestartAnchor[] {
  const { rate } = tracking;
  const nObj = tracking.objects.length;
  const n = p.frameCount;
  const players = tracking.objects.map((ob, i) => ({ ob, i })).filter((e) => e.ob.role === 'player' && e.ob.team);
  if (players.length < 6) return [];
  const meanSpeed = new Float64Array(n).fill(NaN);
  const half = Math.max(2, Math.round(0.2 * rate));
  const sums = new Float64Array(n);
  const counts = new Float64Array(n);
  for (const { i } of players) {
    const vx = savgolSeries(column(p.x, i, nObj, n), { half, order: 2, deriv: 1, dt: 1 / rate });
    const vy = savgolSeries(column(p.y, i, nObj, n), { half, order: 2, deriv: 1, dt: 1 / rate });
    for (let f = 0; f < n; f++) {
      const s = Math.hypot(vx[f], vy[f]);
      if (!Number.isNaN(s)) {
        sums[f] += s;
        counts[f]++;
      }
    }
  }
  for (let f = 0; f < n; f++) if (counts[f] >= 6) meanSpeed[f] = sums[f] / counts[f];
  const formed = (f: number) => meanSpeed[f] < 0.8 && (ownHalfShare(tracking, p, f) ?? 0) >= 0.95;
  const out: RestartAnchor[] = [];
  let f = 0;
  while (f < n) {
    if (!formed(f)) {
      f++;
      continue;
    }
    let g = f;
    while (g + 1 < n && formed(g + 1)) g++;
    const dur = (g - f + 1) / rate;
    const a = f;
    f = g + 1;
    if (dur < 2) continue;
    // The burst: mean speed climbs past 1.5 m/s within 2 s after the stillness ends.
    let burst = -1;
    for (let h = g; h < Math.min(n, g + 2 * rate); h++) if (meanSpeed[h] > 1.5) { burst = h; break; }
    if (burst < 0) continue;
    out.push({
      id: `trk-p${p.period}-k${out.length + 1}`, source: 'tracking', kind: 'kick_off', period: p.period,
      t: (g + 1) / rate, x: 0, y: 0, confidence: 0.5, frameIndex: g + 1, stillFromT: a / rate,
      note: `no ball data: players in own halves and still for ${dur.toFixed(1)} s, then moving`,
    });
  }
  return out;
}
