/**
 * In/out marks on the footage (whole frames) -> the span a clip stores (period + tracking
 * seconds), through the footage clock fit. Plain data: no database, no DOM.
 *
 * The in point is the start of the in-frame; the out point is the end of the out-frame
 * (the frame marked out is the last one the clip shows), so the export plan
 * (export-clips/plan.ts) gives back exactly frames in..out.
 *
 *   // 25 fps, period 1 fitted as tracking = footage − 10 s, event clock = tracking − 2 s
 *   markedSpan({ inFrame: 1750, outFrame: 2059 }, { pts, nominalFps: 25, fit, eventFit })
 *     -> { ok: true, span: { period: 1, from: 60, to: 72.4, title: 'Marked 00:58–01:10', ... } }
 */
import type { ClockFit, PeriodId } from '../../../shared-types/index.ts';
import { footageToTracking } from '../../../engine/fit/footage-map.ts';
import { matchClockText, trackingToEventClock } from '../export-clips/plan.ts';
import { fitGaps } from '../reels/clip-rules.ts';
import { frameLength } from '../player/frame-table.ts';

export interface FrameMarks {
  inFrame?: number;
  outFrame?: number;
}

export interface MarkInputs {
  /** The footage's PTS table (footage seconds per frame, presentation order). */
  pts: ArrayLike<number>;
  nominalFps: number;
  /** Footage -> tracking fit; undefined before the Sync screen made one. */
  fit: ClockFit | undefined;
  /** Event log -> tracking fit, for the match clock; undefined: clocks taken as equal. */
  eventFit?: ClockFit;
}

export interface MarkedSpan {
  period: PeriodId;
  /** Tracking seconds of the period, as clips store them. */
  from: number;
  to: number;
  inFrame: number;
  outFrame: number;
  /** Match clock text of the in and out points, e.g. "12:04.2". */
  matchIn: string;
  matchOut: string;
  /** Tracking seconds between in and out. */
  durationS: number;
  /** Default clip title, "Marked mm:ss–mm:ss" (match clock). */
  title: string;
  /** Footage seconds inside the span that the fit leaves out (a replay or a cut): kept, but no overlay there. */
  unfittedS: number;
}

export type MarkResult = { ok: true; span: MarkedSpan } | { ok: false; problem: string };

/** The match clock text of one end, or a problem naming the end and what to do. */
function endProblem(which: 'in' | 'out', frame: number, pts: ArrayLike<number>): string | undefined {
  if (!Number.isInteger(frame) || frame < 0 || frame >= pts.length) {
    return `The ${which} point (frame ${frame}) is not a frame of this footage (0–${pts.length - 1}): mark it again on the frame you want.`;
  }
  return undefined;
}

function seconds(t: number): string {
  return `footage ${t.toFixed(2)} s`;
}

export function markedSpan(marks: FrameMarks, inp: MarkInputs): MarkResult {
  const { pts, fit } = inp;
  if (marks.inFrame === undefined && marks.outFrame === undefined) return { ok: false, problem: 'No marks yet: press Y on the first frame of the clip and U on its last.' };
  if (marks.inFrame === undefined) return { ok: false, problem: 'No in point yet: press Y on the first frame of the clip.' };
  if (marks.outFrame === undefined) return { ok: false, problem: 'No out point yet: press U on the last frame of the clip.' };
  const bad = endProblem('in', marks.inFrame, pts) ?? endProblem('out', marks.outFrame, pts);
  if (bad) return { ok: false, problem: bad };
  const inFrame = marks.inFrame;
  const outFrame = marks.outFrame;
  if (outFrame < inFrame) {
    return { ok: false, problem: `The out point (frame ${outFrame}) is before the in point (frame ${inFrame}): mark the out point on a later frame, or the in point on an earlier one.` };
  }
  if (!fit?.segments.length) return { ok: false, problem: 'There is no footage clock fit yet, so the marks have no match time: make the fit on the Sync screen (Alt+2).' };

  const inT = pts[inFrame];
  const outStartT = pts[outFrame];
  const a = footageToTracking(fit, inT);
  const b = footageToTracking(fit, outStartT);
  const outside = (which: 'in' | 'out', frame: number, t: number) =>
    `The ${which} point (frame ${frame}, ${seconds(t)}) is footage the fit does not cover (before kick-off, half-time or a replay between fitted stretches): move it into live play.`;
  if (!a) return { ok: false, problem: outside('in', inFrame, inT) };
  if (!b) return { ok: false, problem: outside('out', outFrame, outStartT) };
  if (a.period !== b.period) {
    return { ok: false, problem: `The in point is in period ${a.period} and the out point in period ${b.period}: a clip stays within one period. Make one clip per period.` };
  }
  if (a.t < 0) return { ok: false, problem: `The in point (frame ${inFrame}) is ${(-a.t).toFixed(1)} s before tracking of period ${a.period} starts: move it to the kick-off or later.` };

  // The out point is the end of the out-frame, on the line of the segment showing that frame.
  const outEndT = outStartT + frameLength(pts, outFrame, inp.nominalFps);
  const seg = segmentShowing(fit, outStartT)!;
  const to = seg.offset + seg.rate * outEndT;
  const from = a.t;
  const clock = (t: number) => matchClockText(a.period, trackingToEventClock(inp.eventFit, a.period, t));
  const matchIn = clock(from);
  const matchOut = clock(to);
  const unfittedS = fitGaps(fit).reduce((s, g) => s + Math.max(0, Math.min(g.toT, outEndT) - Math.max(g.fromT, inT)), 0);
  return {
    ok: true,
    span: {
      period: a.period,
      from,
      to,
      inFrame,
      outFrame,
      matchIn,
      matchOut,
      durationS: to - from,
      title: `Marked ${matchIn.replace(/\.\d$/, '')}–${matchOut.replace(/\.\d$/, '')}`,
      unfittedS,
    },
  };
}

/** The segment footageToTracking uses for footage time t (the first that covers it). */
function segmentShowing(fit: ClockFit, t: number): ClockFit['segments'][number] | undefined {
  return fit.segments.find((s) => t >= s.fromT && t <= s.toT);
}

/** One line for the readout: "in 12:04.2 · out 12:16.6 · 12.4 s" or the problem. */
export function marksReadout(r: MarkResult): string {
  if (!r.ok) return r.problem;
  const s = r.span;
  return `P${s.period} in ${s.matchIn} · out ${s.matchOut} · ${durationText(s.durationS)}`;
}

/** "12.4 s"; under a second in hundredths, so a few frames do not read as 0.0 s. */
export function durationText(s: number): string {
  return `${s.toFixed(s < 1 ? 2 : 1)} s`;
}

/** Match clock of one marked frame ("P1 12:04.2"), or why it has none. */
export function frameClock(frame: number | undefined, inp: MarkInputs): string {
  if (frame === undefined) return '–';
  if (frame < 0 || frame >= inp.pts.length) return `frame ${frame}?`;
  if (!inp.fit?.segments.length) return 'no fit';
  const m = footageToTracking(inp.fit, inp.pts[frame]);
  if (!m) return 'not live';
  return `P${m.period} ${matchClockText(m.period, trackingToEventClock(inp.eventFit, m.period, m.t))}`;
}
