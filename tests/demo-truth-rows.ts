/**
 * Clock fits and a pitch registration for the demo match, made from the simulator's truth
 * (fixtures/demo/truth.json, truth-homography.json) — for tests (export, Watch, Review) that must not depend
 * on the Sync and Watch screens having produced them.
 *
 * truth.json: per clock segment, true = offset + rate · source time. Footage -> tracking
 * composes footage -> true -> tracking for the live footage segments (replays left out).
 */
import { readFileSync } from 'node:fs';
import type { ClockFit, ClockSegment } from '../shared-types/index.ts';
import type { RegistrationData } from '../renderer/src/overlay/contract.ts';

const DEMO = new URL('../fixtures/demo/', import.meta.url);
interface Seg { period: number; fromT: number; toT: number; offset: number; rate: number; kind?: string }
export const truth = JSON.parse(readFileSync(new URL('truth.json', DEMO), 'utf8')) as {
  clocks: Record<'tracking' | 'events' | 'footage', { segments: Seg[] }>;
  restarts: { kind: string; period: number; team: string; playedT: number; eventId: string }[];
  footage: { width: number; height: number; fps: number; frameCount: number; durationS: number };
  tracking: { rate: number; periods: { period: number; firstFrame: number }[] };
};
export const homographies = (): number[][] => (JSON.parse(readFileSync(new URL('truth-homography.json', DEMO), 'utf8')) as { frames: number[][] }).frames;

const seg = (period: number, fromT: number, toT: number, offset: number, rate: number, kind?: string): ClockSegment & { kind?: string } => ({
  period, fromT, toT, offset, rate, driftPpm: (rate - 1) * 1e6, offsetSe: 0, rateSe: 0, rmsResidual: 0, leaveOneOutMax: 0, points: [], ...(kind ? { kind } : {}),
});

/** Tracking-clock segment of `period`. */
function trk(period: number): Seg {
  return truth.clocks.tracking.segments.find((s) => s.period === period)!;
}

/** Footage -> tracking fit from truth (live footage only). */
export function truthFootageFit(): ClockFit {
  const segments = truth.clocks.footage.segments
    .filter((s) => s.kind !== 'replay')
    .map((s) => {
      const t = trk(s.period);
      return seg(s.period, s.fromT, s.toT, (s.offset - t.offset) / t.rate, s.rate / t.rate);
    });
  return { source: 'footage', method: 'huber', segments };
}

/** Event log -> tracking fit from truth. */
export function truthEventFit(): ClockFit {
  const segments = truth.clocks.events.segments.map((s) => {
    const t = trk(s.period);
    return seg(s.period, s.fromT, s.toT, (s.offset - t.offset) / t.rate, s.rate / t.rate);
  });
  return { source: 'events', method: 'huber', segments };
}

/** Footage seconds at which true time `trueT` is shown live. */
export function trueToFootage(trueT: number): number {
  const s = truth.clocks.footage.segments.find((g) => g.kind !== 'replay' && trueT >= g.offset + g.rate * g.fromT && trueT <= g.offset + g.rate * g.toT)!;
  return (trueT - s.offset) / s.rate;
}

/** Tracking seconds (period clock) of true time. */
export function trueToTracking(period: number, trueT: number): number {
  const t = trk(period);
  return (trueT - t.offset) / t.rate;
}

/** Registration with one keyframe per footage frame in [from, to] (truth homographies). */
export function truthRegistration(from: number, to: number): RegistrationData {
  const H = homographies();
  const keyframes = [];
  for (let f = Math.max(0, from); f <= Math.min(H.length - 1, to); f++) keyframes.push({ frame: f, t: f / truth.footage.fps, pairs: [], homography: H[f], errors: [] });
  return { schema: 'whistlemark-registration/1', imageWidth: truth.footage.width, imageHeight: truth.footage.height, keyframes };
}

/** Image pixel of pitch point (x, y) through homography h (fixtures/README.md formula). */
export function project(h: number[], x: number, y: number): [number, number] {
  const w = h[6] * x + h[7] * y + h[8];
  return [(h[0] * x + h[1] * y + h[2]) / w, (h[3] * x + h[4] * y + h[5]) / w];
}
