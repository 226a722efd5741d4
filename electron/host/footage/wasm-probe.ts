/**
 * Probe for containers mp4box cannot read (Matroska/WebM, MPEG-TS and anything else
 * ffmpeg knows), through the single-thread ffmpeg.wasm core (@ffmpeg/core) in a worker
 * thread. One pass: `-c copy -f framecrc` lists every video packet's pts and key flag
 * without decoding, and ffmpeg's own input summary gives codecs, size and audio.
 * Chosen over a hand-written Matroska/TS demuxer: ffmpeg is the reference the tests
 * compare against, and the core is already a dependency for export.
 */
import { readFile } from 'node:fs/promises';
import { createRequire } from 'node:module';
import { Worker } from 'node:worker_threads';
import type { FootageProbe } from '../../../shared-types/domain.ts';
import { frameTable } from './frame-table.ts';
import { parseFramecrc, parseInputSummary } from './ffmpeg-log.ts';

interface WorkerResult {
  code: number;
  log: string[];
  output: string | null;
  /** The output file's bytes, when asked for with `{ binary: true }`. */
  binary?: Uint8Array | null;
}

const workerUrl = new URL('./wasm-ffmpeg-worker.mjs', import.meta.url);
const require = createRequire(import.meta.url);

/** The ffmpeg core compiled once per process; workers instantiate it (no recompiling). */
let compiled: Promise<WebAssembly.Module> | undefined;
function coreModule(): Promise<WebAssembly.Module> {
  compiled ??= readFile(require.resolve('@ffmpeg/core').replace(/ffmpeg-core\.js$/, 'ffmpeg-core.wasm')).then((bytes) =>
    WebAssembly.compile(bytes),
  );
  compiled.catch(() => (compiled = undefined));
  return compiled;
}

/** Runs ffmpeg (wasm) on one file; `{input}` in args stands for the mounted file. */
export async function runWasmFfmpeg(inputPath: string, args: string[], outputName?: string, opts: { binary?: boolean } = {}): Promise<WorkerResult> {
  const wasmModule = await coreModule();
  return new Promise((resolve, reject) => {
    const worker = new Worker(workerUrl, { workerData: { inputPath, args, outputName, outputBinary: Boolean(opts.binary), wasmModule } });
    let settled = false;
    worker.once('message', (m: { ok: boolean; result?: WorkerResult; error?: string }) => {
      settled = true;
      void worker.terminate();
      if (m.ok && m.result) resolve(m.result);
      else reject(new Error(`ffmpeg.wasm failed: ${m.error}`));
    });
    worker.once('error', (e) => {
      settled = true;
      reject(e);
    });
    worker.once('exit', (code) => {
      if (!settled) reject(new Error(`ffmpeg.wasm worker stopped (exit code ${code})`));
    });
  });
}

export async function probeWithWasm(path: string): Promise<FootageProbe> {
  const out = '/frames.crc';
  const { log, output } = await runWasmFfmpeg(
    path,
    ['-hide_banner', '-nostats', '-copyts', '-i', '{input}', '-map', '0:v:0', '-c', 'copy', '-f', 'framecrc', out],
    out,
  );
  const stderr = log.filter((l) => l.startsWith('E ')).map((l) => l.slice(2));
  let summary;
  try {
    summary = parseInputSummary(stderr);
  } catch (e) {
    const hint = stderr.filter((l) => /Invalid data|error|No such/i.test(l)).slice(-2).join(' / ');
    throw new Error(`${path}: ${(e as Error).message}${hint ? ` (${hint})` : ''}; is this a video file?`);
  }
  if (!summary.video) throw new Error(`${path}: the file has no video stream`);
  if (!output) throw new Error(`${path}: ffmpeg could not list the video frames (${stderr.slice(-1)[0] ?? 'no message'})`);
  const { timebase, frames } = parseFramecrc(output);
  if (frames.length === 0) throw new Error(`${path}: the video stream has no frames`);
  const table = frameTable(frames, timebase);
  const duration = table.pts[table.pts.length - 1] + (table.medianInterval || 0);
  return {
    container: summary.container,
    videoCodec: summary.video.codec,
    audioCodec: summary.audio?.codec,
    width: summary.video.width,
    height: summary.video.height,
    startTime: table.startTime,
    duration,
    nominalFps: table.nominalFps,
    measuredFps: table.measuredFps,
    variableRate: table.variableRate,
    frameCount: table.pts.length,
    pts: table.pts,
    keyframes: table.keyframes,
    hasAudio: Boolean(summary.audio),
    audioSampleRate: summary.audio?.sampleRate,
    audioChannels: summary.audio?.channels,
  };
}
