/**
 * An invented match in canonical form (centre-origin metres, y up) and writers that express
 * it in the layouts, units and origins importers must read. Tests compare what the
 * importer brings back with the canonical values the writer started from.
 */
import type { CoordinateMapping } from '../../../../shared-types/import.ts';
import { fromCentreMetres } from '../../../../engine/import/index.ts';

export interface SynthOptions {
  rate: number;
  /** Seconds per period. */
  periodS: number;
  periods: number;
  /** First frame number of each period (as a file numbers them). */
  firstFrames?: number[];
  withBall?: boolean;
}

export interface SynthObject {
  id: string;
  team?: 'home' | 'away';
  shirt?: number;
}

export interface SynthFrame {
  period: number;
  frame: number;
  t: number;
  /** Positions in centre metres, per object (NaN = missing). */
  x: number[];
  y: number[];
  ballZ: number;
}

export function synthObjects(withBall = true): SynthObject[] {
  const out: SynthObject[] = withBall ? [{ id: 'ball' }] : [];
  for (const team of ['home', 'away'] as const) for (let s = 1; s <= 11; s++) out.push({ id: `${team}_${s}`, team, shirt: s });
  return out;
}

/** Home starts in the negative-x half in odd periods (so attacks positive x), swapped in even ones. */
export function synthFrames(o: SynthOptions): { objects: SynthObject[]; frames: SynthFrame[] } {
  const objects = synthObjects(o.withBall ?? true);
  const frames: SynthFrame[] = [];
  for (let p = 1; p <= o.periods; p++) {
    const first = o.firstFrames?.[p - 1] ?? (p - 1) * 100_000;
    const n = Math.round(o.periodS * o.rate);
    const homeSign = p % 2 === 1 ? -1 : 1;
    for (let f = 0; f < n; f++) {
      const t = f / o.rate;
      const x: number[] = [];
      const y: number[] = [];
      for (const [i, ob] of objects.entries()) {
        if (!ob.team) {
          x.push(10 * Math.sin(t / 3));
          y.push(5 * Math.cos(t / 4));
          continue;
        }
        const side = ob.team === 'home' ? homeSign : -homeSign;
        const depth = 5 + ((ob.shirt! * 37) % 40);
        x.push(side * depth + Math.sin(t + i));
        y.push(-30 + ((ob.shirt! * 53) % 60) + Math.cos(t / 2 + i));
      }
      frames.push({ period: p, frame: first + f, t, x, y, ballZ: 0.11 + Math.abs(Math.sin(t)) });
    }
  }
  return { objects, frames };
}

const fmt = (v: number): string => (Number.isFinite(v) ? String(Math.round(v * 1000) / 1000) : '');

export function coords(c: Partial<CoordinateMapping>): CoordinateMapping {
  return { unit: 'm', origin: 'centre', yDown: false, pitch: { length: 105, width: 68 }, ...c };
}

/** Wide CSV: period,frame,time_s,ball_x,ball_y,ball_z,home_1_x,home_1_y,... */
export function writeWide(s: ReturnType<typeof synthFrames>, c: CoordinateMapping, opts: { delimiter?: string; eol?: string; periodColumn?: boolean } = {}): string {
  const d = opts.delimiter ?? ',';
  const eol = opts.eol ?? '\n';
  const head = [...(opts.periodColumn === false ? [] : ['period']), 'frame', 'time_s'];
  for (const o of s.objects) head.push(`${o.id}_x`, `${o.id}_y`, ...(o.id === 'ball' ? ['ball_z'] : []));
  const lines = [head.join(d)];
  for (const f of s.frames) {
    const row = [...(opts.periodColumn === false ? [] : [String(f.period)]), String(f.frame), f.t.toFixed(2)];
    s.objects.forEach((o, i) => {
      const [x, y] = fromCentreMetres(c, f.x[i], f.y[i]);
      row.push(fmt(x), fmt(y));
      if (o.id === 'ball') row.push(fmt(f.ballZ * (c.unit === 'cm' ? 100 : 1)));
    });
    lines.push(row.join(d));
  }
  return lines.join(eol) + eol;
}

/** Long CSV: period,frame,time_s,object,team,shirt,x,y,z */
export function writeLong(s: ReturnType<typeof synthFrames>, c: CoordinateMapping, d = ','): string {
  const lines = [['period', 'frame', 'time_s', 'object', 'team', 'shirt', 'x', 'y', 'z'].join(d)];
  for (const f of s.frames) {
    s.objects.forEach((o, i) => {
      const [x, y] = fromCentreMetres(c, f.x[i], f.y[i]);
      lines.push([f.period, f.frame, f.t.toFixed(2), o.id, o.team ?? 'ball', o.shirt ?? '', fmt(x), fmt(y), o.id === 'ball' ? fmt(f.ballZ) : ''].join(d));
    });
  }
  return lines.join('\n') + '\n';
}

/** JSON Lines: {"frame":..,"t":..,"period":..,"objects":[{"id":..,"team":..,"x":..,"y":..}]} */
export function writeJsonl(s: ReturnType<typeof synthFrames>, c: CoordinateMapping): string {
  return (
    s.frames
      .map((f) =>
        JSON.stringify({
          frame: f.frame,
          t: Math.round(f.t * 100) / 100,
          period: f.period,
          objects: s.objects.map((o, i) => {
            const [x, y] = fromCentreMetres(c, f.x[i], f.y[i]);
            return { id: o.id, team: o.team ?? 'ball', x: Number.isFinite(x) ? Math.round(x * 1000) / 1000 : null, y: Number.isFinite(y) ? Math.round(y * 1000) / 1000 : null, ...(o.id === 'ball' ? { z: f.ballZ } : {}) };
          }),
        }),
      )
      .join('\n') + '\n'
  );
}

/** Chunks of a text cut at awkward places (prime length), to exercise chunk borders. */
export async function* chunked(text: string, size = 997): AsyncIterable<string> {
  for (let i = 0; i < text.length; i += size) yield text.slice(i, i + size);
}
