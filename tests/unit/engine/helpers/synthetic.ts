/**
 * Hand-built tracking for unit tests: the ball follows straight legs between key points
 * (rests are two key points at one place), players stand at given spots or move along
 * their own key points. Positions are built from Law 1 dimensions by the tests.
 */
import type { TrackedObject, TrackingData } from '../../../../shared-types/domain.ts';
import { rng } from './rng.ts';

export interface Key { t: number; x: number; y: number }

export function pathAt(keys: Key[], t: number): { x: number; y: number } {
  if (t <= keys[0].t) return keys[0];
  for (let i = 1; i < keys.length; i++) {
    if (t <= keys[i].t) {
      const a = keys[i - 1], b = keys[i];
      const u = (t - a.t) / (b.t - a.t);
      return { x: a.x + u * (b.x - a.x), y: a.y + u * (b.y - a.y) };
    }
  }
  return keys[keys.length - 1];
}

export interface SyntheticOptions {
  rate: number;
  durationS: number;
  ball?: Key[];
  /** 22 players: index 0..10 home shirts 1..11, 11..21 away. Default: still in own halves. */
  players?: (t: number, i: number) => { x: number; y: number };
  noise?: number;
  seed?: number;
  homeAttacks?: 'positive_x' | 'negative_x';
}

/** Default formation: home in x < 0, away in x > 0 (home attacks positive x). */
export function ownHalfSpot(i: number): { x: number; y: number } {
  const home = i < 11;
  const k = i % 11;
  const x = -(4 + (k % 4) * 10);
  const y = -25 + k * 5;
  return { x: home ? x : -x, y };
}

export function syntheticTracking(o: SyntheticOptions): TrackingData {
  const r = rng(o.seed ?? 1);
  const objects: TrackedObject[] = [];
  for (let i = 0; i < 22; i++)
    objects.push({ id: `${i < 11 ? 'home' : 'away'}_${(i % 11) + 1}`, role: 'player', team: i < 11 ? 'home' : 'away', shirt: (i % 11) + 1 });
  if (o.ball) objects.push({ id: 'ball', role: 'ball' });
  const nObj = objects.length;
  const n = Math.round(o.durationS * o.rate);
  const x = new Float32Array(n * nObj);
  const y = new Float32Array(n * nObj);
  const noise = o.noise ?? 0.02;
  for (let f = 0; f < n; f++) {
    const t = f / o.rate;
    for (let i = 0; i < 22; i++) {
      const p = o.players ? o.players(t, i) : ownHalfSpot(i);
      x[f * nObj + i] = p.x + noise * r.normal();
      y[f * nObj + i] = p.y + noise * r.normal();
    }
    if (o.ball) {
      const b = pathAt(o.ball, t);
      x[f * nObj + 22] = b.x + noise * r.normal();
      y[f * nObj + 22] = b.y + noise * r.normal();
    }
  }
  return {
    rate: o.rate,
    pitch: { length: 105, width: 68 },
    objects,
    ballIndex: o.ball ? 22 : -1,
    periods: [{ period: 1, firstFrame: 1000, frameCount: n, present: new Uint8Array(n).fill(1), x, y, homeAttacks: o.homeAttacks ?? 'positive_x' }],
  };
}
