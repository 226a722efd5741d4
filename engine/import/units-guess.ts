/**
 * Guessing a file's coordinate grid from the values seen (units, origin). The y direction
 * cannot be told from values alone: corner grids are taken as y up from the bottom-left
 * unless a name says otherwise, and the clue says so, so the analyst can check.
 */
import type { CoordinateMapping } from '../../shared-types/import.ts';
import { DEFAULT_PITCH } from '../../shared-types/domain.ts';

export interface GridGuess {
  coordinates: CoordinateMapping;
  clues: string[];
  confidence: number;
}

export function guessGrid(xs: number[], ys: number[], hint = ''): GridGuess {
  const pitch = { ...DEFAULT_PITCH };
  const fx = xs.filter(Number.isFinite);
  const fy = ys.filter(Number.isFinite);
  const base: CoordinateMapping = { unit: 'm', origin: 'centre', yDown: false, pitch };
  if (!fx.length || !fy.length) return { coordinates: base, clues: ['no coordinates seen; assumed metres from the centre mark'], confidence: 0.2 };
  const minX = Math.min(...fx);
  const maxX = Math.max(...fx);
  const minY = Math.min(...fy);
  const maxY = Math.max(...fy);
  const range = `x ${round(minX)}..${round(maxX)}, y ${round(minY)}..${round(maxY)}`;
  // Centre origin shows values well either side of 0; a corner grid only small negatives
  // (positions a little beyond the lines: the ball out of play, a throw-in taker).
  const negative = minX < -0.25 * Math.abs(maxX) || minY < -0.25 * Math.abs(maxY);
  const extent = Math.max(Math.abs(minX), Math.abs(maxX), Math.abs(minY), Math.abs(maxY));
  const yDownHint = /top|down|image|screen/i.test(hint);
  if (negative) {
    if (extent <= 0.75) return { coordinates: { ...base, unit: 'normalised', origin: 'centre' }, clues: [`${range}: normalised, centre origin`], confidence: 0.6 };
    const unit = extent <= 80 ? 'm' : extent <= 8000 ? 'cm' : 'mm';
    return { coordinates: { ...base, unit }, clues: [`${range}: values either side of 0, so centre origin; extent says ${unit}`], confidence: 0.8 };
  }
  const origin = yDownHint ? 'top_left' : 'bottom_left';
  const yDown = yDownHint;
  const yNote = yDownHint ? 'y grows downwards (name says so)' : 'y taken as growing upwards (values cannot tell; check)';
  // Up to 1.2: positions a little beyond the lines still read as a 0..1 grid (metres would reach far higher).
  if (maxX <= 1.2 && maxY <= 1.2) {
    return { coordinates: { ...base, unit: 'normalised', origin, yDown }, clues: [`${range}: normalised 0..1 from a corner; ${yNote}`], confidence: 0.7 };
  }
  if (maxX <= 101 && maxY <= 101 && maxY > 72) {
    return {
      coordinates: { ...base, unit: 'm', origin, yDown, gridLength: 100, gridWidth: 100 },
      clues: [`${range}: a 0..100 grid on both axes from a corner; ${yNote}`],
      confidence: 0.6,
    };
  }
  if (maxX <= 135 && maxY <= 95) {
    return { coordinates: { ...base, unit: 'm', origin, yDown }, clues: [`${range}: metres from a corner; ${yNote}`], confidence: 0.7 };
  }
  const unit = maxX <= 13500 ? 'cm' : 'mm';
  return { coordinates: { ...base, unit, origin, yDown }, clues: [`${range}: ${unit} from a corner; ${yNote}`], confidence: 0.6 };
}

const round = (v: number): number => Math.round(v * 100) / 100;
