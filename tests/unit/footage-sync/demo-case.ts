/**
 * The demo match (fixtures/demo/truth.json) as footage-sync inputs: tracking restart
 * anchors and footage whistles where the simulator put them, kick-off frames from the
 * truth, and the truth's footage → tracking map to check a fit against.
 */
import { readFileSync } from 'node:fs';
import { sourceToTrue, trueToSource, type Truth } from '../../../fixtures/sim/index.ts';
import type { FootageAnchorInput, FootagePair, TrackingAnchorInput } from '../../../engine/footage-sync/index.ts';

export const demoTruth: Truth = JSON.parse(readFileSync(new URL('../../../fixtures/demo/truth.json', import.meta.url), 'utf8'));
export const FPS = demoTruth.footage!.fps;

/** Tracking restarts as the detector reports them: the kick, and the moment of rest. */
export function trackingAnchors(truth: Truth = demoTruth): TrackingAnchorInput[] {
  return truth.restarts.map((r, i) => {
    const played = trueToSource(truth, 'tracking', r.playedT)!;
    const still = trueToSource(truth, 'tracking', r.placedT);
    return { id: `trk${i}`, kind: r.kind as TrackingAnchorInput['kind'], period: played.period, t: played.t, stillFromT: still?.period === played.period ? still.t : undefined, confidence: 1 };
  });
}

/** Whistles at their true footage onsets (a detector's output, without its errors). */
export function footageWhistles(truth: Truth = demoTruth): (FootageAnchorInput & { reason: string; trueT: number })[] {
  return (truth.whistles ?? []).map((w, i) => ({ id: `w${i}`, kind: 'whistle', t: w.footageT, confidence: 0.8, reason: w.reason, trueT: w.trueT }));
}

/** Frame index of the first footage frame showing true time t or later (the frame an analyst marks for a kick). */
export function firstFrameAfter(trueT: number, truth: Truth = demoTruth): number {
  const f = trueToSource(truth, 'footage', trueT)!;
  return Math.ceil(f.t * FPS - 1e-9);
}

/** The two marked kick-offs (first kick-off of each period), paired with their tracking anchors. */
export function markedKickOffs(truth: Truth = demoTruth): FootagePair[] {
  const trk = trackingAnchors(truth);
  return truth.periods.map((p) => {
    const r = truth.restarts.findIndex((x) => x.kind === 'kick_off' && x.period === p.period);
    const frame = firstFrameAfter(truth.restarts[r].playedT, truth);
    return { footageAnchorId: `mark-p${p.period}`, trackingAnchorId: trk[r].id, period: p.period, footageKind: 'kick_off', tFootage: frame / FPS, tracking: trk[r] };
  });
}

/** Truth check points: every whistle and every restart shown in live footage, with the true tracking time. */
export function truthAnchors(truth: Truth = demoTruth): { what: string; tFootage: number; period: number; tTracking: number }[] {
  const out: { what: string; tFootage: number; period: number; tTracking: number }[] = [];
  for (const w of truth.whistles ?? []) {
    const trk = trueToSource(truth, 'tracking', w.trueT);
    if (trk) out.push({ what: `whistle ${w.reason} @${w.footageT.toFixed(2)}`, tFootage: w.footageT, ...periodT(trk) });
  }
  for (const r of truth.restarts) {
    const f = trueToSource(truth, 'footage', r.playedT);
    const inReplay = f && (truth.nonLive ?? []).some((n) => f.t >= n.fromT && f.t < n.toT);
    const trk = trueToSource(truth, 'tracking', r.playedT);
    if (f && trk && !inReplay) out.push({ what: `${r.kind} @${f.t.toFixed(2)}`, tFootage: f.t, ...periodT(trk) });
  }
  return out;
}
const periodT = (x: { period: number; t: number }) => ({ period: x.period, tTracking: x.t });

export { sourceToTrue };
