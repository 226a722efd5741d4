/**
 * Builds the overlay scene for one displayed footage frame: footage time -> tracking
 * moment through the footage clock fit, positions interpolated at that moment, the frame's
 * homography from the registration keyframes, and "not live" during non-live footage.
 *
 *   buildOverlayScene(data, { index: 812, t: 32.48 }, settings, { width: 1280, height: 720 })
 */
import { footageToTracking } from '../../../engine/fit/footage-map.ts';
import type { BuildOverlayScene, OverlayData, OverlayScene, ScenePlayer, SceneTrail, TeamKey } from './contract.ts';
import { sampleAt, trailOf } from './sample.ts';
import { registrationAt } from './registration-at.ts';

/** Why footage time t shows no live play, or undefined when it does. */
export function notLiveAt(data: OverlayData, t: number): string | undefined {
  const iv = data.nonLive.find((n) => t >= n.fromT && t < n.toT);
  if (iv) return iv.kind === 'replay' ? 'Replay' : iv.kind === 'half_time' ? 'Half-time' : iv.kind === 'lead_in' ? 'Before kick-off' : 'Not live';
  if (!data.fit) return 'No footage fit yet';
  for (const seg of data.fit.segments as (typeof data.fit.segments[number] & { kind?: string })[]) {
    if (seg.kind === 'replay' && t >= seg.fromT && t <= seg.toT) return 'Replay';
  }
  if (!footageToTracking(liveOnly(data.fit), t)) return 'No tracking here';
  return undefined;
}

function liveOnly(fit: NonNullable<OverlayData['fit']>) {
  return { ...fit, segments: fit.segments.filter((s) => (s as { kind?: string }).kind !== 'replay') };
}

/**
 * The last live tracking moment at or before footage time t (what the 2-D view keeps
 * showing during a replay): the moment just before the non-live interval or the end of
 * the last live fit segment before t.
 */
export function lastLiveMoment(data: OverlayData, t: number): { period: number; t: number } | undefined {
  if (!data.fit) return undefined;
  const fit = liveOnly(data.fit);
  const iv = data.nonLive.find((n) => t >= n.fromT && t < n.toT);
  const at = iv ? iv.fromT - 1e-3 : t;
  const direct = footageToTracking(fit, at);
  if (direct) return direct;
  let best: (typeof fit.segments)[number] | undefined;
  for (const s of fit.segments) if (s.toT <= at && (!best || s.toT > best.toT)) best = s;
  return best && { period: best.period, t: best.offset + best.rate * best.toT };
}

/** Goalkeeper per team: the player standing nearest his own goal line on average over the period. */
export function goalkeepers(data: OverlayData, periodIndex: number): Set<number> {
  const p = data.periods[periodIndex];
  const n = data.objects.length;
  const out = new Set<number>();
  const half = data.pitch.length / 2;
  for (const team of ['home', 'away'] as TeamKey[]) {
    const ownGoalX = (team === 'home') === (p.homeAttacks === 'positive_x') ? -half : half;
    let best = -1;
    let bestD = Infinity;
    data.objects.forEach((ob, o) => {
      if (ob.role !== 'player' || ob.team !== team) return;
      let sum = 0;
      let k = 0;
      for (let f = 0; f < p.frameCount; f += 25) {
        const x = p.x[f * n + o];
        if (!Number.isNaN(x)) {
          sum += Math.abs(x - ownGoalX);
          k++;
        }
      }
      if (k && sum / k < bestD) {
        bestD = sum / k;
        best = o;
      }
    });
    if (best >= 0) out.add(best);
  }
  return out;
}

const keeperCache = new WeakMap<OverlayData, Map<number, Set<number>>>();
function keepersOf(data: OverlayData, pi: number): Set<number> {
  let m = keeperCache.get(data);
  if (!m) keeperCache.set(data, (m = new Map()));
  let s = m.get(pi);
  if (!s) m.set(pi, (s = goalkeepers(data, pi)));
  return s;
}

export const buildOverlayScene: BuildOverlayScene = (data, frame, settings, output) => {
  const viewKind = output.view ?? 'footage';
  const reason = notLiveAt(data, frame.t);
  const H = data.registration ? registrationAt(data.registration, frame.index) : undefined;
  const moment = data.fit ? (reason && viewKind === 'pitch' ? lastLiveMoment(data, frame.t) : reason ? undefined : footageToTracking(liveOnly(data.fit), frame.t)) : undefined;
  const live = !reason && (viewKind === 'pitch' || !!H);
  const base: OverlayScene = {
    width: output.width,
    height: output.height,
    pitch: data.pitch,
    view:
      viewKind === 'pitch'
        ? { kind: 'pitch', margin: output.margin ?? 24 }
        : { kind: 'footage', homography: H ?? [1, 0, 0, 0, 1, 0, 0, 0, 1], imageWidth: data.footage.width, imageHeight: data.footage.height },
    live,
    ...(reason ? { notLiveReason: reason } : !H && viewKind === 'footage' ? { notLiveReason: 'No pitch registration' } : {}),
    players: [],
    trails: [],
    teams: settings.teams,
    layers: settings.layers,
    homeAttacks: 'positive_x',
    ...(settings.distancePair ? { distancePair: settings.distancePair } : {}),
    teamLineCount: settings.teamLineCount ?? 3,
  };
  if (!moment) return base;
  return fillMoment(data, base, moment, settings.trailSeconds);
};

/** Positions and trails of tracking moment (period, t) into a scene. */
export function fillMoment(data: OverlayData, scene: OverlayScene, moment: { period: number; t: number }, trailSeconds: number): OverlayScene {
  const pi = data.periods.findIndex((p) => p.period === moment.period);
  if (pi < 0) return scene;
  const p = data.periods[pi];
  const n = data.objects.length;
  const xy = new Float64Array(2 * n);
  if (!sampleAt(p, n, data.rate, moment.t, xy)) return scene;
  const keepers = keepersOf(data, pi);
  const players: ScenePlayer[] = [];
  const trails: SceneTrail[] = [];
  data.objects.forEach((ob, o) => {
    const x = xy[2 * o];
    const y = xy[2 * o + 1];
    if (Number.isNaN(x) || Number.isNaN(y)) return;
    if (ob.role === 'player' && (ob.team === 'home' || ob.team === 'away')) {
      players.push({ id: ob.id, team: ob.team, ...(ob.shirt !== undefined ? { shirt: ob.shirt } : {}), goalkeeper: keepers.has(o), x, y });
      if (trailSeconds > 0) trails.push({ id: ob.id, team: ob.team, points: trailOf(p, n, o, data.rate, moment.t, trailSeconds, [x, y]) });
    } else if (o === data.ballIndex && trailSeconds > 0) {
      trails.push({ id: ob.id, team: 'ball', points: trailOf(p, n, o, data.rate, moment.t, trailSeconds, [x, y]) });
    }
  });
  const bi = data.ballIndex;
  const ball = bi >= 0 && !Number.isNaN(xy[2 * bi]) ? { x: xy[2 * bi], y: xy[2 * bi + 1] } : undefined;
  return { ...scene, moment: { period: p.period, t: moment.t }, players, trails, ...(ball ? { ball } : {}), homeAttacks: p.homeAttacks };
}
