/**
 * HTTP byte ranges (RFC 9110 §14) for serving opened files to <video> and fetch():
 * one range per request (bytes=a-b, bytes=a-, bytes=-n), 206 with Content-Range,
 * 416 when nothing of the file is asked for. Several ranges in one header are answered
 * with the whole file (200), which RFC 9110 §14.2 allows; media elements never ask for
 * more than one. The body is a file stream from `start` to `end`, so seeking in a 3 GB
 * recording reads only the bytes asked for.
 *
 * Example: parseRange('bytes=-500', 10_000) → { kind: 'partial', start: 9500, end: 9999 }
 */
import { createReadStream, type ReadStream } from 'node:fs';

export type RangeResult =
  | { kind: 'full' }
  | { kind: 'partial'; start: number; end: number }
  | { kind: 'unsatisfiable' };

export function parseRange(header: string | null | undefined, size: number): RangeResult {
  if (!header) return { kind: 'full' };
  const m = header.trim().match(/^bytes\s*=\s*(.+)$/i);
  // An unknown range unit is ignored: serve the whole file (RFC 9110 §14.2).
  if (!m) return { kind: 'full' };
  const specs = m[1].split(',').map((s) => s.trim());
  if (specs.length !== 1) return { kind: 'full' };
  const spec = specs[0].match(/^(\d*)\s*-\s*(\d*)$/);
  if (!spec || (spec[1] === '' && spec[2] === '')) return { kind: 'full' };
  if (spec[1] === '') {
    // Suffix range: the last n bytes.
    const n = Number(spec[2]);
    if (n === 0 || size === 0) return { kind: 'unsatisfiable' };
    return { kind: 'partial', start: Math.max(0, size - n), end: size - 1 };
  }
  const start = Number(spec[1]);
  const last = spec[2] === '' ? size - 1 : Math.min(Number(spec[2]), size - 1);
  if (spec[2] !== '' && Number(spec[2]) < start) return { kind: 'full' }; // invalid: ignore
  if (start >= size) return { kind: 'unsatisfiable' };
  return { kind: 'partial', start, end: last };
}

export interface FileResponse {
  status: 200 | 206 | 416;
  headers: Record<string, string>;
  /** Absent for 416 and for HEAD requests. */
  body?: ReadStream;
}

/** Status, headers and body stream for one GET/HEAD of a file of `size` bytes. */
export function fileResponse(path: string, size: number, rangeHeader: string | null | undefined, contentType: string, head = false): FileResponse {
  const range = parseRange(rangeHeader, size);
  const base: Record<string, string> = { 'Accept-Ranges': 'bytes', 'Content-Type': contentType };
  if (range.kind === 'unsatisfiable') {
    return { status: 416, headers: { ...base, 'Content-Range': `bytes */${size}`, 'Content-Length': '0' } };
  }
  if (range.kind === 'partial') {
    const length = range.end - range.start + 1;
    return {
      status: 206,
      headers: { ...base, 'Content-Range': `bytes ${range.start}-${range.end}/${size}`, 'Content-Length': String(length) },
      body: head ? undefined : createReadStream(path, { start: range.start, end: range.end }),
    };
  }
  return {
    status: 200,
    headers: { ...base, 'Content-Length': String(size) },
    body: head || size === 0 ? undefined : createReadStream(path),
  };
}

/** Content types by extension for the media and data files the app opens. */
export function contentTypeFor(name: string): string {
  const ext = name.toLowerCase().split('.').pop() ?? '';
  const types: Record<string, string> = {
    mp4: 'video/mp4', m4v: 'video/mp4', mov: 'video/quicktime', webm: 'video/webm', mkv: 'video/x-matroska',
    ts: 'video/mp2t', m2t: 'video/mp2t', m2ts: 'video/mp2t', mts: 'video/mp2t',
    wav: 'audio/wav', m4a: 'audio/mp4', mp3: 'audio/mpeg', ogg: 'audio/ogg', opus: 'audio/ogg',
    csv: 'text/csv; charset=utf-8', tsv: 'text/tab-separated-values; charset=utf-8', txt: 'text/plain; charset=utf-8',
    json: 'application/json', xml: 'application/xml', jsonl: 'application/x-ndjson',
    png: 'image/png', jpg: 'image/jpeg', jpeg: 'image/jpeg',
  };
  return types[ext] ?? 'application/octet-stream';
}
