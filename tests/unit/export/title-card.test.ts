import { describe, expect, it } from 'vitest';
import { DEFAULT_TITLE_CARD_S, drawTitleCard, titleCardFor, titleCardFrames, type TitleCard } from '../../../renderer/src/export-clips/title-card.ts';
import { frameStepAt } from '../../../renderer/src/export-clips/lead-in.ts';
import type { ClipPlan } from '../../../renderer/src/export-clips/plan.ts';

const plan = (over: Partial<ClipPlan> = {}): ClipPlan =>
  ({ index: 2, title: 'Press after the goal kick', note: 'Both 8s jump the pivot.', period: 1, matchClock: { in: '12:04', out: '12:16' }, ...over }) as ClipPlan;

describe('titleCardFor', () => {
  it('puts the reel, the clip number of the count, the period and the match clock span on the card', () => {
    const card = titleCardFor(plan(), { reelTitle: 'Pressing triggers', count: 7, seconds: 3 });
    expect(card).toEqual({ seconds: 3, title: 'Press after the goal kick', kicker: 'Pressing triggers · 3 of 7', clock: '1st half  12:04–12:16', note: 'Both 8s jump the pivot.' });
  });

  it('uses the default length and names every period, with a fallback for unknown ones', () => {
    expect(titleCardFor(plan(), { reelTitle: 'R', count: 1 }).seconds).toBe(DEFAULT_TITLE_CARD_S);
    expect(titleCardFor(plan({ period: 2 }), { reelTitle: 'R', count: 1 }).clock).toMatch(/^2nd half /);
    expect(titleCardFor(plan({ period: 3 }), { reelTitle: 'R', count: 1 }).clock).toMatch(/^Extra time 1 /);
    expect(titleCardFor(plan({ period: 5 }), { reelTitle: 'R', count: 1 }).clock).toMatch(/^Penalties /);
    expect(titleCardFor(plan({ period: 9 as ClipPlan['period'] }), { reelTitle: 'R', count: 1 }).clock).toMatch(/^Period 9 /);
  });

  it('keeps an empty note empty (the card then has no note lines)', () => {
    expect(titleCardFor(plan({ note: '' }), { reelTitle: 'R', count: 1 }).note).toBe('');
  });
});

describe('titleCardFrames', () => {
  const card = (seconds: number): TitleCard => ({ seconds, title: 't', kicker: 'k', clock: 'c', note: '' });

  it('is whole frames of the footage rate', () => {
    expect(titleCardFrames(card(2), 25)).toBe(50);
    expect(titleCardFrames(card(2.5), 50)).toBe(125);
    // 29.97 fps footage (30000/1001, SMPTE ST 12-1): 2 s is 59.94 frames, rounded to 60.
    expect(titleCardFrames(card(2), 30000 / 1001)).toBe(60);
    expect(titleCardFrames(card(1.01), 25)).toBe(25);
  });

  it('is at least one frame when on, none when off or nonsensical', () => {
    expect(titleCardFrames(card(0.001), 25)).toBe(1);
    expect(titleCardFrames(undefined, 25)).toBe(0);
    expect(titleCardFrames(card(0), 25)).toBe(0);
    expect(titleCardFrames(card(-1), 25)).toBe(0);
    expect(titleCardFrames(card(Number.NaN), 25)).toBe(0);
  });
});

describe('frameStepAt', () => {
  it('reads the footage frame interval from the PTS table', () => {
    const pts25 = Array.from({ length: 100 }, (_, i) => i / 25);
    expect(frameStepAt(pts25, 13)).toBeCloseTo(0.04, 9);
    expect(frameStepAt(pts25, 99)).toBeCloseTo(0.04, 9); // at the end it looks back
    const ntsc = Array.from({ length: 100 }, (_, i) => (i * 1001) / 30000);
    expect(frameStepAt(ntsc, 40)).toBeCloseTo(1001 / 30000, 9);
  });

  it('is not thrown by one odd interval, and falls back to 25 fps without a table', () => {
    const pts = Array.from({ length: 30 }, (_, i) => i / 25);
    pts.splice(12, 1); // one frame missing: one double interval among eight
    expect(frameStepAt(pts, 10)).toBeCloseTo(0.04, 9);
    expect(frameStepAt([], 0)).toBe(1 / 25);
    expect(frameStepAt([3], 0)).toBe(1 / 25);
  });
});

/** A 2-D context stand-in: text is 0.55 em per character (from memory: close to a sans-serif average). */
function fakeContext() {
  const texts: { text: string; x: number; y: number; px: number }[] = [];
  const rects: number[][] = [];
  let font = '';
  const px = () => Number(/(\d+)px/.exec(font)?.[1] ?? 10);
  const ctx = {
    set font(f: string) {
      font = f;
    },
    get font() {
      return font;
    },
    fillStyle: '',
    textBaseline: '',
    save() {},
    restore() {},
    fillRect: (...r: number[]) => rects.push(r),
    measureText: (t: string) => ({ width: t.length * px() * 0.55 }),
    fillText: (text: string, x: number, y: number) => texts.push({ text, x, y, px: px() }),
  };
  return { ctx: ctx as unknown as CanvasRenderingContext2D, texts, rects };
}

describe('drawTitleCard', () => {
  const base: TitleCard = { seconds: 2, title: 'Press after the goal kick', kicker: 'Pressing triggers · 3 of 7', clock: '1st half  12:04–12:16', note: '' };

  it('covers the whole frame and draws kicker, title and clock top to bottom, scaled to the height', () => {
    const { ctx, texts, rects } = fakeContext();
    drawTitleCard(ctx, 1920, 1080, base);
    expect(rects[0]).toEqual([0, 0, 1920, 1080]);
    expect(texts.map((t) => t.text)).toEqual([base.kicker, base.title, base.clock]);
    expect(texts[0].y).toBeLessThan(texts[1].y);
    expect(texts[1].y).toBeLessThan(texts[2].y);
    expect(texts[1].px).toBe(78); // 52 px at 720p
  });

  it('wraps a long title to two lines and moves the clock below it', () => {
    const { ctx, texts } = fakeContext();
    const title = 'Second balls after our long goal kicks into the left channel and who picks them up';
    drawTitleCard(ctx, 1280, 720, { ...base, title });
    const titleLines = texts.filter((t) => t.px === 52);
    expect(titleLines).toHaveLength(2);
    expect(titleLines[0].text.startsWith('Second balls')).toBe(true);
    expect(titleLines[1].text.endsWith('…')).toBe(true); // longer than two lines: cut with an ellipsis
    for (const t of titleLines) expect(t.text.length * 52 * 0.55).toBeLessThanOrEqual(1280 - 132 - 64);
    const clock = texts.find((t) => t.text === base.clock)!;
    expect(clock.y).toBeGreaterThan(titleLines[1].y);
  });

  it('wraps the note to at most four lines inside the frame', () => {
    const { ctx, texts } = fakeContext();
    const note = Array.from({ length: 80 }, (_, i) => `word${i}`).join(' ');
    drawTitleCard(ctx, 1280, 720, { ...base, note });
    const lines = texts.filter((t) => t.text.startsWith('word'));
    expect(lines).toHaveLength(4);
    expect(lines[3].text.endsWith(' …')).toBe(true);
    for (const l of lines) expect(l.y).toBeLessThan(720);
  });
});
