import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { ckmeans } from 'simple-statistics';
import { jenksGroups } from '../../../engine/geometry/jenks.ts';
import { attackSign, backLine, guessKeepers, offsideLine, playerDistance, teamLines, type PlayerSpot } from '../../../engine/geometry/lines.ts';

const ssd = (groups: number[][]) => groups.reduce((t, g) => {
  const m = g.reduce((s, v) => s + v, 0) / g.length;
  return t + g.reduce((s, v) => s + (v - m) ** 2, 0);
}, 0);

describe('Jenks natural breaks against simple-statistics ckmeans (npm)', () => {
  it('gives the same groups on random data (property test)', () => {
    // Depths to the centimetre, distinct (equal values can be grouped either way at equal cost).
    const depths = fc.uniqueArray(fc.integer({ min: -6000, max: 6000 }), { minLength: 1, maxLength: 30 }).map((a) => a.map((v) => v / 100));
    fc.assert(
      fc.property(depths, fc.integer({ min: 1, max: 6 }), (values, k0) => {
        const k = Math.min(k0, values.length);
        const ours = jenksGroups(values, k);
        const ref = ckmeans(values, k);
        expect(ssd(ours)).toBeCloseTo(ssd(ref), 6);
        expect(ours).toEqual(ref);
      }),
      { numRuns: 400, seed: 42 },
    );
  });
  it('splits the doc example and copes with ties and too few values', () => {
    expect(jenksGroups([1, 2, 10, 11, 30], 3)).toEqual([[1, 2], [10, 11], [30]]);
    expect(jenksGroups([5, 5, 5], 3)).toEqual([[5, 5, 5]]);
    expect(jenksGroups([], 3)).toEqual([]);
    expect(jenksGroups([3, 1], 3)).toEqual([[1], [3]]);
  });
});

/** Away defends the +x goal when home attacks +x. */
const spot = (id: string, team: 'home' | 'away', x: number, y = 0, goalkeeper = false): PlayerSpot => ({ id, team, x, y, goalkeeper });
const away = [spot('a1', 'away', 50, 0, true), spot('a2', 'away', 30, -10), spot('a3', 'away', 28, 10), spot('a4', 'away', 20, 0), spot('a5', 'away', 5, 3)];

describe('offside line (IFAB Laws of the Game, Law 11)', () => {
  it('runs through the second-last defender, the goalkeeper counted as one', () => {
    const line = offsideLine(away, { x: 10, y: 0 }, 'away', 'positive_x');
    expect(line).toEqual({ x: 30, by: 'second_last_defender', playerId: 'a2' });
  });
  it('when the goalkeeper has come out, the second-last opponent may be an outfield player behind them', () => {
    const out = away.map((p) => (p.id === 'a1' ? { ...p, x: 25 } : p));
    expect(offsideLine(out, { x: 0, y: 0 }, 'away', 'positive_x')).toEqual({ x: 28, by: 'second_last_defender', playerId: 'a3' });
  });
  it('is at the ball when the ball is nearer the goal line than the second-last defender (Law 11)', () => {
    expect(offsideLine(away, { x: 40, y: 5 }, 'away', 'positive_x')).toEqual({ x: 40, by: 'ball' });
  });
  it('never lies in the attackers own half: at most the halfway line (Law 11)', () => {
    const deep = [spot('a1', 'away', -2, 0, true), spot('a2', 'away', -10), spot('a3', 'away', -20)];
    expect(offsideLine(deep, { x: -30, y: 0 }, 'away', 'positive_x')).toEqual({ x: 0, by: 'halfway' });
  });
  it('follows the direction of attack of the period', () => {
    // Second half: home attacks −x, so away defends the −x goal.
    const mirrored = away.map((p) => ({ ...p, x: -p.x }));
    expect(offsideLine(mirrored, { x: -10, y: 0 }, 'away', 'negative_x')).toEqual({ x: -30, by: 'second_last_defender', playerId: 'a2' });
    expect(attackSign('away', 'negative_x')).toBe(1);
    expect(offsideLine([spot('a1', 'away', 3)], null, 'away', 'positive_x')).toBeNull();
  });
});

describe('back line, team lines, distance, keepers', () => {
  const home = [spot('h1', 'home', -48, 0, true), ...[-30, -29, -31, -30.5].map((x, i) => spot(`h${i + 2}`, 'home', x, i * 10 - 15)), ...[-12, -10, -11].map((x, i) => spot(`h${i + 6}`, 'home', x, i * 10 - 10)), ...[8, 9, 6].map((x, i) => spot(`h${i + 9}`, 'home', x, i * 12 - 12))];
  it('back line is the deepest outfield player, not the goalkeeper', () => {
    expect(backLine(home, 'home', 'positive_x')).toEqual({ x: -31, playerId: 'h4' });
    expect(backLine(home.map((p) => ({ ...p, x: -p.x })), 'home', 'negative_x')).toEqual({ x: 31, playerId: 'h4' });
  });
  it('team lines from Jenks give the 4-3-3 back to front', () => {
    const lines = teamLines(home, 'home', 'positive_x', 3);
    expect(lines.map((l) => l.playerIds.sort())).toEqual([['h2', 'h3', 'h4', 'h5'], ['h6', 'h7', 'h8'], ['h10', 'h11', 'h9']]);
    expect(lines[0].x).toBeCloseTo(-30.125, 9);
    const flipped = teamLines(home.map((p) => ({ ...p, x: -p.x })), 'home', 'negative_x', 3);
    expect(flipped[0].x).toBeCloseTo(30.125, 9);
  });
  it('distance between two chosen players', () => {
    expect(playerDistance(home, 'h2', 'h3')).toBeCloseTo(Math.hypot(1, 10), 9);
    expect(playerDistance(home, 'h2', 'nobody')).toBeNull();
  });
  it('guesses the keeper as the deepest player by median x', () => {
    expect(guessKeepers([{ id: 'h1', team: 'home', xs: [-48, -47, 10] }, { id: 'h2', team: 'home', xs: [-30, -31] }, { id: 'a1', team: 'away', xs: [49, 50] }, { id: 'a2', team: 'away', xs: [20] }], 'positive_x')).toEqual({ home: 'h1', away: 'a1' });
  });
});

describe('frameGeometry: all layers of one moment', () => {
  it('agrees with the single functions and covers the pitch', async () => {
    const { frameGeometry } = await import('../../../engine/geometry/frame-geometry.ts');
    const home = [spot('h1', 'home', -50, 0, true), spot('h2', 'home', -20, -5), spot('h3', 'home', -22, 5), spot('h4', 'home', 0, 0)];
    const g = frameGeometry([...home, ...away], { x: 3, y: -1 }, 'positive_x', { length: 105, width: 68 });
    expect(g.away.offside).toEqual({ x: 30, by: 'second_last_defender', playerId: 'a2' });
    // Home defends the −x goal: second-last defender is h3 at −22.
    expect(g.home.offside).toEqual({ x: -22, by: 'second_last_defender', playerId: 'h3' });
    expect(g.home.back).toEqual({ x: -22, playerId: 'h3' });
    expect(g.home.shape!.playerCount).toBe(3);
    expect(g.space.area.home + g.space.area.away).toBeCloseTo(105 * 68, 6);
  });
});
