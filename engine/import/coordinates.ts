/**
 * Brings coordinates from a file's own grid to canonical pitch metres (centre origin,
 * x along the length, y across, y up). See shared/DESIGN.md "Clocks and coordinates".
 *
 * toCentreMetres(coords, 52.5, 34) with { unit: 'm', origin: 'bottom_left' } -> [0, 0]
 */
import type { CoordinateMapping, LengthUnit } from '../../shared-types/import.ts';

const UNIT_METRES: Record<Exclude<LengthUnit, 'normalised'>, number> = { m: 1, cm: 0.01, mm: 0.001 };

/** Metres per file unit along x and y. */
function scales(c: CoordinateMapping): [number, number] {
  if (c.gridLength && c.gridWidth) return [c.pitch.length / c.gridLength, c.pitch.width / c.gridWidth];
  if (c.unit === 'normalised') return [c.pitch.length, c.pitch.width];
  const s = UNIT_METRES[c.unit] ?? 1;
  return [s, s];
}

/** A reusable converter: precomputes scale and shift once per import. */
export function makeConverter(c: CoordinateMapping): { x(v: number): number; y(v: number): number } {
  const [sx, sy] = scales(c);
  const x0 = c.origin === 'centre' ? 0 : -c.pitch.length / 2;
  // Where the file's y = 0 line sits, in centre-origin y-up metres.
  const y0 = c.origin === 'centre' ? 0 : c.origin === 'top_left' ? c.pitch.width / 2 : -c.pitch.width / 2;
  const ySign = c.yDown ? -1 : 1;
  return {
    x: (v) => x0 + v * sx,
    y: (v) => y0 + ySign * v * sy,
  };
}

export function toCentreMetres(c: CoordinateMapping, x: number, y: number): [number, number] {
  const conv = makeConverter(c);
  return [conv.x(x), conv.y(y)];
}

/** The inverse of toCentreMetres: canonical metres into the file's grid (tests, export). */
export function fromCentreMetres(c: CoordinateMapping, x: number, y: number): [number, number] {
  const [sx, sy] = scales(c);
  const x0 = c.origin === 'centre' ? 0 : -c.pitch.length / 2;
  const y0 = c.origin === 'centre' ? 0 : c.origin === 'top_left' ? c.pitch.width / 2 : -c.pitch.width / 2;
  const ySign = c.yDown ? -1 : 1;
  return [(x - x0) / sx, (ySign * (y - y0)) / sy];
}
