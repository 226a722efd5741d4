/**
 * Small grey frames of a footage file for the cut detector: ffmpeg decodes the video and
 * scales every frame to 64 × 36 luma (area averaging), one frame out per frame in, in
 * presentation order. Native ffmpeg streams them from stdout; the embedded ffmpeg.wasm
 * core runs in a worker thread over the file mounted in place (the same worker the audio
 * decode uses: it only moves bytes). Memory stays flat over a 90-minute file.
 *
 * Deblocking is NOT skipped (`-skip_loop_filter all` would save ~10 % of the decode) because
 * without it every keyframe "pops" against the frame before: on the demo footage the
 * largest non-cut score rose from 0.03 to 0.12, next to the weakest real cut's 0.15.
 */
import { spawn } from 'node:child_process';
import { Worker } from 'node:worker_threads';
import { compiledCoreModule } from '../audio/embedded-core.ts';
import { findNativeFfmpeg } from '../audio/decode-native.ts';
import type { DecodeEngine } from '../audio/decode-types.ts';

export { CUT_FRAME_HEIGHT, CUT_FRAME_WIDTH, lumaFrameArgs } from '../../../engine/cuts/decode-args.ts';

export interface RawDecodeOptions {
  onBytes: (bytes: Uint8Array) => void;
  signal?: AbortSignal;
}

export function pickEngine(engine: DecodeEngine | 'auto' | undefined): DecodeEngine {
  if (engine === 'native' || engine === 'embedded') return engine;
  return findNativeFfmpeg() ? 'native' : 'embedded';
}

/** Runs ffmpeg with `args` ('{input}'/'{output}' placeholders) and streams the output bytes. */
export async function decodeRaw(file: string, args: string[], engine: DecodeEngine, opts: RawDecodeOptions): Promise<void> {
  return engine === 'native' ? decodeRawNative(file, args, opts) : decodeRawEmbedded(file, args, opts);
}

function cancelled(signal: AbortSignal): unknown {
  return signal.reason ?? Object.assign(new Error('frame decode cancelled'), { name: 'AbortError' });
}

function failure(file: string, engine: DecodeEngine, log: string[]): Error {
  const text = log.join('\n');
  const last = log.filter((l) => l.trim()).slice(-1)[0]?.trim() ?? 'no message';
  if (/matches no streams|does not contain any stream/.test(text)) return new Error(`${file}: the file has no video track, so there are no cuts to find. Choose a footage file with picture.`);
  if (/No such file or directory/.test(text)) return new Error(`${file}: file not found. Check the path.`);
  if (/Invalid data found|moov atom not found|could not find codec/i.test(text)) {
    return new Error(`${file}: not a video ffmpeg can read, or it is damaged (${engine} decoder said: ${last}). Check the file plays.`);
  }
  return new Error(`${file}: video decode failed (${engine} ffmpeg): ${last}`);
}

function decodeRawNative(file: string, args: string[], opts: RawDecodeOptions): Promise<void> {
  const exe = findNativeFfmpeg();
  if (!exe) return Promise.reject(new Error("no native ffmpeg on PATH; install Debian's ffmpeg or use the embedded decoder (--embedded)"));
  const { signal } = opts;
  return new Promise((resolve, reject) => {
    if (signal?.aborted) return reject(cancelled(signal));
    const real = args.map((a) => (a === '{input}' ? file : a === '{output}' ? 'pipe:1' : a));
    const child = spawn(exe, ['-hide_banner', '-nostdin', '-v', 'error', ...real], { stdio: ['ignore', 'pipe', 'pipe'] });
    const log: string[] = [];
    let failed: unknown = null;
    const onAbort = () => {
      failed ??= cancelled(signal!);
      child.kill('SIGKILL');
    };
    signal?.addEventListener('abort', onAbort, { once: true });
    child.stdout.on('data', (b: Buffer) => {
      if (failed) return;
      try {
        opts.onBytes(new Uint8Array(b.buffer, b.byteOffset, b.byteLength));
      } catch (err) {
        failed = err;
        child.kill('SIGKILL');
      }
    });
    child.stderr.setEncoding('utf8').on('data', (t: string) => log.push(...t.split('\n')));
    child.on('error', reject);
    child.on('close', (code) => {
      signal?.removeEventListener('abort', onAbort);
      if (failed) return reject(failed);
      if (code !== 0) return reject(failure(file, 'native', log));
      resolve();
    });
  });
}

const workerUrl = new URL('../audio/pcm-worker.mjs', import.meta.url);

type WorkerMessage = { type: 'pcm'; bytes: ArrayBuffer } | { type: 'done'; code: number; log: string[] } | { type: 'failed'; message: string };

async function decodeRawEmbedded(file: string, args: string[], opts: RawDecodeOptions): Promise<void> {
  const { signal } = opts;
  if (signal?.aborted) throw cancelled(signal);
  const wasmModule = await compiledCoreModule();
  const worker = new Worker(workerUrl, { workerData: { file, args, input: 'mount', wasmModule } });
  return new Promise<void>((resolve, reject) => {
    let settled = false;
    const finish = (err: unknown) => {
      if (settled) return;
      settled = true;
      signal?.removeEventListener('abort', onAbort);
      void worker.terminate();
      if (err) reject(err);
      else resolve();
    };
    const onAbort = () => finish(cancelled(signal!));
    signal?.addEventListener('abort', onAbort, { once: true });
    worker.on('message', (m: WorkerMessage) => {
      if (settled) return;
      if (m.type === 'pcm') {
        try {
          opts.onBytes(new Uint8Array(m.bytes));
        } catch (err) {
          finish(err);
        }
        if (signal?.aborted) finish(cancelled(signal));
      } else if (m.type === 'done') {
        finish(m.code === 0 ? null : failure(file, 'embedded', m.log));
      } else {
        finish(new Error(`${file}: the embedded ffmpeg stopped: ${m.message}`));
      }
    });
    worker.once('error', (e) => finish(new Error(`${file}: the embedded ffmpeg worker failed: ${e.message}`)));
    worker.once('exit', (code) => finish(new Error(`${file}: the embedded ffmpeg worker stopped (exit code ${code}) before finishing`)));
  });
}
