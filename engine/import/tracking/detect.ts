/**
 * Tracking detection from the head of a file: layout (long / wide / JSON Lines), columns,
 * grid, rate and how periods are told apart.
 */

import type { Detection, TrackingMapping } from '../../../shared-types/import.ts';
import { COLUMN_NAMES, findColumn, looseName } from '../columns.ts';
import { parseObjectId } from '../object-ids.ts';
import { parseNumber } from '../text/numbers.ts';
import { guessGrid } from '../units-guess.ts';
import { jsonNumber } from './fields.ts';

type WideObject = NonNullable<TrackingMapping['columns']['objects']>[number];

/** x/y column pairs such as home_7_x + home_7_y, or ball.x + ball.y. */
export function wideObjectsFromHeader(header: string[]): WideObject[] {
  const out: WideObject[] = [];
  const set = new Set(header);
  for (const h of header) {
    const m = /^(.+?)[ _.-]?([xX])$/.exec(h);
    if (!m) continue;
    const yName = h.slice(0, -1) + (m[2] === 'x' ? 'y' : 'Y');
    if (!set.has(yName)) continue;
    const id = m[1];
    if (['end', 'start', 'pos', 'to', 'from'].includes(looseName(id))) continue;
    const info = parseObjectId(id);
    const o: WideObject = { id, x: h, y: yName };
    if (info.team) o.team = info.team;
    if (info.role === 'ball') o.role = 'ball';
    else if (info.role === 'player') o.role = 'player';
    out.push(o);
  }
  return out;
}

/** Median of positive consecutive differences time/frame, as a rate in Hz. */
export function rateFromPairs(frames: number[], times: number[]): number | undefined {
  const r: number[] = [];
  for (let i = 1; i < times.length; i++) {
    const dt = times[i] - times[i - 1];
    const df = frames.length ? frames[i] - frames[i - 1] : 1;
    if (dt > 0 && df > 0 && Number.isFinite(dt / df)) r.push(df / dt);
  }
  if (!r.length) return undefined;
  r.sort((a, b) => a - b);
  return niceRate(r[r.length >> 1]);
}

/** Rounds a measured rate to a usual one when within 1% (25, 10, 30000/1001, ...). */
export function niceRate(hz: number): number {
  for (const usual of [1, 5, 10, 12.5, 15, 20, 24, 25, 29.97002997, 30, 50, 59.94005994, 60, 100]) {
    if (Math.abs(hz - usual) / usual < 0.01) return usual;
  }
  return Math.round(hz * 1000) / 1000;
}

export function detectTrackingCsv(header: string[], rows: string[][], delimiter: string): Omit<Detection, 'header' | 'preview' | 'problems'> | null {
  const clues: string[] = [];
  const col = (k: keyof typeof COLUMN_NAMES, exclude: string[] = []) => findColumn(header, COLUMN_NAMES[k], exclude);
  const frame = col('frame');
  const time = col('time', frame ? [frame] : []);
  const period = col('period');
  const wide = wideObjectsFromHeader(header);
  const idx = (name: string | undefined) => (name ? header.indexOf(name) : -1);
  const values = (name: string | undefined) => rows.map((r) => parseNumber(r[idx(name)] ?? '')).filter(Number.isFinite);

  let mapping: TrackingMapping;
  let confidence: number;
  const xs: number[] = [];
  const ys: number[] = [];
  if (wide.length >= 3) {
    clues.push(`${wide.length} x/y column pairs (wide layout: a row per frame)`);
    const ball = wide.find((o) => o.role === 'ball');
    clues.push(ball ? `ball columns: ${ball.x}, ${ball.y}` : 'no ball columns');
    const z = ball ? header.find((h) => looseName(h) === looseName(ball.id) + 'z') : undefined;
    for (const o of wide) {
      xs.push(...values(o.x));
      ys.push(...values(o.y));
    }
    mapping = {
      kind: 'tracking',
      layout: 'wide',
      delimiter,
      columns: { frame, time, period, z, objects: wide },
      ballId: ball?.id,
      periods: period ? { from: 'column' } : { from: 'gap', minGapS: 60 },
      coordinates: guessGrid([], []).coordinates,
    };
    confidence = 0.9;
  } else {
    const objectId = col('object');
    const team = col('team');
    const shirt = col('shirt');
    const x = col('x');
    const y = col('y');
    if (!x || !y || (!objectId && !(team && shirt)) || (!frame && !time)) return null;
    clues.push(`object column "${objectId ?? `${team} + ${shirt}`}" with x "${x}", y "${y}" (long layout: a row per object per frame)`);
    xs.push(...values(x));
    ys.push(...values(y));
    const ids = new Set(rows.map((r) => (objectId ? r[idx(objectId)] : r[idx(team)])?.trim().toLowerCase()));
    const ballId = [...ids].find((v) => v === 'ball');
    clues.push(ballId ? 'a ball object is present' : 'no ball rows seen in the first part');
    mapping = {
      kind: 'tracking',
      layout: 'long',
      delimiter,
      columns: { frame, time, period, objectId, team, shirt, x, y, z: col('z') },
      ballId: objectId ? ballId : undefined,
      periods: period ? { from: 'column' } : { from: 'gap', minGapS: 60 },
      coordinates: guessGrid([], []).coordinates,
    };
    confidence = 0.85;
  }
  clues.push(frame ? `frame column "${frame}"` : 'no frame column: frames from time x rate');
  if (period) clues.push(`period column "${period}"`);
  else clues.push('no period column: a new period starts at a time gap of 60 s or more, or where the clock restarts');
  if (time) {
    const fr = frame ? rows.map((r) => parseNumber(r[idx(frame)] ?? '')) : [];
    const tm = rows.map((r) => parseNumber(r[idx(time)] ?? ''));
    const rate = rateFromPairs(fr, tm);
    if (rate) {
      mapping.rate = rate;
      clues.push(`rate ${rate} Hz from the time column "${time}"`);
    }
  }
  if (!mapping.rate) {
    mapping.rate = 25;
    clues.push('rate not measurable from the first rows; assumed 25 Hz (common practice)');
    confidence -= 0.2;
  }
  const grid = guessGrid(xs, ys, header.join(' '));
  mapping.coordinates = grid.coordinates;
  clues.push(...grid.clues);
  return { kind: 'tracking', clues, mapping, confidence: Math.min(confidence, 0.5 + grid.confidence / 2) };
}

/** JSON Lines tracking: one frame object per line with an array of objects. */
export function detectTrackingJsonl(objects: Record<string, unknown>[]): Omit<Detection, 'header' | 'preview' | 'problems'> | null {
  const first = objects[0];
  if (!first) return null;
  const keys = Object.keys(first);
  const listKey = keys.find((k) => Array.isArray(first[k]) && (first[k] as unknown[]).some((o) => o && typeof o === 'object'));
  if (!listKey) return null;
  const item = (first[listKey] as Record<string, unknown>[]).find((o) => o && typeof o === 'object') ?? {};
  const itemKeys = Object.keys(item);
  const frame = findColumn(keys, COLUMN_NAMES.frame);
  const time = findColumn(keys, COLUMN_NAMES.time, frame ? [frame] : []);
  const period = findColumn(keys, COLUMN_NAMES.period);
  const objectId = findColumn(itemKeys, COLUMN_NAMES.object);
  const team = findColumn(itemKeys, COLUMN_NAMES.team);
  const shirt = findColumn(itemKeys, COLUMN_NAMES.shirt);
  const x = findColumn(itemKeys, COLUMN_NAMES.x);
  const y = findColumn(itemKeys, COLUMN_NAMES.y);
  const z = findColumn(itemKeys, COLUMN_NAMES.z);
  if (!x || !y || (!frame && !time)) return null;
  const clues = [`JSON Lines: a frame per line, objects in "${listKey}" with x "${x}", y "${y}"`];
  const xs: number[] = [];
  const ys: number[] = [];
  const frames: number[] = [];
  const times: number[] = [];
  let ball: string | undefined;
  for (const o of objects) {
    if (frame) frames.push(jsonNumber(o[frame]).value);
    if (time) times.push(jsonNumber(o[time]).value);
    const list = o[listKey];
    if (!Array.isArray(list)) continue;
    for (const it of list as Record<string, unknown>[]) {
      if (!it || typeof it !== 'object') continue;
      xs.push(jsonNumber(it[x]).value);
      ys.push(jsonNumber(it[y]).value);
      const id = objectId ? String(it[objectId] ?? '') : '';
      if (parseObjectId(id).role === 'ball') ball = id;
    }
  }
  clues.push(ball ? `ball object "${ball}"` : 'no ball object seen in the first frames');
  const grid = guessGrid(xs, ys);
  clues.push(...grid.clues);
  const rate = time ? rateFromPairs(frame ? frames : [], times) : undefined;
  clues.push(rate ? `rate ${rate} Hz from "${time}"` : 'rate assumed 25 Hz (common practice)');
  clues.push(period ? `period field "${period}"` : 'no period field: a new period starts at a time gap of 60 s or more');
  const mapping: TrackingMapping = {
    kind: 'tracking',
    layout: 'jsonl',
    columns: { frame, time, period, objectId: objectId ?? 'id', team, shirt, x, y, z, objectList: listKey },
    ballId: ball,
    rate: rate ?? 25,
    periods: period ? { from: 'column' } : { from: 'gap', minGapS: 60 },
    coordinates: grid.coordinates,
  };
  return { kind: 'tracking', clues, mapping, confidence: Math.min(0.9, 0.5 + grid.confidence / 2) };
}

