/**
 * Tracking CSV/TSV, long layout (a row per object per frame) and wide layout (a row per
 * frame, x/y column pairs per object). Streams records into a FrameStore.
 */
import type { TeamSide } from '../../../shared-types/domain.ts';
import type { TrackingMapping } from '../../../shared-types/import.ts';
import { CsvTokenizer, type CsvRecord } from '../text/csv-tokenizer.ts';
import { isMissingToken } from '../text/numbers.ts';
import type { ProblemLog } from '../text/problems.ts';
import { parseTeamValue } from '../object-ids.ts';
import { FrameStore } from './frame-store.ts';
import { parsePeriodLabel } from './fields.ts';
import { wideObjectsFromHeader } from './detect.ts';

export interface ChunkParser {
  push(chunk: string): void;
  end(): void;
  rows(): number;
}

interface Cols {
  frame: number;
  time: number;
  period: number;
  object: number;
  team: number;
  shirt: number;
  x: number;
  y: number;
  z: number;
  wide: { obj: number; x: number; y: number; z: number }[];
}

/** At most this many samples are reserved from a size estimate (about 2.5 full matches of 23 objects at 25 Hz). */
const MAX_EXPECTED_SAMPLES = 8_000_000;

/** bytesTotal (optional): the file size, to size the sample arrays once after the first chunk. */
export function trackingCsvParser(mapping: TrackingMapping, store: FrameStore, log: ProblemLog, bytesTotal = 0): ChunkParser {
  let cols: Cols | null = null;
  let failed = false;
  let rows = 0;
  let headerWidth = 0;
  const teamByName = new Map<string, TeamSide>();

  let header: string[] = [];
  const onHeader = (rec: CsvRecord): void => {
    header = [];
    for (let i = 0; i < rec.count; i++) header.push(rec.field(i).trim());
    headerWidth = header.length;
    const index = (name: string | undefined, what: string, required: boolean): number => {
      if (!name) {
        if (required) {
          log.error('missing-column', { line: 1, message: `No ${what} column is chosen in the mapping.`, hint: `Pick the column that holds the ${what}.` });
          failed = true;
        }
        return -1;
      }
      const i = header.indexOf(name);
      if (i === -1) {
        log.error('missing-column', {
          line: 1,
          column: name,
          message: `Column "${name}" (${what}) is not in the header.`,
          hint: `The header has: ${header.slice(0, 12).join(', ')}${header.length > 12 ? ', ...' : ''}. Fix the mapping or the file.`,
        });
        failed = true;
      }
      return i;
    };
    const c = mapping.columns;
    if (!c.frame && !c.time) {
      log.error('missing-column', { line: 1, message: 'Neither a frame nor a time column is chosen.', hint: 'Pick the frame number or the time column.' });
      failed = true;
    }
    cols = {
      frame: index(c.frame, 'frame number', false),
      time: index(c.time, 'time', false),
      period: index(c.period, 'period', mapping.periods.from === 'column'),
      object: -1,
      team: -1,
      shirt: -1,
      x: -1,
      y: -1,
      z: index(c.z, 'height (z)', false),
      wide: [],
    };
    if (mapping.layout === 'long') {
      cols.object = c.objectId ? index(c.objectId, 'object id', true) : -1;
      cols.team = index(c.team, 'team', false);
      cols.shirt = index(c.shirt, 'shirt', false);
      if (cols.object === -1 && (cols.team === -1 || cols.shirt === -1) && !failed) {
        log.error('missing-column', { line: 1, message: 'No object id column, and no team + shirt columns to make one.', hint: 'Pick the column naming each object (e.g. home_7, ball).' });
        failed = true;
      }
      cols.x = index(c.x, 'x', true);
      cols.y = index(c.y, 'y', true);
    } else {
      const objects = c.objects && c.objects.length ? c.objects : wideObjectsFromHeader(header);
      if (!objects.length) {
        log.error('missing-column', { line: 1, message: 'No x/y column pairs for objects were found.', hint: 'Wide layout needs columns like home_7_x, home_7_y.' });
        failed = true;
      }
      for (const o of objects) {
        const xi = index(o.x, `${o.id} x`, true);
        const yi = index(o.y, `${o.id} y`, true);
        const obj = store.object(o.id, { team: o.team, role: o.role });
        const isBall = store.objects[obj].role === 'ball' || o.id === mapping.ballId;
        if (isBall) store.objects[obj].role = 'ball';
        cols.wide.push({ obj, x: xi, y: yi, z: isBall ? cols.z : -1 });
      }
      wideFields = Int32Array.from(cols.wide.flatMap((w) => [w.x, w.y]));
      wideObjects = Int16Array.from(cols.wide.map((w) => w.obj));
      wideZSlots = Int32Array.from(cols.wide.flatMap((w, k) => (w.z !== -1 ? [k] : [])));
    }
  };

  const badNumber = (rec: CsvRecord, i: number, name: string): void => {
    if (isMissingToken(rec.field(i))) return;
    log.warn('bad-number', {
      line: rec.line,
      column: name,
      message: `"${rec.field(i).slice(0, 30)}" is not a number; taken as missing.`,
      hint: 'Missing values may be empty, NaN or NA.',
    });
  };

  let wideFields = new Int32Array(0);
  let wideObjects = new Int16Array(0);
  /** Slots of the objects whose height is read from the z column (the ball). */
  let wideZSlots = new Int32Array(0);
  const onRow = (rec: CsvRecord): void => {
    const c = cols!;
    rows++;
    if (rec.unterminated) return reject(rec, 'a quoted field is never closed');
    if (rec.count < headerWidth && rec.count <= Math.max(c.x, c.y, c.frame, c.time, c.period))
      return reject(rec, `row has ${rec.count} fields, the header has ${headerWidth}`);
    let period = 0;
    if (c.period !== -1) {
      // Plain digits are the common case; labels like "2H" go through the slower reader.
      const pn = rec.num(c.period);
      period = pn >= 1 && pn <= 5 && Number.isInteger(pn) ? pn : parsePeriodLabel(rec.field(c.period));
      if (!period) return reject(rec, `unknown period "${rec.field(c.period).slice(0, 20)}"`);
    }
    let frame = NaN;
    if (c.frame !== -1) {
      frame = rec.num(c.frame);
      if (!Number.isInteger(frame) || frame < 0) return reject(rec, `frame "${rec.field(c.frame).slice(0, 20)}" is not a whole number`);
    }
    let time = NaN;
    if (c.time !== -1) {
      time = rec.num(c.time);
      if (!Number.isFinite(time)) {
        if (c.frame === -1) return reject(rec, `time "${rec.field(c.time).slice(0, 20)}" is not a number`);
        time = NaN;
      }
    }
    if (mapping.layout === 'long') {
      // Object of this row: looked up by the raw id text, parsed only on first sight.
      const key = c.object !== -1 ? rec.field(c.object) : rec.field(c.team) + '\u0000' + rec.field(c.shirt);
      let obj = objectByKey.get(key);
      if (obj === undefined) {
        obj = resolveObject(rec);
        if (obj === -1) return reject(rec, 'no object id');
        objectByKey.set(key, obj);
      }
      const entry = store.entry(period, frame, time, rec.line, true);
      const x = rec.num(c.x);
      const y = rec.num(c.y);
      if (x !== x) badNumber(rec, c.x, mapping.columns.x!);
      if (y !== y) badNumber(rec, c.y, mapping.columns.y!);
      const z = c.z !== -1 ? rec.num(c.z) : NaN;
      store.sample(entry, obj, x, y, z);
    } else {
      const entry = store.entry(period, frame, time, rec.line);
      // The whole row of objects at once, numbers parsed straight into the store's slots
      // (no call and no intermediate array per sample); problems checked afterwards.
      const n = c.wide.length;
      const at = store.reserveSamples(n);
      rec.numsXY(wideFields, store.sampleX, store.sampleY, at);
      const sE = store.sampleEntry;
      const sO = store.sampleObject;
      const sX = store.sampleX;
      const sY = store.sampleY;
      const sZ = store.sampleZ;
      // A plain loop: typed-array fill/set calls cost more than they save on 23 slots.
      for (let k = 0; k < n; k++) {
        const j = at + k;
        sE[j] = entry;
        sO[j] = wideObjects[k];
        sZ[j] = NaN;
        if (sX[j] !== sX[j]) badNumber(rec, wideFields[2 * k], header[wideFields[2 * k]]);
        if (sY[j] !== sY[j]) badNumber(rec, wideFields[2 * k + 1], header[wideFields[2 * k + 1]]);
      }
      for (let b = 0; b < wideZSlots.length; b++) sZ[at + wideZSlots[b]] = rec.num(c.z);
    }
  };

  const objectByKey = new Map<string, number>();
  /** Long layout: the object a row names (id column, or team + shirt), registered with its team and shirt. */
  const resolveObject = (rec: CsvRecord): number => {
    const c = cols!;
    let id = c.object !== -1 ? rec.field(c.object).trim() : '';
    const teamRaw = c.team !== -1 ? rec.field(c.team).trim() : '';
    const shirtRaw = c.shirt !== -1 ? rec.field(c.shirt).trim() : '';
    const teamVal = teamRaw ? parseTeamValue(teamRaw) ?? teamFromName(teamRaw) : undefined;
    if (!id) id = teamVal === 'ball' ? 'ball' : teamRaw && shirtRaw ? `${teamVal ?? teamRaw}_${shirtRaw}` : '';
    if (!id) return -1;
    const shirt = shirtRaw ? Number(shirtRaw) : undefined;
    return store.object(id, {
      team: teamVal === 'ball' ? undefined : teamVal,
      shirt: shirt !== undefined && Number.isInteger(shirt) ? shirt : undefined,
      role: teamVal === 'ball' || id === mapping.ballId ? 'ball' : undefined,
    });
  };

  /** Team names (not home/away) in a long file: first seen is home, as for event logs. */
  const teamFromName = (name: string): TeamSide | undefined => {
    let side = teamByName.get(name);
    if (!side && teamByName.size < 2) {
      side = teamByName.size === 0 ? 'home' : 'away';
      teamByName.set(name, side);
      log.warn('team-order', { message: `Team "${name}" taken as ${side} (order of first appearance).`, hint: 'Use home/away in the team column to be explicit.' });
    }
    return side;
  };

  const reject = (rec: CsvRecord, reason: string): void => {
    log.reject(rec.line, rec.text().slice(0, 500), reason);
    log.warn('rejected-row', { line: rec.line, message: `Row skipped: ${reason}.`, hint: 'Skipped rows are listed with the import; save them to check.' });
  };

  // Pull records (feed / next) so the hot loop has no callback into the tokenizer.
  const tokenizer = new CsvTokenizer(mapping.delimiter ?? ',');
  const drain = (): void => {
    for (let rec = tokenizer.next(); rec; rec = tokenizer.next()) {
      if (!cols) onHeader(rec);
      else if (!failed) onRow(rec);
    }
  };
  let charsSeen = 0;
  let sized = false;
  /** Once 64 KB are in: samples per character so far, times the file size (5 % spare). */
  const sizeFromFirstChunk = (): void => {
    sized = true;
    if (bytesTotal <= charsSeen) return;
    const expected = Math.ceil((store.sampleCount / charsSeen) * bytesTotal * 1.05);
    store.expectSamples(Math.min(expected, MAX_EXPECTED_SAMPLES));
  };
  return {
    push: (chunk) => {
      tokenizer.feed(chunk);
      drain();
      charsSeen += chunk.length;
      if (!sized && charsSeen >= 65536 && store.sampleCount > 0) sizeFromFirstChunk();
    },
    end: () => {
      tokenizer.finish();
      drain();
      if (!cols) {
        log.error('empty', { message: 'The file is empty: no header row.', hint: 'Choose the tracking file itself.' });
      }
    },
    rows: () => rows,
  };
}
