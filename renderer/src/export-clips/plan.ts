/**
 * An export plan: each clip's in and out in every clock, computed once before anything is
 * encoded, so the encoder, the sidecars and the captions all say the same frames.
 *
 * In/out are whole footage frames of the real PTS table: the in-frame is the frame on
 * screen at the clip's start, the out-frame (exclusive) the frame on screen at its end.
 * The exported file runs from pts[inFrame] to pts[outFrame].
 *
 *   const plan = planClip(clip, { fit, eventFit, probe, tracking, events, nonLive });
 *   plan.footage.inFrame, plan.timecode.in ("00:01:12:05"), plan.matchClock.in ("12:04.2")
 */
import type { ClockFit, FootageProbe, MatchEvent, PeriodId } from '../../../shared-types/index.ts';
import { trackingToFootage, footageToTracking } from '../../../engine/fit/footage-map.ts';
import { formatTimecode, frameToTimecode, timecodeRate, frameAtOrBefore } from '../../../engine/timecode/index.ts';
import type { ClipRow } from '../db/rows.ts';
import { nonLiveTouched, type NonLiveSpan } from '../reels/clip-rules.ts';

export interface TrackingClock {
  rate: number;
  /** First tracking frame number of each period (the file's own frame numbers). */
  firstFrame: Record<PeriodId, number>;
}

export interface PlanInputs {
  /** Footage -> tracking fit (Sync screen). Required: without it a clip has no footage span. */
  fit: ClockFit;
  /** Event log -> tracking fit; undefined: the clocks are taken as equal. */
  eventFit?: ClockFit;
  probe: Pick<FootageProbe, 'pts' | 'nominalFps' | 'frameCount' | 'duration'>;
  tracking: TrackingClock;
  /** Current (corrected) events of the project. */
  events: MatchEvent[];
  nonLive: NonLiveSpan[];
}

export interface PlannedEvent {
  id: string;
  kind: string;
  team?: string;
  player?: string;
  period: PeriodId;
  matchClock: string;
  /** Seconds from the start of the exported clip. */
  atClipS: number;
}

export interface ClipPlan {
  clipId: number;
  index: number;
  title: string;
  note: string;
  layers: string[];
  period: PeriodId;
  tracking: { from: number; to: number; inFrame: number; outFrame: number };
  footage: { inFrame: number; outFrame: number; inT: number; outT: number };
  durationS: number;
  timecode: { in: string; out: string };
  matchClock: { in: string; out: string };
  events: PlannedEvent[];
  nonLive: NonLiveSpan[];
}

export class PlanError extends Error {}

export { matchClockText } from '../reels/clip-rules.ts';
import { matchClockText } from '../reels/clip-rules.ts';

/** Tracking clock -> event clock (inverse of the event fit's segment for the period). */
export function trackingToEventClock(eventFit: ClockFit | undefined, period: PeriodId, tTrk: number): number {
  const seg = eventFit?.segments.find((s) => s.period === period && s.rate !== 0);
  return seg ? (tTrk - seg.offset) / seg.rate : tTrk;
}

function footageRate(nominalFps: number) {
  // 29.97 and 59.94 count in 1000/1001 labels (SMPTE ST 12-1); others whole.
  const whole = Math.round(nominalFps);
  if (Math.abs(nominalFps - (whole * 1000) / 1001) < 0.005 && whole !== nominalFps) return timecodeRate(whole * 1000, 1001, false);
  return timecodeRate(Math.max(1, whole));
}

export function planClip(clip: ClipRow & { id: number }, index: number, inp: PlanInputs): ClipPlan {
  const where = `clip ${index + 1}${clip.title ? ` "${clip.title}"` : ''}`;
  const span = footageSpan(inp.fit, clip.period, clip.from, clip.to);
  if (!span) {
    throw new PlanError(`${where}: period ${clip.period} ${clip.from.toFixed(1)}–${clip.to.toFixed(1)} s is not covered by the footage clock fit; shorten the clip or refit the footage on the Sync screen`);
  }
  const [fIn, fOut] = span;
  const pts = inp.probe.pts;
  const inFrame = Math.max(0, frameAtOrBefore(pts, fIn));
  const onAtOut = frameAtOrBefore(pts, fOut);
  const outFrame = Math.min(pts.length, Math.max(inFrame + 1, onAtOut));
  if (inFrame >= pts.length - 1) throw new PlanError(`${where}: starts at footage ${fIn.toFixed(2)} s, after the footage ends (${inp.probe.duration.toFixed(2)} s)`);
  const inT = pts[inFrame];
  const outT = outFrame < pts.length ? pts[outFrame] : inp.probe.duration;
  const rate = footageRate(inp.probe.nominalFps);
  const trkFirst = inp.tracking.firstFrame[clip.period] ?? 0;
  const trkIn = footageToTracking(inp.fit, inT, 0.5)?.t ?? clip.from;
  const trkOut = footageToTracking(inp.fit, outT, 0.5)?.t ?? clip.to;
  const events = inp.events
    .filter((e) => e.period === clip.period)
    .map((e) => ({ e, tTrk: eventTrackingTime(inp.eventFit, e) }))
    .filter(({ tTrk }) => tTrk >= trkIn && tTrk < trkOut)
    .map(({ e, tTrk }) => {
      const tf = trackingToFootage(inp.fit, e.period, tTrk, 0.5) ?? inT;
      return { id: e.id, kind: e.kind, team: e.team, player: e.player, period: e.period, matchClock: matchClockText(e.period, e.t), atClipS: round3(tf - inT) };
    });
  return {
    clipId: clip.id,
    index,
    title: clip.title ?? `Clip ${index + 1}`,
    note: clip.note ?? '',
    layers: clip.layers ?? [],
    period: clip.period,
    tracking: { from: round3(trkIn), to: round3(trkOut), inFrame: trkFirst + Math.round(trkIn * inp.tracking.rate), outFrame: trkFirst + Math.round(trkOut * inp.tracking.rate) },
    footage: { inFrame, outFrame, inT, outT },
    durationS: round3(outT - inT),
    timecode: { in: formatTimecode(frameToTimecode(inFrame, rate), rate), out: formatTimecode(frameToTimecode(outFrame, rate), rate) },
    matchClock: { in: matchClockText(clip.period, trackingToEventClock(inp.eventFit, clip.period, trkIn)), out: matchClockText(clip.period, trackingToEventClock(inp.eventFit, clip.period, trkOut)) },
    events,
    nonLive: nonLiveTouched(inT, outT, inp.nonLive, inp.fit),
  };
}

/**
 * Footage seconds [in, out] showing tracking span [from, to] of a period. Where the ends fall
 * in tracking time the footage does not show (a replay replaced live play there), they are
 * pulled in to the nearest shown moment inside the span; the footage between is kept as it
 * is (replays included) and flagged by the caller. Undefined when nothing of the span is shown.
 */
export function footageSpan(fit: ClockFit, period: PeriodId, from: number, to: number): [number, number] | undefined {
  let inF: number | undefined;
  let outF: number | undefined;
  for (const s of fit.segments) {
    if (s.period !== period || s.rate <= 0) continue;
    const a = s.offset + s.rate * s.fromT;
    const b = s.offset + s.rate * s.toT;
    const lo = Math.max(a, from);
    const hi = Math.min(b, to);
    if (hi <= lo) continue;
    const fLo = (lo - s.offset) / s.rate;
    const fHi = (hi - s.offset) / s.rate;
    if (inF === undefined || fLo < inF) inF = fLo;
    if (outF === undefined || fHi > outF) outF = fHi;
  }
  return inF !== undefined && outF !== undefined && outF > inF ? [inF, outF] : undefined;
}

function eventTrackingTime(fit: ClockFit | undefined, e: MatchEvent): number {
  const seg = fit?.segments.find((s) => s.period === e.period);
  return seg ? seg.offset + seg.rate * e.t : e.t;
}

const round3 = (v: number) => Math.round(v * 1000) / 1000;
