import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import type { TrackingPeriod, ClockFit } from '../../../shared-types/index.ts';
import type { OverlayData } from '../../../renderer/src/overlay/contract.ts';
import { buildOverlayScene, lastLiveMoment, notLiveAt } from '../../../renderer/src/overlay/scene.ts';
import { viewProjector } from '../../../renderer/src/overlay/project.ts';
import { defaultSettings } from '../../../renderer/src/overlay/style.ts';

/** Two players and a ball moving at constant speed, 25 Hz, 10 s. */
function data(): OverlayData {
  const n = 3;
  const frames = 250;
  const x = new Float32Array(frames * n);
  const y = new Float32Array(frames * n);
  for (let f = 0; f < frames; f++) {
    x[f * n] = -40 + f * 0.1; // home 1: 2.5 m/s
    y[f * n] = 0;
    x[f * n + 1] = 30;
    y[f * n + 1] = 10 - f * 0.04;
    x[f * n + 2] = f * 0.2;
    y[f * n + 2] = 1;
  }
  x[100 * n + 1] = NaN; // one missing frame of away_9
  y[100 * n + 1] = NaN;
  const period: TrackingPeriod = { period: 1, firstFrame: 0, frameCount: frames, present: new Uint8Array(frames).fill(1), x, y, homeAttacks: 'positive_x' };
  const fit: ClockFit = {
    source: 'footage',
    method: 'huber',
    segments: [{ period: 1, fromT: 2, toT: 12, offset: -2, rate: 1, driftPpm: 0, offsetSe: 0, rateSe: 0, rmsResidual: 0, leaveOneOutMax: 0, points: [] }],
  };
  return {
    pitch: { length: 105, width: 68 },
    rate: 25,
    objects: [
      { id: 'home_1', role: 'player', team: 'home', shirt: 1 },
      { id: 'away_9', role: 'player', team: 'away', shirt: 9 },
      { id: 'ball', role: 'ball' },
    ],
    ballIndex: 2,
    periods: [period],
    fit,
    registration: { schema: 'whistlemark-registration/1', imageWidth: 640, imageHeight: 360, keyframes: [{ frame: 0, t: 0, pairs: [], errors: [], homography: [5, 0, 320, 0, -5, 180, 0, 0, 1] }] },
    nonLive: [{ fromT: 8, toT: 9, kind: 'replay' }],
    footage: { width: 640, height: 360 },
  };
}

describe('overlay scene', () => {
  it('maps footage time through the fit and interpolates between tracking frames', () => {
    const d = data();
    // footage 6.02 s -> tracking 4.02 s = frame 100.5
    const s = buildOverlayScene(d, { index: 150, t: 6.02 }, defaultSettings(), { width: 1280, height: 720 });
    expect(s.live).toBe(true);
    expect(s.moment?.t).toBeCloseTo(4.02, 9);
    const home = s.players.find((p) => p.id === 'home_1')!;
    expect(home.x).toBeCloseTo(-40 + 100.5 * 0.1, 4);
    // away_9 is missing at frame 100: the value of frame 101 is used
    const away = s.players.find((p) => p.id === 'away_9')!;
    expect(away.y).toBeCloseTo(10 - 101 * 0.04, 4);
    expect(s.ball!.x).toBeCloseTo(100.5 * 0.2, 4);
    // keeper: home_1 is the home player nearest his own goal (x = -52.5)
    expect(home.goalkeeper).toBe(true);
    // trails: 3 s of 25 Hz frames plus the current point
    const trail = s.trails.find((t) => t.id === 'home_1')!;
    expect(trail.points.length / 2).toBe(75 + 1); // stored frames 26..100 lie in [1.02, 4.02] s, plus the interpolated point
  });

  it('draws nothing on the footage in a replay and keeps the last live moment for the pitch view', () => {
    const d = data();
    expect(notLiveAt(d, 8.5)).toBe('Replay');
    const f = buildOverlayScene(d, { index: 212, t: 8.5 }, defaultSettings(), { width: 1280, height: 720 });
    expect(f.live).toBe(false);
    expect(f.players).toHaveLength(0);
    const p = buildOverlayScene(d, { index: 212, t: 8.5 }, defaultSettings(), { width: 600, height: 400, view: 'pitch' });
    expect(p.moment?.t).toBeCloseTo(6 - 1e-3, 6);
    expect(p.players).toHaveLength(2);
    expect(lastLiveMoment(d, 20)?.t).toBeCloseTo(10, 9);
    expect(notLiveAt(d, 20)).toBe('No tracking here');
  });

  it('projects through the frame homography and scales to the output size', () => {
    const d = data();
    const s = buildOverlayScene(d, { index: 150, t: 6.02 }, defaultSettings(), { width: 1280, height: 720 });
    const v = viewProjector(s);
    expect(v.project(0, 0)).toEqual([640, 360]);
    expect(v.project(10, 4)).toEqual([(320 + 50) * 2, (180 - 20) * 2]);
  });

  it('agrees with the projection formula of fixtures/README.md on the demo truth homography', () => {
    // Reference: truth-homography.json, (u, v) = (h0 x + h1 y + h2, h3 x + h4 y + h5) / (h6 x + h7 y + h8)
    const truth = JSON.parse(readFileSync(new URL('../../../fixtures/demo/truth-homography.json', import.meta.url), 'utf8')) as { frames: number[][] };
    const h = truth.frames[3000];
    const s = buildOverlayScene({ ...data(), registration: { schema: 'whistlemark-registration/1', imageWidth: 640, imageHeight: 360, keyframes: [{ frame: 3000, t: 120, pairs: [], errors: [], homography: h }] } }, { index: 3000, t: 6 }, defaultSettings(), { width: 640, height: 360 });
    const v = viewProjector(s);
    for (const [x, y] of [[0, 0], [52.5, 34], [-36, -20.16]]) {
      const w = h[6] * x + h[7] * y + h[8];
      const p = v.project(x, y)!;
      expect(p[0]).toBeCloseTo((h[0] * x + h[1] * y + h[2]) / w, 9);
      expect(p[1]).toBeCloseTo((h[3] * x + h[4] * y + h[5]) / w, 9);
    }
  });
});
