/**
 * `whistlemark inspect FILE`: what the importer makes of a file, from the same code the app
 * runs (detectSource on the head, then a full streaming import pass). Footage files are
 * probed instead (container, codecs, duration, frame rate, frame count).
 */
import { stat } from 'node:fs/promises';
import { basename, extname } from 'node:path';
import type { CliCommand } from '../cli.ts';
import type { FootageProbe } from '../../shared-types/domain.ts';
import type { Detection, EventMapping, ImportProblem, ImportResult, TrackingMapping } from '../../shared-types/import.ts';
import { detectSource, importEvents, importTracking } from '../../engine/import/index.ts';
import { readHead, readTextChunks } from '../host/text-stream.ts';

const FOOTAGE_EXTENSIONS = new Set(['.mp4', '.mov', '.mkv', '.webm', '.ts', '.m4v', '.mts']);

const usage = `usage: whistlemark inspect FILE [--json]

Shows what the importer detects in FILE (kind, layout, columns, units, origin, periods,
rate, problems) after a full import pass, or, for footage (.mp4 .mov .mkv .webm .ts),
the container, codecs, duration, frame rate and frame count.
  --json   print the detection and summary as JSON`;

export const command: CliCommand = {
  summary: 'show what the importer detects in a tracking, event or footage file',
  usage,
  async run(args) {
    const json = args.includes('--json');
    const files = args.filter((a) => !a.startsWith('--'));
    if (files.length !== 1) {
      console.error(usage);
      return 2;
    }
    const path = files[0];
    const info = await stat(path).catch((e: NodeJS.ErrnoException) => e);
    if (info instanceof Error) {
      console.error(`whistlemark inspect: cannot read ${path}: ${info.code === 'ENOENT' ? 'no such file' : info.message}. Check the path.`);
      return 1;
    }
    if (!info.isFile()) {
      console.error(`whistlemark inspect: ${path} is not a file. Name a tracking, event or footage file.`);
      return 1;
    }
    if (FOOTAGE_EXTENSIONS.has(extname(path).toLowerCase())) return inspectFootage(path, json);
    return inspectData(path, info.size, json);
  },
};

async function inspectFootage(path: string, json: boolean): Promise<number> {
  let probeFootageFile: (p: string) => Promise<FootageProbe>;
  try {
    // Loaded on demand: inspect still works for data files when the footage probe is missing.
    ({ probeFootageFile } = await import('../host/footage/probe.ts'));
  } catch (e) {
    console.error(`whistlemark inspect: the footage probe is not available (${(e as Error).message}).`);
    return 1;
  }
  let p: FootageProbe;
  try {
    p = await probeFootageFile(path);
  } catch (e) {
    console.error(`whistlemark inspect: cannot probe ${path}: ${(e as Error).message}`);
    return 1;
  }
  if (json) {
    const { pts, keyframes, ...rest } = p;
    console.log(JSON.stringify({ file: path, kind: 'footage', ...rest, keyframeCount: keyframes.length, firstPts: pts.slice(0, 5) }, null, 2));
    return 0;
  }
  const lines = [
    `file:        ${path}`,
    `kind:        footage`,
    `container:   ${p.container}`,
    `video:       ${p.videoCodec} ${p.width}x${p.height}`,
    `audio:       ${p.hasAudio ? `${p.audioCodec ?? '?'}${p.audioSampleRate ? ` ${p.audioSampleRate} Hz` : ''}${p.audioChannels ? ` ${p.audioChannels} ch` : ''}` : 'none'}`,
    `duration:    ${p.duration.toFixed(3)} s`,
    `start time:  ${p.startTime.toFixed(3)} s`,
    `frame rate:  ${p.nominalFps.toFixed(3)} fps nominal, ${p.measuredFps.toFixed(3)} fps measured`,
    `variable:    ${p.variableRate ? 'yes (VFR)' : 'no (constant frame rate)'}`,
    `frames:      ${p.frameCount} (${p.keyframes.length} keyframes)`,
  ];
  console.log(lines.join('\n'));
  return 0;
}

async function inspectData(path: string, size: number, json: boolean): Promise<number> {
  const name = basename(path);
  let head: string;
  try {
    head = await readHead(path);
  } catch (e) {
    console.error(`whistlemark inspect: cannot read ${path}: ${(e as Error).message}`);
    return 1;
  }
  const d = detectSource(name, head);
  let result: ImportResult<unknown> | null = null;
  let summary: string[] = [];
  if (d.mapping?.kind === 'tracking') {
    const r = await importTracking(readTextChunks(path), { fileName: name, mapping: d.mapping, bytesTotal: size });
    result = r;
    if (r.data) {
      const t = r.data;
      const players = t.objects.filter((o) => o.role === 'player');
      summary = [
        `objects:     ${t.objects.length} (${players.filter((o) => o.team === 'home').length} home, ${players.filter((o) => o.team === 'away').length} away, ${t.ballIndex >= 0 ? 'ball' : 'no ball'})`,
        `rate:        ${t.rate} Hz`,
        ...t.periods.map((p) => {
          const present = p.present.reduce((a, b) => a + b, 0);
          return `period ${p.period}:    frames ${p.firstFrame}..${p.firstFrame + p.frameCount - 1} (${(p.frameCount / t.rate / 60).toFixed(2)} min, ${p.frameCount - present} missing), home attacks ${p.homeAttacks === 'positive_x' ? '+x' : '-x'}`;
        }),
      ];
    }
  } else if (d.mapping?.kind === 'events') {
    const r = await importEvents(readTextChunks(path), { fileName: name, mapping: d.mapping, bytesTotal: size });
    result = r;
    if (r.data) {
      const byKind = new Map<string, number>();
      const byPeriod = new Map<number, number>();
      for (const e of r.data.events) {
        byKind.set(e.kind, (byKind.get(e.kind) ?? 0) + 1);
        byPeriod.set(e.period, (byPeriod.get(e.period) ?? 0) + 1);
      }
      summary = [
        `events:      ${r.data.events.length}`,
        `teams:       home = ${r.data.teams.home ?? '(home)'}, away = ${r.data.teams.away ?? '(away)'}`,
        `periods:     ${[...byPeriod].map(([p, n]) => `${p} (${n} events)`).join(', ')}`,
        `kinds:       ${[...byKind].sort((a, b) => b[1] - a[1]).map(([k, n]) => `${k} ${n}`).join(', ')}`,
      ];
    }
  }
  if (json) {
    console.log(JSON.stringify({ file: path, detection: { ...d, preview: d.preview.slice(0, 3) }, ok: result?.ok ?? false, rows: result?.rows, problems: result?.problems, rejectedRows: result?.rejectedRows.length }, null, 2));
  } else {
    const lines = [`file:        ${path}`, `kind:        ${d.kind} (confidence ${d.confidence.toFixed(2)})`, ...describeMapping(d)];
    lines.push('clues:', ...d.clues.map((c) => `  - ${c}`));
    if (result) lines.push(`import:      ${result.ok ? 'ok' : 'FAILED (nothing would be stored)'}, ${result.rows} rows read, ${result.rejectedRows.length} rows skipped`);
    lines.push(...summary);
    const problems = [...d.problems, ...(result?.problems ?? [])];
    lines.push(problems.length ? `problems (${problems.length}):` : 'problems:    none');
    lines.push(...problems.map(formatProblem));
    console.log(lines.join('\n'));
  }
  return d.kind !== 'unknown' && result?.ok ? 0 : 1;
}

function describeMapping(d: Detection): string[] {
  const m = d.mapping;
  if (!m) return [`columns:     ${d.header.join(', ') || '(none)'}`];
  const c = m.coordinates;
  const grid = c.gridLength && c.gridWidth ? `${c.gridLength} x ${c.gridWidth} grid` : c.unit;
  const coords = `coordinates: ${grid}, origin ${c.origin.replace('_', '-')}, y ${c.yDown ? 'down' : 'up'}, pitch ${c.pitch.length} x ${c.pitch.width} m`;
  if (m.kind === 'tracking') {
    const t = m as TrackingMapping;
    const cols = Object.entries(t.columns)
      .filter(([k, v]) => k !== 'objects' && v)
      .map(([k, v]) => `${k}=${v}`);
    if (t.columns.objects) cols.push(`${t.columns.objects.length} x/y pairs`);
    const periods = t.periods.from === 'column' ? `from column "${t.columns.period}"` : t.periods.from === 'gap' ? `from time gaps >= ${t.periods.minGapS} s` : `from frame ranges ${JSON.stringify(t.periods.ranges)}`;
    return [`layout:      ${t.layout}${t.delimiter ? ` (delimiter ${JSON.stringify(t.delimiter)})` : ''}`, `columns:     ${cols.join(', ')}`, coords, `periods:     ${periods}`, `rate:        ${t.rate ?? '?'} Hz (detected)`];
  }
  const e = m as EventMapping;
  const cols = Object.entries(e.columns).filter(([, v]) => v).map(([k, v]) => `${k}=${v}`);
  return [`format:      ${e.format}`, `columns:     ${cols.join(', ')}`, `clock:       ${e.clock.replace(/_/g, ' ')}`, coords];
}

function formatProblem(p: ImportProblem): string {
  const where = [p.file, p.line !== undefined ? `line ${p.line}` : '', p.column ? `column ${p.column}` : '', p.time ?? ''].filter(Boolean).join(', ');
  return `  ${p.severity === 'error' ? 'ERROR' : 'warn '} ${where}: ${p.message}${p.hint ? ` (${p.hint})` : ''}`;
}
