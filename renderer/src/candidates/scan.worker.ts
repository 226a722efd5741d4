/// <reference lib="webworker" />
/**
 * Scans one footage file for whistle and cut candidates inside the app, off the main
 * thread: the embedded ffmpeg core (single-thread, loaded from the app's own files) reads
 * the file in place through range requests (range-file.ts), decodes the sound to 16 kHz
 * mono and the picture to 64 × 36 grey, and streams both into the same detectors the
 * CLI uses (engine/audio, engine/cuts). ffmpeg's exec() blocks this thread until it ends,
 * so cancelling means terminating the worker (scan-footage.ts does).
 */
import coreUrl from '@ffmpeg/core?url';
import wasmUrl from '@ffmpeg/core/wasm?url';
import { WhistleDetector, type WhistleCandidate } from '../../../engine/audio/index.ts';
import { CUT_FRAME_HEIGHT, CUT_FRAME_WIDTH, CutDetector, FrameSplitter, lumaFrameArgs, ptsTimer, type CutCandidate } from '../../../engine/cuts/index.ts';
import type { ScanMessage, ScanRequest } from './protocol.ts';
import { RangeFile, rangeReader } from './range-file.ts';
import { SOUND_RATE, soundArgs } from './sound-args.ts';

declare const self: DedicatedWorkerGlobalScope;

/** The parts of the Emscripten module the scan uses. */
interface Core {
  FS: {
    mkdir(p: string): void;
    mount(type: unknown, opts: unknown, where: string): void;
    filesystems: { WORKERFS: { reader: unknown } };
    makedev(ma: number, mi: number): number;
    registerDevice(dev: number, ops: { open(): void; close(): void; write(s: unknown, buf: Int8Array | Uint8Array, off: number, len: number): number }): void;
    mkdev(p: string, dev: number): void;
  };
  setLogger(f: (e: { type: string; message: string }) => void): void;
  exec(...args: string[]): number;
  reset(): void;
}

const post = (m: ScanMessage) => self.postMessage(m);

async function loadCore(): Promise<Core> {
  const { default: createCore } = (await import(/* @vite-ignore */ coreUrl)) as { default: (m: object) => Promise<Core> };
  // The core finds its .wasm from the hash of mainScriptUrlOrBlob (how @ffmpeg/ffmpeg passes it).
  const hash = btoa(JSON.stringify({ wasmURL: new URL(wasmUrl, self.location.href).href, workerURL: '' }));
  return createCore({ mainScriptUrlOrBlob: `${new URL(coreUrl, self.location.href).href}#${hash}` });
}

/** Gathers float32 samples from bytes that arrive in pieces of any size. */
function floatAssembler(onSamples: (pcm: Float32Array) => void) {
  const carry = new Uint8Array(4);
  let carried = 0;
  return (bytes: Uint8Array) => {
    let at = 0;
    if (carried) {
      while (carried < 4 && at < bytes.length) carry[carried++] = bytes[at++];
      if (carried < 4) return;
      onSamples(new Float32Array(carry.slice().buffer));
      carried = 0;
    }
    const whole = Math.floor((bytes.length - at) / 4) * 4;
    if (whole) onSamples(new Float32Array(bytes.slice(at, at + whole).buffer));
    for (let i = at + whole; i < bytes.length; i++) carry[carried++] = bytes[i];
  };
}

async function scan(req: ScanRequest): Promise<void> {
  post({ type: 'progress', phase: 'loading', done: 0, total: 1, found: 0 });
  const core = await loadCore();
  const log: string[] = [];
  core.setLogger((e) => {
    log.push(e.message);
    if (log.length > 40) log.shift();
  });
  const file = new RangeFile(req.url, req.size, req.name);
  const FS = core.FS;
  FS.filesystems.WORKERFS.reader = rangeReader;
  FS.mkdir('/footage');
  const name = req.name.replace(/[^\w.-]/g, '_') || 'footage';
  FS.mount(FS.filesystems.WORKERFS, { blobs: [{ name, data: file.blobLike() }] }, '/footage');
  let sink: (bytes: Uint8Array) => void = () => {};
  const dev = FS.makedev(64, 0);
  FS.registerDevice(dev, {
    open() {},
    close() {},
    write(_s, buffer, offset, length) {
      // The core hands its heap as an Int8Array: view the bytes unsigned (grey levels > 127).
      sink(new Uint8Array(buffer.buffer, buffer.byteOffset + offset, length));
      return length;
    },
  });
  FS.mkdev('/out', dev);
  const run = (args: string[], what: string) => {
    log.length = 0;
    const code = core.exec('-hide_banner', '-nostdin', '-v', 'error', ...args.map((a) => (a === '{input}' ? `/footage/${name}` : a === '{output}' ? '/out' : a)));
    core.reset();
    if (code !== 0) throw new Error(explain(req.name, what, log));
  };
  const duration = req.pts.length ? req.pts[req.pts.length - 1] : 0;

  if (req.sound) {
    const t0 = performance.now();
    const detector = new WhistleDetector({ sampleRate: SOUND_RATE });
    const found: WhistleCandidate[] = [];
    let lastPost = 0;
    sink = floatAssembler((pcm) => {
      found.push(...detector.push(pcm));
      const now = performance.now();
      if (now - lastPost > 200) {
        lastPost = now;
        post({ type: 'progress', phase: 'sound', done: detector.secondsSeen, total: duration, found: found.length });
      }
    });
    run(soundArgs(), 'sound');
    found.push(...detector.finish());
    post({ type: 'whistles', candidates: found, seconds: detector.secondsSeen, ms: performance.now() - t0 });
  }

  if (req.picture) {
    const t0 = performance.now();
    const detector = new CutDetector({ width: CUT_FRAME_WIDTH, height: CUT_FRAME_HEIGHT });
    const cuts: CutCandidate[] = [];
    let lastPost = 0;
    const splitter = new FrameSplitter(CUT_FRAME_WIDTH * CUT_FRAME_HEIGHT, ptsTimer(req.pts, req.fps), (luma, t, i) => {
      cuts.push(...detector.push(luma, t));
      const now = performance.now();
      if (now - lastPost > 200) {
        lastPost = now;
        post({ type: 'progress', phase: 'picture', done: i, total: req.pts.length, found: cuts.length });
      }
    });
    sink = (b) => splitter.push(b);
    run(lumaFrameArgs(), 'picture');
    cuts.push(...detector.finish());
    post({ type: 'cuts', cuts, frames: splitter.frames, ms: performance.now() - t0 });
  }
  post({ type: 'done', requests: file.requests, bytesFetched: file.bytesFetched });
}

function explain(file: string, what: string, log: string[]): string {
  const text = log.join('\n');
  const last = log.filter((l) => l.trim() && l !== 'Aborted()').slice(-1)[0]?.trim() ?? 'no message';
  if (/matches no streams|does not contain any stream/.test(text)) {
    return what === 'sound' ? `${file}: the file has no sound track, so there are no whistles to find.` : `${file}: the file has no picture, so there are no cuts to find.`;
  }
  if (/Invalid data found|moov atom not found|could not find codec/i.test(text)) return `${file}: the embedded ffmpeg cannot read this file's ${what} (${last}). Check the file plays.`;
  return `${file}: decoding the ${what} failed (${last}).`;
}

self.onmessage = (e: MessageEvent<ScanRequest>) => {
  if (e.data?.type !== 'scan') return;
  scan(e.data).catch((err: unknown) => post({ type: 'failed', message: err instanceof Error ? err.message : String(err) }));
};
