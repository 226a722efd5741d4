/**
 * Dashed pitch lines draw only what the picture shows: a segment whose far end projects
 * thousands of pixels away (a pitch corner near the horizon) costs as many dashes as its
 * visible part, and the dashes on screen are the same ones the unclipped line would draw.
 */
import type { Graphics } from 'pixi.js';
import { describe, expect, it } from 'vitest';
import { dashedPitchLine, visibleSpan } from '../../../renderer/src/overlay/layers/layer.ts';
import type { Projector } from '../../../renderer/src/overlay/project.ts';

/** Records the dashes (moveTo → lineTo pairs) a layer asks for. */
function recorder() {
  const dashes: number[][] = [];
  let from: number[] = [];
  const g = {
    moveTo(x: number, y: number) {
      from = [x, y];
      return g;
    },
    lineTo(x: number, y: number) {
      dashes.push([...from, x, y]);
      return g;
    },
  };
  return { g: g as unknown as Graphics, dashes };
}

const flat: Projector = { project: (x, y) => [x, y], scaleAt: () => 1, unit: 1, width: 1280, height: 720 };

describe('dashed pitch lines', () => {
  it('clip to the picture (Liang–Barsky) with a margin', () => {
    expect(visibleSpan([-100, 100], [1380, 100], 1280, 720, 0)).toEqual([100 / 1480, 1380 / 1480]);
    expect(visibleSpan([0, -50], [100, -10], 1280, 720, 0)).toBeNull();
    expect(visibleSpan([10, 10], [20, 20], 1280, 720, 0)).toEqual([0, 1]);
  });

  it('a line running 50 000 px off screen draws only the dashes inside, in the same places', () => {
    const far = recorder();
    dashedPitchLine(far.g, flat, 100, 360, 50_100, 360, 10, 6);
    expect(far.dashes.length).toBeLessThanOrEqual(Math.ceil((1280 - 100 + 32) / 16) + 1);
    expect(far.dashes.length).toBeGreaterThan(60);
    // The unclipped reference: every dash from the start, kept where it touches the picture.
    const reference: number[][] = [];
    for (let s = 0; s < 50_000; s += 16) reference.push([100 + s, 360, 100 + Math.min(50_000, s + 10), 360]);
    const onScreen = reference.filter(([x0]) => x0 < 1280);
    expect(far.dashes.slice(0, onScreen.length)).toEqual(onScreen);
  });

  it('nothing is drawn for a line wholly outside the picture', () => {
    const r = recorder();
    dashedPitchLine(r.g, flat, 2000, -400, 9000, -900, 10, 6);
    expect(r.dashes).toEqual([]);
  });
});
