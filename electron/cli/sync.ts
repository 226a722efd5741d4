/**
 * `whistlemark sync --events FILE --tracking FILE [--map MAPPING.json] --out DIR`
 * `whistlemark sync TRACKING EVENTS [FOOTAGE] --project OUT.wmatch [--replace]`: puts the
 * event log on the tracking clock with no hint (engine/sync.ts) and writes
 * DIR/fit.json and DIR/events.corrected.csv, plus a summary on stdout. Both files are
 * written to temporary names first and renamed only when both are complete, so a
 * failure never leaves half an answer behind. With --project it writes a whole match
 * project file (engine/project-file) the app opens for review, atomically.
 */
import { mkdir, readFile, rename, rm, stat, writeFile } from 'node:fs/promises';
import { basename, join } from 'node:path';
import type { CliCommand } from '../cli.ts';
import type { ClockFit, EventLog, ProposedCorrection } from '../../shared-types/domain.ts';
import type { EventMapping, ImportProblem, ImportResult, TrackingMapping } from '../../shared-types/import.ts';
import { detectSource, importEvents, importTracking } from '../../engine/import/index.ts';
import { syncMatch, type SyncResult } from '../../engine/sync.ts';
import { readHead, readTextChunks } from '../host/text-stream.ts';
import { open as openFile } from 'node:fs/promises';
import { dirname, resolve } from 'node:path';
import { createHash } from 'node:crypto';
import { FILE_EXTENSION, MIB, writeProjectFile, type FootageReference } from '../../engine/project-file/index.ts';
import { matchTables } from '../../engine/project-file/match-tables.ts';
import { saveAtomic } from '../host/atomic-save.ts';
import { probeFootageFile } from '../host/footage/probe.ts';

const usage = `usage: whistlemark sync --events FILE --tracking FILE [--map MAPPING.json] --out DIR
       whistlemark sync TRACKING EVENTS [FOOTAGE] [--map MAPPING.json] --project OUT.wmatch [--replace]

Finds restarts in both sources, the clock offset and drift of the event log against the
tracking (per period, split at clock jumps), and a proposed time (and, for restarts,
place) for every logged event.
  --events FILE     the event log (CSV or JSON)
  --tracking FILE   the tracking file (CSV long or wide, or JSON Lines)
  --map FILE        JSON { "tracking"?: mapping, "events"?: mapping } overriding detection
  --out DIR         where fit.json and events.corrected.csv are written (created if needed)
  --project FILE    write a match project file (.wmatch) the app opens for review:
                    sources, tracking, events, anchors, the clock fit and the proposals
  --replace         replace an existing project file (otherwise it is left alone)
Files may also be named in order: TRACKING EVENTS [FOOTAGE].`;

/** A failure the analyst can act on: printed as is, exit code 1. */
class UserError extends Error {}

export const command: CliCommand = {
  summary: 'align an event log to tracking: clock fit and proposed event corrections',
  usage,
  async run(args) {
    let opts: SyncArgs;
    try {
      opts = parseArgs(args);
    } catch (e) {
      console.error(`whistlemark sync: ${(e as Error).message}\n\n${usage}`);
      return 2;
    }
    try {
      const mapping = opts.map ? await readMapping(opts.map) : {};
      const tracking = await load(opts.tracking, 'tracking', mapping.tracking, importTracking);
      const events = await load(opts.events, 'events', mapping.events, importEvents);
      const result = syncMatch(tracking, events);
      if (opts.out) {
        await writeOutputs(opts.out, result, events, tracking.rate);
        console.log(summary(result, events, opts.out));
      }
      if (opts.project) {
        const written = await writeProject(opts, tracking, events, result, mapping);
        console.log(`${opts.out ? '' : summary(result, events, '').replace(/\nwrote .*$/, '') + '\n'}wrote ${written.path} (${(written.bytesWritten / MIB).toFixed(1)} MiB): open it in Whistlemark with Project ▸ Open match project.`);
      }
      return 0;
    } catch (e) {
      if (e instanceof UserError) {
        console.error(`whistlemark sync: ${e.message}`);
        return 1;
      }
      throw e;
    }
  },
};

interface SyncArgs {
  events: string;
  tracking: string;
  footage?: string;
  map?: string;
  out?: string;
  project?: string;
  replace?: boolean;
}

function parseArgs(args: string[]): SyncArgs {
  const out: Record<string, string | boolean> = {};
  const positional: string[] = [];
  for (let i = 0; i < args.length; i++) {
    const a = args[i];
    if (a === '--replace') {
      out.replace = true;
      continue;
    }
    if (!a.startsWith('--')) {
      positional.push(a);
      continue;
    }
    if (!['--events', '--tracking', '--footage', '--map', '--out', '--project'].includes(a)) throw new Error(`unknown argument "${a}"`);
    const v = args[i + 1];
    if (v === undefined || v.startsWith('--')) throw new Error(`${a} needs a value`);
    out[a.slice(2)] = v;
    i++;
  }
  if (positional.length > 3) throw new Error(`too many file names (${positional.join(', ')}); give TRACKING EVENTS [FOOTAGE]`);
  for (const [i, key] of (['tracking', 'events', 'footage'] as const).entries()) {
    if (positional[i] === undefined) continue;
    if (out[key]) throw new Error(`the ${key} file is named twice (--${key} and in order)`);
    out[key] = positional[i];
  }
  for (const need of ['events', 'tracking']) if (!out[need]) throw new Error(`--${need} is required`);
  if (!out.out && !out.project) throw new Error('--out DIR or --project FILE is required');
  if (out.footage && !out.project) throw new Error('FOOTAGE is only used with --project');
  return out as unknown as SyncArgs;
}

async function readMapping(path: string): Promise<{ tracking?: TrackingMapping; events?: EventMapping }> {
  const text = await readFile(path, 'utf8').catch((e: NodeJS.ErrnoException) => {
    throw new UserError(`cannot read the mapping file ${path}: ${e.code === 'ENOENT' ? 'no such file' : e.message}.`);
  });
  let json: unknown;
  try {
    json = JSON.parse(text);
  } catch (e) {
    // JSON.parse names a position; turn it into line and column for the analyst.
    const pos = Number(/position (\d+)/.exec((e as Error).message)?.[1]);
    const where = Number.isFinite(pos) ? `, line ${text.slice(0, pos).split('\n').length}, column ${pos - text.lastIndexOf('\n', pos - 1)}` : '';
    throw new UserError(`${path}${where}: not valid JSON (${(e as Error).message}). Fix the file; it should look like { "events": { "kind": "events", ... } }.`);
  }
  if (typeof json !== 'object' || json === null || Array.isArray(json))
    throw new UserError(`${path}: expected an object with "tracking" and/or "events" mappings.`);
  const m = json as Record<string, unknown>;
  for (const key of Object.keys(m)) if (key !== 'tracking' && key !== 'events') throw new UserError(`${path}: unknown key "${key}"; only "tracking" and "events" are read.`);
  for (const key of ['tracking', 'events'] as const) {
    const v = m[key] as { kind?: string } | undefined;
    if (v !== undefined && (typeof v !== 'object' || v?.kind !== key))
      throw new UserError(`${path}: "${key}" must be a ${key} mapping with "kind": "${key}" (as shown by "whistlemark inspect --json").`);
  }
  return m as { tracking?: TrackingMapping; events?: EventMapping };
}

async function load<M, T>(path: string, kind: 'tracking' | 'events', override: M | undefined,
  importer: (chunks: AsyncIterable<string>, o: { fileName: string; mapping: M; bytesTotal?: number }) => Promise<ImportResult<T>>): Promise<T> {
  const info = await stat(path).catch((e: NodeJS.ErrnoException) => {
    throw new UserError(`cannot read the ${kind} file ${path}: ${e.code === 'ENOENT' ? 'no such file' : e.message}. Check the path.`);
  });
  if (!info.isFile()) throw new UserError(`${path} is not a file. Name the ${kind} file.`);
  const name = basename(path);
  let mapping = override;
  if (!mapping) {
    const d = detectSource(name, await readHead(path));
    if (d.kind !== kind || !d.mapping) {
      const seen = d.kind === 'unknown' ? 'could not tell what it is' : `it looks like ${d.kind}, not ${kind}`;
      const clues = d.clues.length ? ` Clues: ${d.clues.join('; ')}.` : '';
      const problems = d.problems.length ? `\n${d.problems.map(formatProblem).join('\n')}` : '';
      throw new UserError(`${path}: ${seen}.${clues} Check that --${kind} names the right file, or describe its columns in a mapping file (--map; "whistlemark inspect --json ${path}" shows the detected mapping to start from).${problems}`);
    }
    mapping = d.mapping as M;
  }
  const result = await importer(readTextChunks(path), { fileName: name, mapping, bytesTotal: info.size });
  if (!result.ok || !result.data) {
    const errors = result.problems.filter((p) => p.severity === 'error');
    throw new UserError(`${path}: the ${kind} import failed with ${errors.length} error(s); nothing was written.\n${(errors.length ? errors : result.problems).slice(0, 20).map(formatProblem).join('\n')}`);
  }
  return result.data;
}

function formatProblem(p: ImportProblem): string {
  const where = [p.file, p.line !== undefined ? `line ${p.line}` : '', p.column ? `column ${p.column}` : '', p.time ?? ''].filter(Boolean).join(', ');
  return `  ${p.severity === 'error' ? 'ERROR' : 'warn '} ${where}: ${p.message}${p.hint ? ` (${p.hint})` : ''}`;
}

// ---------------------------------------------------------------------------------------
// Outputs

const r = (v: number, d: number) => (Number.isFinite(v) ? Number(v.toFixed(d)) : null);

export function fitJson(fit: ClockFit, result: SyncResult) {
  return {
    source: fit.source,
    reference: 'tracking',
    model: 't_tracking = offset_s + rate * t_events (seconds since each period start)',
    method: fit.method,
    periods: [...new Set(fit.segments.map((s) => s.period))].map((period) => {
      const coarse = result.coarse.find((c) => c.period === period);
      return {
        period,
        coarse: coarse ? { offset_s: r(coarse.offset, 3), margin: r(coarse.margin, 3), pairs: coarse.pairs.length, note: coarse.note } : null,
        segments: fit.segments.filter((s) => s.period === period).map((s) => ({
          from_s: r(s.fromT, 3), to_s: r(s.toT, 3),
          offset_s: r(s.offset, 4), rate: r(s.rate, 9), drift_ppm: r(s.driftPpm, 1),
          offset_se_s: r(s.offsetSe, 4), rate_se: r(s.rateSe, 9), drift_se_ppm: r(s.rateSe * 1e6, 1),
          rms_residual_s: r(s.rmsResidual, 4), leave_one_out_max_s: r(s.leaveOneOutMax, 4),
          anchors_used: s.points.filter((p) => p.used).length,
          anchors_rejected: s.points.filter((p) => !p.used).length,
          anchors: s.points.map((p) => ({
            id: p.anchorId, kind: p.kind, t_events_s: r(p.t, 3), t_tracking_s: r(p.tRef, 3), residual_s: r(p.residual, 3),
            used: p.used, ...(p.rejectedBecause ? { rejected_because: p.rejectedBecause } : {}),
          })),
        })),
      };
    }),
  };
}

const NEW_COLUMNS = ['tracking_period', 'tracking_frame', 'tracking_time_s', 'corrected_x', 'corrected_y', 'change', 'confidence', 'reason'];

/** RFC 4180 quoting: fields with a comma, quote or line break are quoted, quotes doubled. */
const csvField = (s: string) => (/[",\r\n]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s);

export function correctedCsv(log: EventLog, corrections: ProposedCorrection[]): string {
  const cols = log.columns.filter((c) => !NEW_COLUMNS.includes(c));
  const lines = [[...cols, ...NEW_COLUMNS].map(csvField).join(',')];
  log.events.forEach((e, i) => {
    const c = corrections[i];
    const num = (v: number | undefined, d: number) => (v === undefined || !Number.isFinite(v) ? '' : v.toFixed(d));
    lines.push([
      ...cols.map((k) => e.raw[k] ?? ''),
      String(c.trackingPeriod), Number.isFinite(c.trackingFrame) ? String(c.trackingFrame) : '', num(c.trackingTime, 3),
      num(c.x, 2), num(c.y, 2), c.change, c.confidence.toFixed(2), c.reason,
    ].map(csvField).join(','));
  });
  return lines.join('\n') + '\n';
}

async function writeOutputs(dir: string, result: SyncResult, log: EventLog, _rate: number): Promise<void> {
  await mkdir(dir, { recursive: true }).catch((e: Error) => {
    throw new UserError(`cannot create the output folder ${dir}: ${e.message}.`);
  });
  const files = [
    { name: 'fit.json', text: JSON.stringify(fitJson(result.fit, result), null, 1) + '\n' },
    { name: 'events.corrected.csv', text: correctedCsv(log, result.corrections) },
  ];
  const tag = `.tmp-${process.pid}-${Date.now()}`;
  try {
    for (const f of files) await writeFile(join(dir, f.name + tag), f.text);
    for (const f of files) await rename(join(dir, f.name + tag), join(dir, f.name));
  } catch (e) {
    for (const f of files) await rm(join(dir, f.name + tag), { force: true });
    throw new UserError(`could not write into ${dir}: ${(e as Error).message}. Nothing was replaced.`);
  }
}

/** Size + SHA-256 of the first and last MiB (the app checks the same when it opens the project). */
async function fingerprint(path: string, size: number) {
  const h = await openFile(path, 'r');
  try {
    const read = async (pos: number) => {
      const len = Math.min(MIB, size - pos);
      const buf = Buffer.alloc(Math.max(0, len));
      if (len > 0) await h.read(buf, 0, len, pos);
      return createHash('sha256').update(buf).digest('hex');
    };
    return { size, headSha256: await read(0), tailSha256: await read(Math.max(0, size - MIB)) };
  } finally {
    await h.close();
  }
}

async function fileInfo(path: string, mapping?: unknown) {
  const abs = resolve(path);
  const s = await stat(abs);
  return { fileName: basename(abs), path: abs, size: s.size, mtimeMs: s.mtimeMs, ...(mapping ? { mapping } : {}) };
}

async function writeProject(opts: SyncArgs, tracking: Awaited<ReturnType<typeof importTracking>>['data'] & object, events: EventLog, result: SyncResult, mapping: { tracking?: TrackingMapping; events?: EventMapping }) {
  const target = resolve(opts.project!);
  const name = basename(target).endsWith(FILE_EXTENSION) ? basename(target) : basename(target) + FILE_EXTENSION;
  const footageRefs: FootageReference[] = [];
  let footage;
  if (opts.footage) {
    const info = await stat(opts.footage).catch(() => null);
    if (!info?.isFile()) throw new UserError(`cannot read the footage file ${opts.footage}: no such file. Check the path.`);
    const probe = await probeFootageFile(resolve(opts.footage)).catch((e: Error) => {
      throw new UserError(`${opts.footage}: cannot read it as footage (${e.message}).`);
    });
    footage = { ...(await fileInfo(opts.footage)), probe };
    footageRefs.push({ sourceId: 3, path: footage.path, fileName: footage.fileName, fingerprint: await fingerprint(footage.path, footage.size) });
  }
  const title = `${Object.values(events.teams).filter(Boolean).join(' v ') || basename(opts.events)}`;
  const tables = matchTables({
    title,
    user: process.env.USER ?? 'analyst',
    tracking,
    events,
    sync: result,
    files: { tracking: await fileInfo(opts.tracking, mapping.tracking), events: await fileInfo(opts.events, mapping.events), ...(footage ? { footage } : {}) },
  });
  if (footage) {
    // The Sources screen's footage summary, from the probe.
    const src = tables.sources.find((s) => s.kind === 'footage')!;
    const p = footage.probe;
    src.summary = {
      duration: p.duration, rate: p.measuredFps || p.nominalFps, frames: p.frameCount, periods: [],
      footage: { container: p.container, videoCodec: p.videoCodec, ...(p.audioCodec ? { audioCodec: p.audioCodec } : {}), width: p.width, height: p.height, nominalFps: p.nominalFps, measuredFps: p.measuredFps, variableRate: p.variableRate, frameCount: p.frameCount, startTime: p.startTime },
    };
  }
  const bytes = await writeProjectFile(tables, { writtenBy: 'whistlemark sync (command line)', databaseVersion: 3, footage: footageRefs });
  try {
    return await saveAtomic({ directory: dirname(target), name, bytes, overwrite: opts.replace === true });
  } catch (e) {
    throw new UserError(`${(e as Error).message}${/already exists/.test((e as Error).message) ? ' (add --replace to replace it)' : ''}`);
  }
}

function summary(result: SyncResult, log: EventLog, dir: string): string {
  const lines: string[] = [];
  lines.push('period  segment            offset_s      drift_ppm        rms_s  anchors (used/rejected)  coarse margin');
  for (const s of result.fit.segments) {
    const c = result.coarse.find((m) => m.period === s.period);
    const used = s.points.filter((p) => p.used).length;
    lines.push([
      String(s.period).padEnd(7),
      `${s.fromT.toFixed(0)}-${s.toT.toFixed(0)} s`.padEnd(18),
      `${s.offset.toFixed(3)} ±${Number.isFinite(s.offsetSe) ? s.offsetSe.toFixed(3) : '?'}`.padEnd(13),
      `${s.driftPpm.toFixed(0)} ±${Number.isFinite(s.rateSe) ? (s.rateSe * 1e6).toFixed(0) : '?'}`.padEnd(16),
      (Number.isFinite(s.rmsResidual) ? s.rmsResidual.toFixed(3) : '-').padEnd(6),
      `${used}/${s.points.length - used}`.padEnd(24),
      c ? c.margin.toFixed(2) : 'none (no restarts paired: clocks left as they are)',
    ].join(' '));
  }
  const counts: Record<string, number> = {};
  for (const c of result.corrections) counts[c.change] = (counts[c.change] ?? 0) + 1;
  const unplaced = result.corrections.filter((c) => !c.placed).length;
  lines.push('');
  lines.push(`${log.events.length} events: ${Object.entries(counts).map(([k, v]) => `${v} ${k}`).join(', ')}; ${unplaced} kept at the logged time.`);
  lines.push(`restarts seen in tracking: ${result.trackingAnchors.filter((a) => a.kind !== 'period_start' && a.kind !== 'period_end').length}; in the log: ${result.eventAnchors.filter((a) => a.kind !== 'period_start' && a.kind !== 'period_end').length}.`);
  lines.push(`wrote ${join(dir, 'fit.json')} and ${join(dir, 'events.corrected.csv')}`);
  return lines.join('\n');
}
