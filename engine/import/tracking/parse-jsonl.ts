/** Tracking JSON Lines: one frame per line, `{"frame":..,"t":..,"period":..,"objects":[{"id":..,"x":..,"y":..}]}`. */
import type { TrackingMapping } from '../../../shared-types/import.ts';
import { LineSplitter } from '../text/lines.ts';
import type { ProblemLog } from '../text/problems.ts';
import { parseTeamValue } from '../object-ids.ts';
import type { FrameStore } from './frame-store.ts';
import { jsonNumber, parsePeriodLabel } from './fields.ts';
import type { ChunkParser } from './parse-csv.ts';

export function trackingJsonlParser(mapping: TrackingMapping, store: FrameStore, log: ProblemLog): ChunkParser {
  const c = mapping.columns;
  const listKey = c.objectList ?? 'objects';
  const idKey = c.objectId ?? 'id';
  const xKey = c.x ?? 'x';
  const yKey = c.y ?? 'y';
  let rows = 0;
  if (!c.frame && !c.time) log.error('missing-column', { message: 'Neither a frame nor a time field is chosen.', hint: 'Pick the frame number or the time field.' });
  if (mapping.periods.from === 'column' && !c.period) log.error('missing-column', { message: 'Periods come from a field, but no period field is chosen.', hint: 'Pick the period field or find periods by time gaps.' });
  const failed = log.hasErrors();

  const reject = (line: number, text: string, reason: string): void => {
    log.reject(line, text.slice(0, 500), reason);
    log.warn('rejected-row', { line, message: `Line skipped: ${reason}.`, hint: 'Skipped lines are listed with the import; save them to check.' });
  };
  const badNumber = (line: number, field: string, v: unknown): void =>
    log.warn('bad-number', { line, column: field, message: `${JSON.stringify(v)?.slice(0, 30)} is not a number; taken as missing.`, hint: 'Missing values may be null or absent.' });

  const onLine = (text: string, line: number): void => {
    rows++;
    if (failed) return;
    let obj: unknown;
    try {
      obj = JSON.parse(text);
    } catch {
      return reject(line, text, 'not valid JSON');
    }
    if (!obj || typeof obj !== 'object' || Array.isArray(obj)) return reject(line, text, 'not a JSON object');
    const o = obj as Record<string, unknown>;
    let period = 0;
    if (c.period) {
      period = parsePeriodLabel(o[c.period] as string | number);
      if (!period) return reject(line, text, `unknown period ${JSON.stringify(o[c.period])?.slice(0, 20)}`);
    }
    let frame = NaN;
    if (c.frame) {
      frame = jsonNumber(o[c.frame]).value;
      if (!Number.isInteger(frame) || frame < 0) return reject(line, text, `frame ${JSON.stringify(o[c.frame])?.slice(0, 20)} is not a whole number`);
    }
    let time = NaN;
    if (c.time) {
      time = jsonNumber(o[c.time]).value;
      if (!Number.isFinite(time) && !c.frame) return reject(line, text, `time ${JSON.stringify(o[c.time])?.slice(0, 20)} is not a number`);
    }
    const list = o[listKey];
    if (!Array.isArray(list)) return reject(line, text, `no "${listKey}" array`);
    const entry = store.entry(period, frame, time, line);
    for (const item of list) {
      if (!item || typeof item !== 'object') continue;
      const it = item as Record<string, unknown>;
      const idRaw = it[idKey];
      if (idRaw === undefined || idRaw === null || idRaw === '') continue;
      const teamVal = c.team && typeof it[c.team] === 'string' ? parseTeamValue(it[c.team] as string) : undefined;
      const shirt = c.shirt ? jsonNumber(it[c.shirt]).value : NaN;
      const index = store.object(String(idRaw), {
        team: teamVal === 'ball' ? undefined : teamVal,
        shirt: Number.isInteger(shirt) ? shirt : undefined,
        role: teamVal === 'ball' || String(idRaw) === mapping.ballId ? 'ball' : undefined,
      });
      const x = jsonNumber(it[xKey]);
      const y = jsonNumber(it[yKey]);
      if (x.invalid) badNumber(line, xKey, it[xKey]);
      if (y.invalid) badNumber(line, yKey, it[yKey]);
      const z = c.z ? jsonNumber(it[c.z]).value : NaN;
      store.sample(entry, index, x.value, y.value, z);
    }
  };
  const splitter = new LineSplitter(onLine);
  return {
    push: (chunk) => splitter.push(chunk),
    end: () => splitter.end(),
    rows: () => rows,
  };
}
