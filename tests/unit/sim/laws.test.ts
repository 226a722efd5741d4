import { describe, expect, it } from 'vitest';
import { HALF_L, HALF_W, LAW1, inPenaltyArea, pitchMarkings } from '../../../fixtures/sim/pitch.ts';
import type { SimRestart } from '../../../fixtures/sim/types.ts';
import { at, demoWorld, frameOf } from './demo-world.ts';

// Reference values: IFAB Laws of the Game, as listed in ../shared/REFERENCES.md.
const w = demoWorld();
const periodOf = (r: SimRestart) => w.periods.find((p) => p.period === r.period)!;
const dirOf = (side: 'home' | 'away', period: number) => {
  const p = w.periods.find((q) => q.period === period)!;
  const home = p.homeAttacks === 'positive_x' ? 1 : -1;
  return side === 'home' ? home : -home;
};
/** Positions at the moment of the kick: the last frame before the ball moved. */
function kickFrame(r: SimRestart) {
  const p = periodOf(r);
  const f = frameOf(w, p, r.playedT) - 1;
  return { p, f, ball: at(p, f, 22) };
}
const byKind = (k: string) => w.restarts.filter((r) => r.kind === k);

describe('restarts sit where the Laws put them (demo match)', () => {
  it('the demo has every restart kind of Laws 8 and 13–17', () => {
    expect(new Set(w.restarts.map((r) => r.kind))).toEqual(new Set(['kick_off', 'goal_kick', 'corner', 'throw_in', 'free_kick', 'penalty']));
  });

  it('Law 8: the home team takes the first kick-off, the away team the second (teams alternate, common practice)', () => {
    const kos = byKind('kick_off').filter((r) => r.cause === 'period_start');
    expect(kos.map((r) => r.team)).toEqual(['home', 'away']);
  });

  it('Law 8: kick-off from the centre mark, every player in their own half, opponents >= 9.15 m', () => {
    const kos = byKind('kick_off');
    expect(kos.length).toBeGreaterThanOrEqual(3); // two periods and at least one goal
    for (const r of kos) {
      const { p, f, ball } = kickFrame(r);
      expect(Math.hypot(ball.x, ball.y)).toBeLessThan(0.01);
      for (let o = 0; o < 22; o++) {
        const side = o < 11 ? 'home' : 'away';
        const q = at(p, f, o);
        expect(dirOf(side, r.period) * q.x, `${side}_${(o % 11) + 1} in own half`).toBeLessThanOrEqual(0);
        if (side !== r.team) expect(Math.hypot(q.x, q.y)).toBeGreaterThanOrEqual(LAW1.centreCircleR);
      }
    }
  });

  it('Law 16: goal kick from inside the goal area (5.5 m deep, 5.5 m beyond each post)', () => {
    for (const r of byKind('goal_kick')) {
      const { ball } = kickFrame(r);
      const ownGoal = -dirOf(r.team, r.period);
      const depth = HALF_L - ownGoal * ball.x;
      expect(depth).toBeGreaterThanOrEqual(0);
      expect(depth).toBeLessThanOrEqual(5.5);
      expect(Math.abs(ball.y)).toBeLessThanOrEqual(7.32 / 2 + 5.5);
    }
  });

  it('Law 17: corner kick from the corner arc (1 m) nearest to where the ball crossed the goal line', () => {
    for (const r of byKind('corner')) {
      const { ball, p } = kickFrame(r);
      const cx = Math.sign(ball.x) * HALF_L, cy = Math.sign(ball.y) * HALF_W;
      expect(Math.hypot(ball.x - cx, ball.y - cy)).toBeLessThanOrEqual(1);
      expect(Math.abs(ball.x)).toBeLessThanOrEqual(HALF_L);
      expect(Math.abs(ball.y)).toBeLessThanOrEqual(HALF_W);
      // Nearest corner to the exit point: same side of the goal's centre line.
      const out = at(p, frameOf(w, p, r.deadT), 22);
      expect(Math.sign(out.y)).toBe(Math.sign(ball.y));
      expect(Math.sign(out.x)).toBe(Math.sign(ball.x));
    }
  });

  it('Law 15: throw-in on the touchline where the ball left the field; opponents >= 2 m', () => {
    const throws = byKind('throw_in');
    expect(throws.length).toBeGreaterThan(0);
    for (const r of throws) {
      const { ball, p, f } = kickFrame(r);
      expect(Math.abs(Math.abs(ball.y) - HALF_W)).toBeLessThan(0.01);
      const out = at(p, frameOf(w, p, r.deadT), 22);
      expect(Math.abs(out.x - ball.x)).toBeLessThan(0.8); // one frame of ball travel either side
      for (let o = 0; o < 22; o++) if ((o < 11 ? 'home' : 'away') !== r.team) {
        const q = at(p, f, o);
        expect(Math.hypot(q.x - ball.x, q.y - ball.y)).toBeGreaterThanOrEqual(2);
      }
    }
  });

  it('Law 13: free kick with every opponent at least 9.15 m from the ball', () => {
    for (const r of byKind('free_kick')) {
      const { ball, p, f } = kickFrame(r);
      for (let o = 0; o < 22; o++) if ((o < 11 ? 'home' : 'away') !== r.team) {
        const q = at(p, f, o);
        expect(Math.hypot(q.x - ball.x, q.y - ball.y)).toBeGreaterThanOrEqual(9.15);
      }
    }
  });

  it('Law 14: penalty kick from the penalty mark, 11 m from the goal line; others outside the area', () => {
    for (const r of byKind('penalty')) {
      const { ball, p, f } = kickFrame(r);
      const goal = dirOf(r.team, r.period) * HALF_L;
      expect(Math.abs(Math.abs(goal - ball.x) - 11)).toBeLessThan(0.01);
      expect(Math.abs(ball.y)).toBeLessThan(0.01);
      const taker = (r.team === 'home' ? 0 : 11) + r.shirt - 1;
      for (let o = 0; o < 22; o++) {
        if (o === taker) continue;
        const q = at(p, f, o);
        const defendingKeeper = o % 11 === 0 && (o < 11 ? 'home' : 'away') !== r.team;
        if (defendingKeeper) expect(Math.abs(q.x - goal)).toBeLessThan(0.5); // on the goal line
        else expect(inPenaltyArea(q.x, q.y, Math.sign(goal) as 1 | -1)).toBe(false);
      }
    }
  });

  it('Laws 8, 13–17: before every restart the ball is dead, then placed and stationary at least 1 s, then played', () => {
    for (const r of w.restarts) {
      expect(r.deadT).toBeLessThanOrEqual(r.placedT);
      expect(r.playedT - r.placedT).toBeGreaterThanOrEqual(1);
      const p = periodOf(r);
      const f0 = frameOf(w, p, r.placedT) + 1, f1 = frameOf(w, p, r.playedT) - 1;
      for (let f = f0; f <= f1; f++) {
        expect(Math.hypot(p.x[f * 23 + 22] - r.x, p.y[f * 23 + 22] - r.y)).toBeLessThan(1e-3);
        expect(p.live[f]).toBe(0);
      }
    }
  });
});

describe('Law 1 field markings drawn by the footage', () => {
  const m = new Map(pitchMarkings(0.5).map((k) => [k.name, k]));
  const maxDist = (name: string, cx: number, cy: number) => Math.max(...m.get(name)!.points.map((p) => Math.hypot(p.x - cx, p.y - cy)));
  const minDist = (name: string, cx: number, cy: number) => Math.min(...m.get(name)!.points.map((p) => Math.hypot(p.x - cx, p.y - cy)));
  it('Law 1: centre circle radius 9.15 m', () => {
    expect(maxDist('centre_circle', 0, 0)).toBeCloseTo(9.15, 6);
    expect(minDist('centre_circle', 0, 0)).toBeCloseTo(9.15, 6);
  });
  it('Law 1: penalty area 16.5 m deep and 40.32 m wide; goal area 5.5 m and 18.32 m', () => {
    const front = m.get('penalty_area_right_front')!.points;
    expect(front[0].x).toBeCloseTo(52.5 - 16.5, 9);
    expect(Math.abs(front[front.length - 1].y - front[0].y)).toBeCloseTo(40.32, 9);
    const ga = m.get('goal_area_left_front')!.points;
    expect(ga[0].x).toBeCloseTo(-52.5 + 5.5, 9);
    expect(Math.abs(ga[ga.length - 1].y - ga[0].y)).toBeCloseTo(18.32, 9);
  });
  it('Law 1: penalty marks 11 m from the goal lines; penalty arc 9.15 m round the mark, outside the area', () => {
    expect(m.get('penalty_mark_left')!.points[0]).toEqual({ x: -52.5 + 11, y: 0 });
    expect(maxDist('penalty_arc_right', 52.5 - 11, 0)).toBeCloseTo(9.15, 6);
    for (const p of m.get('penalty_arc_right')!.points) expect(p.x).toBeLessThanOrEqual(52.5 - 16.5 + 1e-9);
  });
  it('Law 1: corner arcs of radius 1 m inside the field', () => {
    for (const name of ['corner_arc_left_top', 'corner_arc_left_bottom', 'corner_arc_right_top', 'corner_arc_right_bottom']) {
      const pts = m.get(name)!.points;
      const c = { x: Math.sign(pts[1].x) * HALF_L, y: Math.sign(pts[1].y) * HALF_W };
      for (const p of pts) {
        expect(Math.hypot(p.x - c.x, p.y - c.y)).toBeCloseTo(1, 9);
        expect(Math.abs(p.x)).toBeLessThanOrEqual(HALF_L + 1e-9);
        expect(Math.abs(p.y)).toBeLessThanOrEqual(HALF_W + 1e-9);
      }
    }
  });
});
