/**
 * The optional title card: a still, opaque frame shown for a few seconds before a clip, with
 * the clip's title, its match clock span and note. Both export paths draw it with this one
 * function (the embedded path encodes it ahead of the clip, the native path streams it to
 * the host as the first frames), so the card looks the same whichever path wrote the file.
 * Audio under the card is silence; sidecar and caption times shift by the card's length.
 *
 *   const card = titleCardFor(plan, { reelTitle: 'Corners against', count: 6, seconds: 2 });
 *   drawTitleCard(ctx, 1280, 720, card);
 *   const n = titleCardFrames(card, 25);   // 50 frames
 */
import type { ClipPlan } from './plan.ts';

export interface TitleCard {
  seconds: number;
  /** Large line: the clip title. */
  title: string;
  /** Small line above the title, e.g. "Corners against · 3 of 6". */
  kicker: string;
  /** Below the title, e.g. "1st half 12:04–12:16". */
  clock: string;
  /** The clip's note (may be empty; long notes wrap to at most four lines). */
  note: string;
}

/** Seconds a title card stays on screen by default (common practice for meeting clips: 2–3 s). */
export const DEFAULT_TITLE_CARD_S = 2;

const PERIOD_NAMES: Record<number, string> = { 1: '1st half', 2: '2nd half', 3: 'Extra time 1', 4: 'Extra time 2', 5: 'Penalties' };

export function titleCardFor(plan: ClipPlan, opts: { reelTitle: string; count: number; seconds?: number }): TitleCard {
  return {
    seconds: opts.seconds ?? DEFAULT_TITLE_CARD_S,
    title: plan.title,
    kicker: `${opts.reelTitle} · ${plan.index + 1} of ${opts.count}`,
    clock: `${PERIOD_NAMES[plan.period] ?? `Period ${plan.period}`}  ${plan.matchClock.in}–${plan.matchClock.out}`,
    note: plan.note,
  };
}

/** Whole frames the card takes at `fps` (at least one when the card is on). */
export function titleCardFrames(card: TitleCard | undefined, fps: number): number {
  if (!card || !(card.seconds > 0)) return 0;
  return Math.max(1, Math.round(card.seconds * fps));
}

/** Wraps `text` to lines no wider than `maxWidth` (by the context's current font). */
function wrap(ctx: CanvasLike, text: string, maxWidth: number, maxLines: number): string[] {
  const lines: string[] = [];
  for (const para of text.split(/\n+/)) {
    let line = '';
    for (const word of para.split(/\s+/).filter(Boolean)) {
      const next = line ? `${line} ${word}` : word;
      if (ctx.measureText(next).width > maxWidth && line) {
        lines.push(line);
        line = word;
      } else line = next;
    }
    if (line) lines.push(line);
  }
  if (lines.length > maxLines) {
    lines.length = maxLines;
    lines[maxLines - 1] = lines[maxLines - 1].replace(/\s*\S*$/, '') + ' …';
  }
  return lines;
}

type CanvasLike = OffscreenCanvasRenderingContext2D | CanvasRenderingContext2D;

/** Draws the card over the whole frame (opaque), scaled to the output height. */
export function drawTitleCard(ctx: CanvasLike, w: number, h: number, card: TitleCard): void {
  const u = h / 720;
  ctx.save();
  ctx.fillStyle = '#10161b';
  ctx.fillRect(0, 0, w, h);
  ctx.textBaseline = 'alphabetic';
  const x = 132 * u;
  // A long title wraps to a second line (squeezing it into one would make it hard to read
  // from the back of a meeting room); what follows moves down with it.
  ctx.font = `700 ${Math.round(52 * u)}px system-ui, sans-serif`;
  const titleLines = wrap(ctx, card.title, w - x - 64 * u, 2);
  const extra = Math.max(0, titleLines.length - 1) * 60;
  ctx.fillStyle = '#ffd27a';
  ctx.fillRect(96 * u, 250 * u, 10 * u, (150 + extra) * u);
  ctx.fillStyle = '#9fb0bb';
  ctx.font = `600 ${Math.round(22 * u)}px system-ui, sans-serif`;
  ctx.fillText(card.kicker, x, 282 * u, w - x - 64 * u);
  ctx.fillStyle = '#ffffff';
  ctx.font = `700 ${Math.round(52 * u)}px system-ui, sans-serif`;
  titleLines.forEach((line, i) => ctx.fillText(line, x, (348 + i * 60) * u, w - x - 64 * u));
  ctx.fillStyle = '#d8e0e5';
  ctx.font = `500 ${Math.round(26 * u)}px system-ui, sans-serif`;
  ctx.fillText(card.clock, x, (392 + extra) * u, w - x - 64 * u);
  if (card.note) {
    ctx.fillStyle = '#b9c4cb';
    ctx.font = `400 ${Math.round(22 * u)}px system-ui, sans-serif`;
    wrap(ctx, card.note, w - x - 96 * u, 4).forEach((line, i) => ctx.fillText(line, x, (452 + extra + i * 32) * u));
  }
  ctx.restore();
}
