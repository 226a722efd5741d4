/**
 * Event refinement: every logged event gets candidate moments in tracking within a
 * kind-specific window around its clock-mapped time, each scored (score.ts); the choice
 * is made jointly for all events of a period by a monotone dynamic programme
 * (choose.ts). Output: one ProposedCorrection per event, in log order.
 */
import type { ChangeKind, ClockFit, EventLog, MatchEvent, PeriodId, ProposedCorrection, TrackingData, TrackingPeriod } from '../../shared-types/domain.ts';
import { isRestartKind } from '../../shared-types/domain.ts';
import type { RestartAnchor } from '../anchors/restarts.ts';
import { column } from '../anchors/restarts.ts';
import { mapTime } from '../fit/clock.ts';
import { ballTouches } from './kicks.ts';
import { chooseMonotone, type EventOptions } from './choose.ts';
import { candidateKindsFor, kindWindow, NULL_SCORE, scoreCandidate, type Candidate, type PlayerAtBall } from './score.ts';

/** Everything refinement reads from one tracking period, computed once. */
export interface PeriodScene {
  period: TrackingPeriod;
  candidates: Candidate[];
  /** Object index by "home:7". */
  playerIndex: Map<string, number>;
  duration: number;
}

/** `buildScenes(tracking, restarts) -> Map<period, PeriodScene>` */
export function buildScenes(tracking: TrackingData, restarts: RestartAnchor[]): Map<PeriodId, PeriodScene> {
  const nObj = tracking.objects.length;
  const playerIndex = new Map<string, number>();
  tracking.objects.forEach((o, i) => {
    if (o.role === 'player' && o.team && o.shirt !== undefined) playerIndex.set(`${o.team}:${o.shirt}`, i);
  });
  const scenes = new Map<PeriodId, PeriodScene>();
  for (const p of tracking.periods) {
    const candidates: Candidate[] = [];
    const own = restarts.filter((r) => r.period === p.period && r.kind !== 'period_start' && r.kind !== 'period_end');
    for (const r of own)
      candidates.push({ t: r.t, frameIndex: r.frameIndex, x: r.x ?? 0, y: r.y ?? 0, kind: 'restart', dv: 10, speedAfter: 10, restartKind: r.kind, restartId: r.id });
    if (tracking.ballIndex >= 0) {
      const bx = column(p.x, tracking.ballIndex, nObj, p.frameCount);
      const by = column(p.y, tracking.ballIndex, nObj, p.frameCount);
      for (const k of ballTouches(bx, by, tracking.rate)) {
        // A touch at a restart's moment is that restart.
        if (own.some((r) => Math.abs(r.t - k.t) < 0.2)) continue;
        candidates.push({ t: k.t, frameIndex: k.frameIndex, x: k.x, y: k.y, kind: 'touch', dv: k.dv, speedAfter: k.speedAfter });
      }
      candidates.push(...goalLineCrossings(bx, by, tracking));
    }
    candidates.sort((a, b) => a.t - b.t);
    scenes.set(p.period, { period: p, candidates, playerIndex, duration: (p.frameCount - 1) / tracking.rate });
  }
  return scenes;
}

/** Frames where the ball crosses a goal line between the posts (Law 1: 7.32 m apart). */
function goalLineCrossings(bx: Float64Array, by: Float64Array, tracking: TrackingData): Candidate[] {
  const hl = tracking.pitch.length / 2;
  const out: Candidate[] = [];
  let last = -Infinity;
  for (let f = 1; f < bx.length; f++) {
    const a = bx[f - 1], b = bx[f];
    if (Number.isNaN(a) || Number.isNaN(b)) continue;
    for (const side of [-1, 1]) {
      if (side * a <= hl && side * b > hl) {
        const u = (side * hl - a) / (b - a);
        const y = by[f - 1] + u * (by[f] - by[f - 1]);
        const t = (f - 1 + u) / tracking.rate;
        if (Math.abs(y) <= 7.32 / 2 + 0.5 && t - last > 2) {
          out.push({ t, frameIndex: f, x: side * hl, y, kind: 'goal_line', dv: 0, speedAfter: 0 });
          last = t;
        }
      }
    }
  }
  return out;
}

function playerAt(e: MatchEvent, scene: PeriodScene, tracking: TrackingData, c: Candidate): PlayerAtBall | undefined {
  if (!e.team) return undefined;
  const p = scene.period;
  const f = Math.min(p.frameCount - 1, Math.max(0, Math.round(c.t * tracking.rate)));
  const g = Math.min(p.frameCount - 1, f + Math.round(0.4 * tracking.rate));
  const shirt = e.player !== undefined ? Number.parseInt(e.player, 10) : NaN;
  const idx = Number.isFinite(shirt) ? scene.playerIndex.get(`${e.team}:${shirt}`) : undefined;
  if (idx !== undefined) {
    const d = distAt(p, tracking, idx, f, c.x, c.y);
    if (!Number.isNaN(d)) return { dist: d, distAfter: distToBall(p, tracking, idx, g), tagged: true, label: `${e.team} ${shirt}` };
  }
  // No such shirt in tracking: the nearest player of the team stands in.
  let best = Infinity, who = -1;
  for (let i = 0; i < tracking.objects.length; i++) {
    const o = tracking.objects[i];
    if (o.role !== 'player' || o.team !== e.team) continue;
    const d = distAt(p, tracking, i, f, c.x, c.y);
    if (d < best) { best = d; who = i; }
  }
  return who >= 0 ? { dist: best, distAfter: distToBall(p, tracking, who, g), tagged: false, label: `${e.team} (nearest player)` } : undefined;
}

/** Distance of object i at frame f from (x, y); NaN where missing. */
function distAt(p: TrackingPeriod, tracking: TrackingData, i: number, f: number, x: number, y: number): number {
  const n = tracking.objects.length;
  return Math.hypot(p.x[f * n + i] - x, p.y[f * n + i] - y);
}

/** Distance of object i from the ball at frame g; Infinity when either is missing. */
function distToBall(p: TrackingPeriod, tracking: TrackingData, i: number, g: number): number {
  const b = tracking.ballIndex;
  if (b < 0) return Infinity;
  const n = tracking.objects.length;
  const d = Math.hypot(p.x[g * n + i] - p.x[g * n + b], p.y[g * n + i] - p.y[g * n + b]);
  return Number.isNaN(d) ? Infinity : d;
}

export interface RefineResult {
  corrections: ProposedCorrection[];
}

/** Events that say nothing the tracking can show. */
const UNPLACEABLE_WHY: Partial<Record<string, string>> = {
  period_end: 'the end of a period has no ball signature in tracking',
  other: 'this kind of event has no ball signature the engine looks for',
};

/**
 * `refineEvents(tracking, log, fit, scenes) -> ProposedCorrection[]` (one per event, log
 * order; unplaceable events keep the mapped logged time and say why).
 */
export function refineEvents(tracking: TrackingData, log: EventLog, fit: ClockFit, scenes: Map<PeriodId, PeriodScene>): ProposedCorrection[] {
  const out = new Array<ProposedCorrection>(log.events.length);
  const byPeriod = new Map<PeriodId, number[]>();
  log.events.forEach((e, i) => {
    const list = byPeriod.get(e.period) ?? [];
    list.push(i);
    byPeriod.set(e.period, list);
  });
  for (const [period, idxs] of byPeriod) {
    const scene = scenes.get(period);
    const firstFrame = scene?.period.firstFrame ?? 0;
    const frameOf = (t: number) => firstFrame + Math.round(t * tracking.rate);
    const unplaced = (i: number, tp: number, reason: string): ProposedCorrection => {
      const e = log.events[i];
      return { eventId: e.id, trackingPeriod: period, trackingTime: tp, trackingFrame: Number.isFinite(tp) ? frameOf(tp) : NaN,
        predictedTime: tp, x: e.x, y: e.y, change: 'none', confidence: 0, reason, placed: false };
    };
    const predicted = idxs.map((i) => mapTime(fit, period, log.events[i].t));
    if (!scene) {
      idxs.forEach((i, k) => (out[i] = unplaced(i, predicted[k], `tracking has no period ${period}`)));
      continue;
    }
    // Candidates per event, then the joint choice.
    const perEvent: { cands: Candidate[]; scores: number[] }[] = [];
    const dp: EventOptions[] = [];
    idxs.forEach((i, k) => {
      const e = log.events[i];
      const tp = predicted[k];
      // Without a ball only restarts (kick-offs from the formation) can be placed.
      const kinds = tracking.ballIndex >= 0 ? candidateKindsFor(e.kind) : candidateKindsFor(e.kind).filter(() => isRestartKind(e.kind) || e.kind === 'period_start');
      const w = kindWindow(e.kind);
      let cands = kinds.length && Number.isFinite(tp) ? inWindow(scene.candidates, tp - w.before, tp + w.after).filter((c) => kinds.includes(c.kind)) : [];
      let scores = cands.map((c) => scoreCandidate(e, c, tp, playerAt(e, scene, tracking, c)));
      if (e.kind === 'period_start') {
        // Law 8: a period starts with its kick-off, wherever the log's clock put the row
        // (taggers often start their clock well before the ball is played).
        const first = scene.candidates.find((c) => c.kind === 'restart' && c.restartKind === 'kick_off');
        cands = first ? [first] : [];
        scores = cands.map(() => 0);
      }
      perEvent.push({ cands, scores });
      dp.push({ options: cands.map((c, j) => ({ t: c.t, score: scores[j] })), nullScore: NULL_SCORE, mayTie: e.kind === 'period_start' || e.kind === 'kick_off' || e.kind === 'goal' });
    });
    // Goal kicks are logged seconds off (common practice), often after the passes that
    // followed them, and a shot logged late can land after its own goal; forcing those
    // into the log's order would throw away either them or their neighbours. Goal kicks
    // and goals (both with unmistakable candidates) form their own ordered chains;
    // everything else keeps log order.
    const chainOf = (kind: string) => (kind === 'goal_kick' ? 1 : kind === 'goal' ? 2 : 0);
    const chain = idxs.map((i) => chainOf(log.events[i].kind));
    const picks = new Array<number>(idxs.length).fill(-1);
    for (const wanted of [0, 1, 2]) {
      const ks = idxs.map((_, k) => k).filter((k) => chain[k] === wanted);
      chooseMonotone(ks.map((k) => dp[k])).forEach((pick, j) => (picks[ks[j]] = pick));
    }
    idxs.forEach((i, k) => {
      const e = log.events[i];
      const tp = predicted[k];
      const { cands, scores } = perEvent[k];
      if (!Number.isFinite(tp)) return void (out[i] = unplaced(i, tp, `no clock fit for period ${period}`));
      const why = UNPLACEABLE_WHY[e.kind];
      if (why) return void (out[i] = unplaced(i, tp, `${why}; kept the logged time`));
      const pick = picks[k];
      if (pick < 0 && (tp < -5 || tp > scene.duration + 5)) return void (out[i] = unplaced(i, tp, `the logged time maps to ${tp.toFixed(1)} s, outside the tracking of period ${period}; kept the logged time`));
      if (pick < 0) {
        const w = kindWindow(e.kind);
        const who = e.team ? `${e.team}${e.player ? ' ' + e.player : ''}` : 'anyone';
        if (tracking.ballIndex < 0 && !isRestartKind(e.kind)) return void (out[i] = unplaced(i, tp, 'the tracking has no ball, so only kick-offs can be placed; kept the logged time'));
        const what = cands.length ? `${cands.length} candidate moments, none convincing` : 'no ball touch';
        return void (out[i] = unplaced(i, tp, `${what} for ${who} between ${w.before} s before and ${w.after} s after the logged time; kept the logged time`));
      }
      const c = cands[pick];
      // Confidence: the chosen candidate's share among this event's options (softmax).
      const top = Math.max(NULL_SCORE, ...scores);
      let z = Math.exp(NULL_SCORE - top);
      for (const s of scores) z += Math.exp(s - top);
      const confidence = Math.exp(scores[pick] - top) / z;
      const dt = c.t - tp;
      const restart = isRestartKind(e.kind) || e.kind === 'period_start';
      let x = e.x, y = e.y;
      let moved = false;
      if (restart && c.kind === 'restart') {
        x = c.x;
        y = c.y;
        moved = e.x === undefined || e.y === undefined || Math.hypot(c.x - e.x, c.y - e.y) > 1.5;
      }
      const timed = Math.abs(dt) > 1 / tracking.rate;
      const change: ChangeKind = timed && moved ? 'time+location' : timed ? 'time' : moved ? 'location' : 'none';
      const when = Math.abs(dt) < 0.05 ? 'at the logged time' : `${Math.abs(dt).toFixed(1)} s ${dt > 0 ? 'after' : 'before'} the logged time`;
      const p = playerAt(e, scene, tracking, c);
      let reason: string;
      if (c.kind === 'goal_line') reason = `ball crossed the goal line ${when}`;
      else if (c.kind === 'restart' && e.kind === ('period_start' as string)) reason = `the period starts with its kick-off, ${when}`;
      else if (c.kind === 'restart') {
        reason = `ball, still at (${c.x.toFixed(1)}, ${c.y.toFixed(1)}), played ${when}`;
        if (p?.tagged) reason += ` by ${p.label}`;
        if (moved && e.x !== undefined && e.y !== undefined) reason += `; ${Math.hypot(c.x - e.x, c.y - e.y).toFixed(1)} m from the logged place`;
        if (c.restartKind !== (e.kind === 'period_start' ? 'kick_off' : e.kind)) reason += ` (tracking sees a ${c.restartKind!.replace('_', ' ')})`;
      } else reason = p?.tagged ? `ball left ${p.label} ${when}` : `ball struck ${when}${p ? `, ${p.dist.toFixed(1)} m from the nearest ${e.team} player (${e.player ? `no ${e.team} ${e.player} in tracking` : 'no player in the log'})` : ''}`;
      out[i] = { eventId: e.id, trackingPeriod: period, trackingTime: c.t, trackingFrame: frameOf(c.t), predictedTime: tp, x, y,
        change, confidence, reason, placed: true };
    });
  }
  return out;
}

/** Candidates with t in [lo, hi] (binary search on the time-sorted list). */
function inWindow(cands: Candidate[], lo: number, hi: number): Candidate[] {
  let a = 0, b = cands.length;
  while (a < b) {
    const m = (a + b) >> 1;
    if (cands[m].t < lo) a = m + 1; else b = m;
  }
  const out: Candidate[] = [];
  for (let i = a; i < cands.length && cands[i].t <= hi; i++) out.push(cands[i]);
  return out;
}
