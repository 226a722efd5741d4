/**
 * Event rows as plain string records, from CSV or JSON (array or JSON Lines), so the rest
 * of the event importer does not care which format the log came in.
 */
import { CsvTokenizer } from '../text/csv-tokenizer.ts';
import { JsonObjectSplitter } from '../text/json-objects.ts';

export interface RowSink {
  header(columns: string[]): void;
  row(raw: Record<string, string>, line: number, text: string): void;
  bad(line: number, text: string, reason: string): void;
}

export interface RowSource {
  push(chunk: string): void;
  end(): void;
}

export function csvRows(delimiter: string, sink: RowSink): RowSource {
  let header: string[] | null = null;
  const tok = new CsvTokenizer(delimiter, (rec) => {
    if (!header) {
      header = [];
      for (let i = 0; i < rec.count; i++) header.push(rec.field(i).trim());
      sink.header(header);
      return;
    }
    if (rec.unterminated) return sink.bad(rec.line, rec.text(), 'a quoted field is never closed');
    if (rec.count > header.length) return sink.bad(rec.line, rec.text(), `row has ${rec.count} fields, the header has ${header.length}`);
    const raw: Record<string, string> = {};
    for (let i = 0; i < header.length; i++) raw[header[i]] = i < rec.count ? rec.field(i) : '';
    sink.row(raw, rec.line, rec.text());
  });
  return { push: (c) => tok.push(c), end: () => tok.end() };
}

/** Values of JSON fields as text, as a CSV would have them. */
function asText(v: unknown): string {
  if (v === null || v === undefined) return '';
  if (typeof v === 'string') return v;
  if (typeof v === 'number' || typeof v === 'boolean') return String(v);
  return JSON.stringify(v);
}

export function jsonRows(sink: RowSink): RowSource {
  const columns: string[] = [];
  const seen = new Set<string>();
  let announced = false;
  const splitter = new JsonObjectSplitter(
    (text, line) => {
      let obj: unknown;
      try {
        obj = JSON.parse(text);
      } catch {
        return sink.bad(line, text.slice(0, 500), 'not valid JSON');
      }
      if (!obj || typeof obj !== 'object' || Array.isArray(obj)) return sink.bad(line, text.slice(0, 500), 'not a JSON object');
      const raw: Record<string, string> = {};
      for (const [k, v] of Object.entries(obj as Record<string, unknown>)) {
        raw[k] = asText(v);
        if (!seen.has(k)) {
          seen.add(k);
          columns.push(k);
        }
      }
      if (!announced) {
        announced = true;
        sink.header(columns);
      }
      sink.row(raw, line, text.slice(0, 500));
    },
    (line, what) => sink.bad(line, '', what),
  );
  return {
    push: (c) => splitter.push(c),
    end: () => {
      splitter.end();
      if (!announced) sink.header(columns);
    },
  };
}
