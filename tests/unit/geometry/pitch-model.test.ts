import { describe, expect, it } from 'vitest';
import { LAW1_MARKINGS, pitchModel } from '../../../engine/geometry/pitch-model.ts';
import { projectPolyline } from '../../../engine/geometry/projection.ts';
import type { Vec2 } from '../../../engine/geometry/homography.ts';

// Reference values: IFAB Laws of the Game, Law 1 — The Field of Play (see ../shared/REFERENCES.md).
const model = pitchModel({ length: 105, width: 68 });
const at = (id: string) => model.landmarks.find((l) => l.id === id)!.at;
const marking = (id: string) => model.markings.find((m) => m.id === id)!;
const span = (pts: Vec2[], k: 0 | 1) => Math.max(...pts.map((p) => p[k])) - Math.min(...pts.map((p) => p[k]));

describe('pitch model against Law 1', () => {
  it('has the Law 1 distances', () => {
    expect(LAW1_MARKINGS).toMatchObject({ centreCircleRadius: 9.15, penaltyAreaDepth: 16.5, penaltyAreaWidth: 40.32, goalAreaDepth: 5.5, goalAreaWidth: 18.32, penaltyMarkDistance: 11, cornerArcRadius: 1, goalWidth: 7.32 });
    // Law 1: penalty area 16.5 m beyond each post, goal area 5.5 m beyond each post.
    expect(LAW1_MARKINGS.goalWidth + 2 * 16.5).toBeCloseTo(LAW1_MARKINGS.penaltyAreaWidth, 9);
    expect(LAW1_MARKINGS.goalWidth + 2 * 5.5).toBeCloseTo(LAW1_MARKINGS.goalAreaWidth, 9);
  });
  it('draws the boundary, boxes and circles at those sizes', () => {
    const b = marking('boundary').points;
    expect(span(b, 0)).toBeCloseTo(105, 9);
    expect(span(b, 1)).toBeCloseTo(68, 9);
    for (const end of ['left', 'right']) {
      const pa = marking(`penalty-area-${end}`).points;
      expect(span(pa, 0)).toBeCloseTo(16.5, 9);
      expect(span(pa, 1)).toBeCloseTo(40.32, 9);
      const ga = marking(`goal-area-${end}`).points;
      expect(span(ga, 0)).toBeCloseTo(5.5, 9);
      expect(span(ga, 1)).toBeCloseTo(18.32, 9);
      const spot = at(`penalty-mark-${end}`);
      expect(52.5 - Math.abs(spot[0])).toBeCloseTo(11, 9);
      // The penalty arc: 9.15 m from the mark, all of it outside the penalty area.
      for (const p of marking(`penalty-arc-${end}`).points) {
        expect(Math.hypot(p[0] - spot[0], p[1])).toBeCloseTo(9.15, 9);
        expect(Math.abs(p[0])).toBeLessThanOrEqual(52.5 - 16.5 + 1e-9);
      }
      for (const side of ['top', 'bottom']) {
        const c = at(`corner-${end}-${side}`);
        for (const p of marking(`corner-arc-${end}-${side}`).points) {
          expect(Math.hypot(p[0] - c[0], p[1] - c[1])).toBeCloseTo(1, 9);
          expect(Math.abs(p[0])).toBeLessThanOrEqual(52.5 + 1e-9);
          expect(Math.abs(p[1])).toBeLessThanOrEqual(34 + 1e-9);
        }
      }
    }
    for (const p of marking('centre-circle').points) expect(Math.hypot(...p)).toBeCloseTo(9.15, 9);
    // Where the penalty arc meets the area line: sqrt(9.15² − 5.5²) = 7.3123 m off the axis.
    expect(at('penalty-arc-right-top')[1]).toBeCloseTo(Math.sqrt(9.15 ** 2 - 5.5 ** 2), 9);
    expect(at('penalty-arc-right-top')[0]).toBeCloseTo(36, 9);
  });
  it('has unique landmark ids and labels, and follows the pitch size', () => {
    expect(new Set(model.landmarks.map((l) => l.id)).size).toBe(model.landmarks.length);
    expect(new Set(model.landmarks.map((l) => l.label)).size).toBe(model.landmarks.length);
    const small = pitchModel({ length: 90, width: 45 });
    expect(small.landmarks.find((l) => l.id === 'corner-right-top')!.at).toEqual([45, 22.5]);
    expect(small.landmarks.find((l) => l.id === 'penalty-mark-left')!.at).toEqual([-34, 0]);
  });
});

describe('projecting markings', () => {
  it('cuts a line where it passes behind the camera', () => {
    // w = 1 + 0.1 y: behind the camera for y < −10.
    const h = [1, 0, 0, 0, 1, 0, 0, 0.1, 1];
    const pieces = projectPolyline(h, [[0, 0], [0, -20]]);
    expect(pieces.length).toBe(1);
    expect(pieces[0].length).toBe(2);
    expect(pieces[0][1][1]).toBeLessThan(-1e4);
    expect(projectPolyline(h, [[0, -30], [0, -20]])).toEqual([]);
  });
});
