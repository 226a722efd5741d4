/**
 * detectSource: what kind of file this is and a proposed mapping, from its name and the
 * first part of its text (e.g. 64 KB). Never throws; an unreadable head is kind 'unknown'
 * with a problem saying why.
 *
 * detectSource('match.csv', 'period,frame,time_s,ball_x,...') -> { kind: 'tracking', mapping: { layout: 'wide', ... } }
 */
import type { Detection, ImportProblem } from '../../shared-types/import.ts';
import { detectEvents } from './events/detect.ts';
import { CsvTokenizer, guessDelimiter } from './text/csv-tokenizer.ts';
import { JsonObjectSplitter } from './text/json-objects.ts';
import { detectTrackingCsv, detectTrackingJsonl } from './tracking/detect.ts';

const PREVIEW_ROWS = 20;
/** Rows read from the head for the guesses. */
const SAMPLE_ROWS = 2000;

export function detectSource(fileName: string, head: string): Detection {
  try {
    return detectUnsafe(fileName, head);
  } catch (err) {
    // Detection is a guess: a surprise in the head must not stop the analyst choosing by hand.
    return unknown(fileName, [], [], [`could not read the start of the file (${err instanceof Error ? err.message : String(err)})`]);
  }
}

function unknown(file: string, header: string[], preview: string[][], clues: string[], extra: ImportProblem[] = []): Detection {
  return {
    kind: 'unknown',
    clues,
    header,
    preview,
    confidence: 0,
    problems: [
      ...extra,
      { severity: 'error', file, message: 'Not recognised as tracking or an event log.', hint: 'Check it is the right file, or set the mapping by hand.' },
    ],
  };
}

function detectUnsafe(fileName: string, headRaw: string): Detection {
  const head = headRaw.charCodeAt(0) === 0xfeff ? headRaw.slice(1) : headRaw;
  const trimmed = head.trimStart();
  if (!trimmed) return unknown(fileName, [], [], ['the file is empty']);
  if (trimmed[0] === '{' || trimmed[0] === '[') return detectJson(fileName, trimmed);
  return detectDelimited(fileName, head);
}

function detectDelimited(fileName: string, head: string): Detection {
  const firstLine = head.slice(0, head.indexOf('\n') === -1 ? head.length : head.indexOf('\n'));
  const delimiter = /\.tsv$/i.test(fileName) ? '\t' : guessDelimiter(firstLine);
  const records: string[][] = [];
  const tok = new CsvTokenizer(delimiter, (rec) => {
    if (records.length > SAMPLE_ROWS) return;
    const r: string[] = [];
    for (let i = 0; i < rec.count; i++) r.push(rec.field(i));
    records.push(r);
  });
  // The head may stop mid-line: only whole lines are used.
  const lastNl = head.lastIndexOf('\n');
  tok.push(lastNl === -1 ? head : head.slice(0, lastNl + 1));
  if (lastNl === -1) tok.end();
  const [headerRaw, ...rows] = records;
  const header = (headerRaw ?? []).map((h) => h.trim());
  const preview = rows.slice(0, PREVIEW_ROWS);
  const delimName = delimiter === '\t' ? 'tab' : `"${delimiter}"`;
  const baseClue = `delimited text, ${delimName} between ${header.length} columns`;
  if (header.length < 2) return unknown(fileName, header, preview, [baseClue]);
  const tracking = detectTrackingCsv(header, rows, delimiter);
  const asObjects = rows.map((r) => Object.fromEntries(header.map((h, i) => [h, r[i] ?? ''])));
  const events = detectEvents(fileName, header, asObjects, 'csv', delimiter);
  // A column of event names settles it against long tracking (which has no such column).
  const best = events && tracking?.mapping?.kind === 'tracking' && tracking.mapping.layout === 'long' ? events : pick(tracking, events);
  if (!best) return unknown(fileName, header, preview, [baseClue, `columns: ${header.slice(0, 12).join(', ')}`]);
  const problems: ImportProblem[] = [...(best.problems ?? [])];
  if (!rows.length) problems.push({ severity: 'warning', file: fileName, line: 2, message: 'Only a header was found in the first part of the file.', hint: 'Check the file has data rows.' });
  return { ...best, clues: [baseClue, ...best.clues], header, preview, problems };
}

type Found = Omit<Detection, 'header' | 'preview' | 'problems'> & { problems?: ImportProblem[] };

function pick(a: Found | null, b: Found | null): Found | null {
  if (a && b) return a.confidence >= b.confidence ? a : b;
  return a ?? b;
}

function detectJson(fileName: string, head: string): Detection {
  const objects: Record<string, unknown>[] = [];
  const problems: ImportProblem[] = [];
  const splitter = new JsonObjectSplitter(
    (text) => {
      if (objects.length >= SAMPLE_ROWS) return;
      try {
        const o = JSON.parse(text);
        if (o && typeof o === 'object' && !Array.isArray(o)) objects.push(o);
      } catch {
        /* a broken object in the head: the import reports it with its line */
      }
    },
    () => {},
  );
  splitter.push(head);
  const isArray = head[0] === '[';
  const wrapped = !isArray && /^\{[^\n]*\n/.test(head) && !/^\{[^\n]*\}\s*\n/.test(head);
  const baseClue = isArray ? 'JSON array of objects' : wrapped ? 'JSON object holding an array of records' : 'JSON objects, one per line';
  const header = [...new Set(objects.flatMap((o) => Object.keys(o)))];
  const preview = objects.slice(0, PREVIEW_ROWS).map((o) => header.map((h) => cell(o[h])));
  if (!objects.length) return unknown(fileName, header, preview, [baseClue, 'no complete object in the first part']);
  const tracking = isArray || wrapped ? null : detectTrackingJsonl(objects);
  const rows = objects.map((o) => Object.fromEntries(header.map((h) => [h, cell(o[h])])));
  const events = detectEvents(fileName, header, rows, 'json');
  const best = pick(tracking, events);
  if (!best) return unknown(fileName, header, preview, [baseClue, `fields: ${header.slice(0, 12).join(', ')}`]);
  return { ...best, clues: [baseClue, ...best.clues], header, preview, problems: [...problems, ...(best.problems ?? [])] };
}

function cell(v: unknown): string {
  if (v === null || v === undefined) return '';
  if (typeof v === 'object') return JSON.stringify(v).slice(0, 80);
  return String(v);
}
