import { describe, expect, it } from 'vitest';
import { fromCentreMetres, toCentreMetres } from '../../../engine/import/index.ts';
import { coords } from './helpers/synthetic.ts';

// Law 1 (IFAB Laws of the Game) marks on a 105 x 68 m pitch, written by hand in each file
// grid (not through the converter), then brought back to centre-origin metres.
const L = 105;
const W = 68;
const HALF_GOAL = 7.32 / 2; // Law 1: 7.32 m between the posts
// Canonical (centre origin, y up) positions of the marks.
const marks: Record<string, [number, number]> = {
  'centre mark (Law 1)': [0, 0],
  'right penalty mark, 11 m from the goal line (Law 1)': [L / 2 - 11, 0],
  'left penalty mark, 11 m from the goal line (Law 1)': [-L / 2 + 11, 0],
  'goal-area corner, 5.5 m into the field and 5.5 m beyond the post (Law 1)': [L / 2 - 5.5, HALF_GOAL + 5.5],
  'penalty-area corner, 16.5 m x 16.5 m (Law 1)': [-L / 2 + 16.5, -(HALF_GOAL + 16.5)],
  'corner arc end on the goal line, radius 1 m (Law 1)': [L / 2, W / 2 - 1],
  'corner arc end on the touchline, radius 1 m (Law 1)': [-L / 2 + 1, -W / 2],
};

// Each grid: how a person would write the canonical point in that file.
const grids = [
  { name: 'metres, centre origin', c: coords({}), write: (x: number, y: number) => [x, y] },
  { name: 'centimetres, centre origin', c: coords({ unit: 'cm' }), write: (x: number, y: number) => [x * 100, y * 100] },
  { name: 'millimetres, centre origin', c: coords({ unit: 'mm' }), write: (x: number, y: number) => [x * 1000, y * 1000] },
  { name: 'metres from the bottom-left corner', c: coords({ origin: 'bottom_left' }), write: (x: number, y: number) => [x + L / 2, y + W / 2] },
  { name: 'cm from the bottom-left corner', c: coords({ unit: 'cm', origin: 'bottom_left' }), write: (x: number, y: number) => [(x + L / 2) * 100, (y + W / 2) * 100] },
  { name: 'metres from the top-left corner, y down', c: coords({ origin: 'top_left', yDown: true }), write: (x: number, y: number) => [x + L / 2, W / 2 - y] },
  { name: 'normalised 0..1 from the bottom-left', c: coords({ unit: 'normalised', origin: 'bottom_left' }), write: (x: number, y: number) => [(x + L / 2) / L, (y + W / 2) / W] },
  { name: 'normalised 0..1 from the top-left, y down', c: coords({ unit: 'normalised', origin: 'top_left', yDown: true }), write: (x: number, y: number) => [(x + L / 2) / L, (W / 2 - y) / W] },
  { name: 'normalised, centre origin (-0.5..0.5)', c: coords({ unit: 'normalised' }), write: (x: number, y: number) => [x / L, y / W] },
  { name: '0..100 grid from the bottom-left', c: coords({ origin: 'bottom_left', gridLength: 100, gridWidth: 100 }), write: (x: number, y: number) => [((x + L / 2) / L) * 100, ((y + W / 2) / W) * 100] },
  { name: 'metres, centre origin, y down', c: coords({ yDown: true }), write: (x: number, y: number) => [x, -y] },
];

describe('coordinate grids -> centre-origin metres on Law 1 marks', () => {
  for (const g of grids) {
    for (const [mark, [x, y]] of Object.entries(marks)) {
      it(`${g.name}: ${mark}`, () => {
        const [fx, fy] = g.write(x, y);
        const [cx, cy] = toCentreMetres(g.c, fx, fy);
        expect(cx).toBeCloseTo(x, 9);
        expect(cy).toBeCloseTo(y, 9);
        // And the inverse gives back what the person wrote.
        const [bx, by] = fromCentreMetres(g.c, cx, cy);
        expect(bx).toBeCloseTo(fx, 9);
        expect(by).toBeCloseTo(fy, 9);
      });
    }
  }

  it('penalty mark is 11 m from the goal-line midpoint after conversion from corner cm (Law 1)', () => {
    const c = coords({ unit: 'cm', origin: 'bottom_left' });
    const [px, py] = toCentreMetres(c, 9400, 3400); // 94 m, 34 m from the corner
    const [gx, gy] = toCentreMetres(c, 10500, 3400); // goal-line midpoint
    expect(Math.hypot(gx - px, gy - py)).toBeCloseTo(11, 9);
  });

  it('centre circle radius stays 9.15 m from a normalised top-left grid (Law 1)', () => {
    const c = coords({ unit: 'normalised', origin: 'top_left', yDown: true });
    const [x, y] = toCentreMetres(c, 0.5, 0.5 - 9.15 / W); // top of the circle, written y-down
    expect(x).toBeCloseTo(0, 9);
    expect(y).toBeCloseTo(9.15, 9);
  });
});
