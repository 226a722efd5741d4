/**
 * Sidecars of an exported reel: CSV and JSON (each clip's in/out in every clock, the events
 * inside, the notes) and WebVTT captions (W3C WebVTT: a cue per clip title and per event,
 * on the timeline of the exported reel file).
 *
 *   const files = reelSidecars('Corners against', plans, { reelFile: 'corners.mp4', titleCardS: 0 });
 *   files.csv, files.json, files.vtt   // strings
 */
import type { ClipPlan } from './plan.ts';

export interface SidecarOptions {
  /** Name of the reel's video file the captions belong to. */
  reelFile?: string;
  /** Seconds of title card before each clip in the reel file (0 when none). */
  titleCardS: number;
  match?: string;
  footageFile?: string;
}

export const CSV_COLUMNS = [
  'clip',
  'title',
  'period',
  'footage_in_s',
  'footage_out_s',
  'footage_in_frame',
  'footage_out_frame',
  'timecode_in',
  'timecode_out',
  'match_clock_in',
  'match_clock_out',
  'tracking_in_frame',
  'tracking_out_frame',
  'duration_s',
  'events',
  'non_live',
  'note',
] as const;

/** RFC 4180 field: quoted when it holds a comma, quote or line break. */
function csvField(v: string | number): string {
  const s = String(v);
  return /[",\r\n]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s;
}

export function sidecarCsv(plans: ClipPlan[]): string {
  const rows = plans.map((p) =>
    [
      p.index + 1,
      p.title,
      p.period,
      p.footage.inT.toFixed(3),
      p.footage.outT.toFixed(3),
      p.footage.inFrame,
      p.footage.outFrame,
      p.timecode.in,
      p.timecode.out,
      p.matchClock.in,
      p.matchClock.out,
      p.tracking.inFrame,
      p.tracking.outFrame,
      p.durationS.toFixed(3),
      p.events.map((e) => `${e.id} ${e.kind}${e.team ? ` ${e.team}` : ''}${e.player ? ` ${e.player}` : ''} ${e.matchClock}`).join('; '),
      p.nonLive.map((n) => `${n.kind} ${n.fromT.toFixed(2)}-${n.toT.toFixed(2)}`).join('; '),
      p.note,
    ].map(csvField).join(','),
  );
  return [CSV_COLUMNS.join(','), ...rows].join('\r\n') + '\r\n';
}

export function sidecarJson(reelTitle: string, plans: ClipPlan[], opts: SidecarOptions): string {
  return (
    JSON.stringify(
      {
        schema: 'whistlemark-reel/1',
        reel: reelTitle,
        match: opts.match,
        footageFile: opts.footageFile,
        reelFile: opts.reelFile,
        clocks: {
          footage: 'seconds from the first frame (PTS table) and frame index',
          timecode: 'SMPTE ST 12-1 label of the footage frame index (non-drop)',
          matchClock: 'MM:SS.s as the event log counts it (second period from 45:00)',
          tracking: 'tracking frame number as in the tracking file',
        },
        clips: plans.map((p) => ({
          clip: p.index + 1,
          title: p.title,
          note: p.note,
          period: p.period,
          layers: p.layers,
          durationS: p.durationS,
          in: { footageS: p.footage.inT, footageFrame: p.footage.inFrame, timecode: p.timecode.in, matchClock: p.matchClock.in, trackingFrame: p.tracking.inFrame, trackingS: p.tracking.from },
          out: { footageS: p.footage.outT, footageFrame: p.footage.outFrame, timecode: p.timecode.out, matchClock: p.matchClock.out, trackingFrame: p.tracking.outFrame, trackingS: p.tracking.to },
          events: p.events,
          nonLive: p.nonLive,
        })),
      },
      null,
      2,
    ) + '\n'
  );
}

/** hh:mm:ss.ttt (WebVTT timestamp). */
export function vttTime(s: number): string {
  const ms = Math.max(0, Math.round(s * 1000));
  const h = Math.floor(ms / 3600000);
  const m = Math.floor(ms / 60000) % 60;
  const sec = Math.floor(ms / 1000) % 60;
  return `${String(h).padStart(2, '0')}:${String(m).padStart(2, '0')}:${String(sec).padStart(2, '0')}.${String(ms % 1000).padStart(3, '0')}`;
}

/** Cue text may not hold "-->" nor blank lines; & and < are escaped (WebVTT text rules). */
function cueText(s: string): string {
  return s.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/-->/g, '→').replace(/\n\s*\n/g, '\n').trim() || '…';
}

/** Captions of the reel file: each clip's title and match clock, and each event inside. */
export function sidecarVtt(plans: ClipPlan[], opts: SidecarOptions): string {
  const out = ['WEBVTT', ''];
  let at = 0;
  let n = 0;
  for (const p of plans) {
    const start = at + opts.titleCardS;
    const end = start + p.durationS;
    out.push(`clip-${p.index + 1}`, `${vttTime(at)} --> ${vttTime(end)}`, cueText(`${p.title} · ${p.matchClock.in}–${p.matchClock.out}${p.note ? `\n${p.note}` : ''}`), '');
    for (const e of p.events) {
      const t0 = start + e.atClipS;
      out.push(`event-${++n}`, `${vttTime(t0)} --> ${vttTime(Math.min(end, t0 + 3))} line:85%`, cueText(`${e.matchClock} ${e.kind.replace(/_/g, ' ')}${e.team ? ` · ${e.team}` : ''}${e.player ? ` ${e.player}` : ''}`), '');
    }
    at = end;
  }
  return out.join('\n');
}

export function reelSidecars(reelTitle: string, plans: ClipPlan[], opts: SidecarOptions) {
  return { csv: sidecarCsv(plans), json: sidecarJson(reelTitle, plans, opts), vtt: sidecarVtt(plans, opts) };
}

/** A file name from a title: letters, digits, dashes. */
export function fileStem(title: string): string {
  return (
    title
      .normalize('NFKD')
      .replace(/[^\w\s-]/g, '')
      .trim()
      .replace(/\s+/g, '-')
      .toLowerCase()
      .slice(0, 60) || 'reel'
  );
}
