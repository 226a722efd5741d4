/**
 * "Find candidates": scans a footage source's sound for whistles and its picture for cuts
 * in a worker (scan.worker.ts, the embedded ffmpeg core reading the file in place),
 * proposes non-live stretches from them, and stores all of it as one undoable step
 * (store-candidates.ts). Idempotent: a second run replaces what the first detected.
 * Progress is reported as it goes; the signal cancels (the worker is stopped, nothing is
 * stored).
 *
 *   const ctl = new AbortController();
 *   const r = await scanFootage(db, projectId, footageSourceId, { onProgress: (p) => bar(p.fraction), signal: ctl.signal });
 *   // r.stored → { whistles: 15, cuts: 5, proposals: 3, keptTouched: 0 }
 */
import { proposeNonLive, type CutCandidate } from '../../../engine/cuts/index.ts';
import type { WhistleCandidate } from '../../../engine/audio/index.ts';
import type { HostApi, OpenedFile } from '../../../shared-types/index.ts';
import type { WhistlemarkDb } from '../db/database.ts';
import { fileUrl, getHost } from '../host/index.ts';
import type { ScanMessage, ScanPhase, ScanRequest } from './protocol.ts';
import { lastScan, storeCandidates, type StoreSummary } from './store-candidates.ts';

export interface ScanProgress {
  phase: ScanPhase | 'storing';
  /** 0..1 over the whole scan (sound is quick; the picture takes most of the time). */
  fraction: number;
  /** Words for the progress bar, e.g. "Picture: frame 5 200 of 11 640, 3 cuts". */
  message: string;
}

export interface ScanFootageOptions {
  onProgress?: (p: ScanProgress) => void;
  signal?: AbortSignal;
  /** Who is scanning (the audit trail); default: the host's user name. */
  user?: string;
  /** The opened file to read; default: the source's path opened again through the host. */
  file?: OpenedFile;
  host?: HostApi;
}

export interface ScanFootageResult {
  stored: StoreSummary;
  whistles: WhistleCandidate[];
  cuts: CutCandidate[];
  timings: { soundMs: number; pictureMs: number; frames: number; soundSeconds: number; requests: number; bytesFetched: number };
}

/** Share of the progress bar the sound takes (it decodes ~10× faster than the picture). */
const SOUND_SHARE = 0.15;

export async function scanFootage(db: WhistlemarkDb, projectId: number, footageSourceId: number, opts: ScanFootageOptions = {}): Promise<ScanFootageResult> {
  const { onProgress, signal } = opts;
  signal?.throwIfAborted();
  const source = await db.sources.get(footageSourceId);
  if (!source || source.projectId !== projectId || source.kind !== 'footage') {
    throw new Error(`Source ${footageSourceId} is not a footage file of this project; choose the footage on the Sources screen.`);
  }
  const footage = await db.footage.get(footageSourceId);
  if (!footage) throw new Error(`${source.fileName}: the footage probe is missing; import the footage again on the Sources screen.`);
  const host = opts.host ?? getHost();
  const file = opts.file ?? (await host.openPaths([source.path]))[0];
  if (!file) throw new Error(`${source.fileName}: could not open ${source.path}; was it moved or renamed? Relink it on the Sources screen.`);
  if (file.size !== source.size) {
    throw new Error(`${source.fileName}: the file on disk (${file.size} bytes) is not the one imported (${source.size} bytes); import it again so times stay right.`);
  }
  const user = opts.user ?? (await host.info()).userName;
  const probe = footage.probe;

  const request: ScanRequest = {
    type: 'scan',
    url: fileUrl(file),
    name: source.fileName,
    size: file.size,
    pts: probe.pts,
    fps: probe.nominalFps || probe.measuredFps,
    sound: probe.hasAudio,
    picture: true,
  };
  const found = await runWorker(request, onProgress, signal);
  signal?.throwIfAborted();
  onProgress?.({ phase: 'storing', fraction: 1, message: 'Storing the candidates…' });
  const proposals = proposeNonLive(found.cuts, found.whistles);
  const stored = await storeCandidates(db, { projectId, footageSourceId, fileName: source.fileName, user, results: { whistles: found.whistles, cuts: found.cuts, proposals } });
  return { stored, whistles: found.whistles, cuts: found.cuts, timings: found.timings };
}

/**
 * Runs the scan only when this footage source was never scanned (for the first open of
 * the Sync screen); resolves to undefined when it was.
 */
export async function scanFootageOnce(db: WhistlemarkDb, projectId: number, footageSourceId: number, opts: ScanFootageOptions = {}): Promise<ScanFootageResult | undefined> {
  if (await lastScan(db, footageSourceId)) return undefined;
  return scanFootage(db, projectId, footageSourceId, opts);
}

interface WorkerOutcome {
  whistles: WhistleCandidate[];
  cuts: CutCandidate[];
  timings: ScanFootageResult['timings'];
}

function runWorker(req: ScanRequest, onProgress: ScanFootageOptions['onProgress'], signal?: AbortSignal): Promise<WorkerOutcome> {
  const worker = new Worker(new URL('./scan.worker.ts', import.meta.url), { type: 'module', name: 'candidates' });
  const out: WorkerOutcome = { whistles: [], cuts: [], timings: { soundMs: 0, pictureMs: 0, frames: 0, soundSeconds: 0, requests: 0, bytesFetched: 0 } };
  const soundShare = req.sound ? SOUND_SHARE : 0;
  return new Promise((resolve, reject) => {
    const finish = (err?: unknown) => {
      signal?.removeEventListener('abort', onAbort);
      worker.terminate();
      if (err) reject(err);
      else resolve(out);
    };
    const onAbort = () => finish(signal!.reason ?? new DOMException('Scan cancelled', 'AbortError'));
    signal?.addEventListener('abort', onAbort, { once: true });
    worker.onerror = (e) => finish(new Error(`${req.name}: the scan worker failed: ${e.message || 'could not start'}`));
    worker.onmessage = (e: MessageEvent<ScanMessage>) => {
      const m = e.data;
      if (m.type === 'progress') {
        const part = m.total > 0 ? Math.min(1, m.done / m.total) : 0;
        const fraction = m.phase === 'loading' ? 0 : m.phase === 'sound' ? soundShare * part : soundShare + (1 - soundShare) * part;
        const message =
          m.phase === 'loading'
            ? 'Loading the decoder…'
            : m.phase === 'sound'
              ? `Sound: ${Math.round(m.done)} of ${Math.round(m.total)} s, ${m.found} whistle${m.found === 1 ? '' : 's'}`
              : `Picture: frame ${m.done.toLocaleString('en-GB')} of ${m.total.toLocaleString('en-GB')}, ${m.found} cut${m.found === 1 ? '' : 's'}`;
        onProgress?.({ phase: m.phase, fraction, message });
      } else if (m.type === 'whistles') {
        out.whistles = m.candidates;
        out.timings.soundMs = m.ms;
        out.timings.soundSeconds = m.seconds;
      } else if (m.type === 'cuts') {
        out.cuts = m.cuts;
        out.timings.pictureMs = m.ms;
        out.timings.frames = m.frames;
      } else if (m.type === 'done') {
        out.timings.requests = m.requests;
        out.timings.bytesFetched = m.bytesFetched;
        finish();
      } else if (m.type === 'failed') {
        finish(new Error(m.message));
      }
    };
    worker.postMessage(req);
  });
}
