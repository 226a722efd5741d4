/**
 * The native export path: Debian's (or any PATH) ffmpeg decodes and re-encodes one clip of the
 * footage to H.264 + AAC MP4, and the overlay the renderer drew (the Watch screen's layers,
 * caption, title card) is laid over each picture here, between the two ffmpeg processes:
 *
 *   ffmpeg (decode, scale → I420 on stdout) → blend overlay runs in place → ffmpeg (stdin → x264 + source audio)
 *
 * Why not ffmpeg's own overlay filter: it converts and blends the whole RGBA frame every time
 * (about 14 ms of CPU per 720p frame on this machine, more than half of the plain encode),
 * while the overlay covers about an eighth of the picture; blending only the visible runs
 * costs about a millisecond (bench/export.bench.ts).
 *
 * Frame accuracy: `-ss` before the input with decoding seeks exactly (ffmpeg's accurate_seek)
 * and `-frames:v` stops on the out-frame; nothing is cut on a keyframe. With a title card the
 * first `cardFrames` pictures are the card on black and the audio is delayed by the card.
 * The file is written under a temporary name in the target folder and takes its real name
 * only when the encoder finished cleanly (a hard link when replacing is not allowed, so an
 * existing file is never overwritten); on cancel or error the temporary file is removed.
 *
 *   await exportClipNative({ input: '/m/footage.mp4', inT: 323.5, frames: 325, fps: 25, width: 1280, height: 720,
 *     overlay: runFramesFromRenderer(), directory: '/exports', name: 'corner-01.mp4' });
 */
import { spawn, type ChildProcess } from 'node:child_process';
import { randomBytes } from 'node:crypto';
import { link, rename, stat, unlink } from 'node:fs/promises';
import { setPriority } from 'node:os';
import { join, resolve } from 'node:path';
import { blendRunsI420, decodeRuns, defaultMatrix, fillBlackI420, i420Size, type YuvMatrix } from '../../../engine/overlay-frames/index.ts';
import { checkFileName } from '../atomic-save.ts';
import { findNativeFfmpeg } from '../audio/decode-native.ts';

export interface NativeClipRequest {
  input: string;
  /** Footage seconds of the in-frame (its PTS from the probe table). */
  inT: number;
  /** Number of clip frames (out-frame − in-frame), not counting the title card. */
  frames: number;
  fps: number;
  width: number;
  height: number;
  /** Run-encoded overlay frames (engine/overlay-frames/runs.ts): the card's first, then one per clip frame. */
  overlay?: AsyncIterable<Uint32Array>;
  /** Title card pictures before the clip (their overlay frames come first). */
  cardFrames?: number;
  /** RGB → Y'CbCr matrix for the overlay; by picture height when absent. */
  matrix?: YuvMatrix;
  directory: string;
  name: string;
  overwrite?: boolean;
  signal?: AbortSignal;
  /** fraction 0..1 of the pictures encoded. */
  onProgress?: (fraction: number) => void;
  /** x264 preset; veryfast by default (common practice for review copies). */
  preset?: string;
}

export class NativeExportError extends Error {}

const cancelledError = () => new NativeExportError('export cancelled; nothing was written');

/** 29.97 → "30000/1001"; whole rates stay whole (rawvideo input needs an exact rate). */
export function rateText(fps: number): string {
  const whole = Math.round(fps);
  if (Math.abs(fps - whole) < 1e-6) return String(whole);
  if (Math.abs(fps - (whole * 1000) / 1001) < 0.005) return `${whole * 1000}/1001`;
  return fps.toFixed(6);
}

function encoderTail(req: NativeClipRequest, outPath: string): string[] {
  return ['-c:v', 'libx264', '-preset', req.preset ?? 'veryfast', '-crf', '20', '-g', String(Math.round(req.fps * 2)), '-c:a', 'aac', '-b:a', '128k', '-movflags', '+faststart', '-f', 'mp4', outPath];
}

/** One ffmpeg doing everything, no overlay: the plain re-encode (and the benchmark's practical limit). */
export function nativeClipArgs(req: NativeClipRequest, outPath: string): string[] {
  const dur = req.frames / req.fps;
  return [
    ...['-hide_banner', '-nostdin', '-v', 'error', '-progress', 'pipe:2', '-y', '-ss', req.inT.toFixed(6), '-i', req.input],
    ...['-filter_complex', `[0:v]scale=${req.width}:${req.height},setsar=1,setpts=PTS-STARTPTS,format=yuv420p[v]`, '-map', '[v]', '-map', '0:a?'],
    ...['-frames:v', String(req.frames), '-t', dur.toFixed(6), ...encoderTail(req, outPath)],
  ];
}

/** The decoding ffmpeg: the clip's pictures, scaled, as I420 on stdout, one per source frame. */
export function decoderArgs(req: NativeClipRequest): string[] {
  // A quarter frame early: the in-frame's PTS printed to 6 places must not fall after it.
  const ss = Math.max(0, req.inT - 0.25 / req.fps);
  return [
    ...['-hide_banner', '-nostdin', '-v', 'error', '-ss', ss.toFixed(6), '-i', req.input, '-map', '0:v:0'],
    ...['-vf', `scale=${req.width}:${req.height},setsar=1,format=yuv420p`, '-fps_mode', 'passthrough', '-frames:v', String(req.frames), '-f', 'rawvideo', 'pipe:1'],
  ];
}

/** The encoding ffmpeg: I420 pictures on stdin, the source's audio from the in-point (after the card). */
export function encoderArgs(req: NativeClipRequest, outPath: string): string[] {
  const card = req.cardFrames ?? 0;
  const total = card + req.frames;
  const cardS = card / req.fps;
  const args = ['-hide_banner', '-nostdin', '-v', 'error', '-progress', 'pipe:2', '-y'];
  args.push('-f', 'rawvideo', '-pix_fmt', 'yuv420p', '-s', `${req.width}x${req.height}`, '-framerate', rateText(req.fps), '-i', 'pipe:0');
  args.push('-ss', Math.max(0, req.inT).toFixed(6), '-i', req.input, '-map', '0:v', '-map', '1:a:0?');
  if (card > 0) args.push('-af', `adelay=${Math.round(cardS * 1000)}:all=1`);
  // No -frames:v here: reaching it closes the file before the audio is all muxed; stdin holds exactly `total` pictures.
  args.push('-t', (total / req.fps).toFixed(6), ...encoderTail(req, outPath));
  return args;
}

export async function exportClipNative(req: NativeClipRequest): Promise<{ path: string }> {
  const exe = findNativeFfmpeg();
  if (!exe) throw new NativeExportError('no native ffmpeg on PATH; the embedded path (in the app) needs nothing installed');
  const name = checkFileName(req.name);
  const dir = resolve(req.directory);
  const info = await stat(dir).catch(() => null);
  if (!info?.isDirectory()) throw new NativeExportError(`${dir}: folder not found; choose an existing folder to export into`);
  const target = join(dir, name);
  if (!req.overwrite && (await stat(target).catch(() => null))) throw new NativeExportError(`${target} already exists; nothing was written. Choose another name or confirm replacing it.`);
  if (!(req.frames > 0)) throw new NativeExportError(`${name}: a clip needs at least one frame`);
  if (req.width % 2 || req.height % 2) throw new NativeExportError(`${name}: ${req.width}×${req.height} — H.264 4:2:0 needs an even width and height`);
  if (req.signal?.aborted) throw cancelledError();
  const temp = join(dir, `.${name}.${randomBytes(6).toString('hex')}.partial`);
  try {
    if (req.overlay || req.cardFrames) await runPipeline(exe, req, temp);
    else await runSingle(exe, req, temp);
    if (req.overwrite) await rename(temp, target);
    else {
      try {
        await link(temp, target);
      } catch (e) {
        if ((e as NodeJS.ErrnoException).code === 'EEXIST') throw new NativeExportError(`${target} already exists; nothing was written.`);
        throw e;
      }
      await unlink(temp).catch(() => undefined);
    }
  } catch (e) {
    await unlink(temp).catch(() => undefined);
    throw e;
  }
  return { path: target };
}

/** A child's stderr: ffmpeg's progress lines to `onFrame`, everything else kept for the message. */
function watchStderr(child: ChildProcess, log: string[], onFrame?: (n: number) => void) {
  child.stderr!.setEncoding('utf8').on('data', (t: string) => {
    for (const line of t.split('\n')) {
      const m = /^frame=(\d+)/.exec(line);
      if (m) onFrame?.(Number(m[1]));
      else if (line && !/^\w+=/.test(line)) log.push(line);
    }
  });
}

function exited(child: ChildProcess): Promise<number | null> {
  return new Promise((r, reject) => {
    child.once('error', reject);
    child.once('close', (code) => r(code));
  });
}

function runSingle(exe: string, req: NativeClipRequest, outPath: string): Promise<void> {
  const child = spawn(exe, nativeClipArgs(req, outPath), { stdio: ['ignore', 'ignore', 'pipe'] });
  const log: string[] = [];
  watchStderr(child, log, (n) => req.onProgress?.(Math.min(1, n / req.frames)));
  return supervise([child], req, async () => {
    const code = await exited(child);
    if (code !== 0) throw new NativeExportError(`ffmpeg stopped (exit ${code}) exporting ${req.name}: ${log.slice(-4).join(' ').trim() || 'no message'}`);
  });
}

/** Runs `body` while the children live; cancel kills them all and rejects with the cancel message. */
async function supervise(children: ChildProcess[], req: NativeClipRequest, body: () => Promise<void>): Promise<void> {
  let cancelled = false;
  const onAbort = () => {
    cancelled = true;
    for (const c of children) c.kill('SIGKILL');
  };
  req.signal?.addEventListener('abort', onAbort, { once: true });
  try {
    await body();
  } catch (e) {
    for (const c of children) c.kill('SIGKILL');
    throw cancelled ? cancelledError() : e;
  } finally {
    req.signal?.removeEventListener('abort', onAbort);
  }
  if (cancelled) throw cancelledError();
  req.onProgress?.(1);
}

/** Reads fixed-size pictures from a stream, a few ahead at most (backpressure by pause/resume). */
class PictureReader {
  private ready: Buffer[] = [];
  private current: Buffer;
  private filled = 0;
  private ended = false;
  private wake: (() => void) | null = null;
  private spare: Buffer[] = [];
  constructor(
    private readonly stream: NodeJS.ReadableStream,
    private readonly size: number,
  ) {
    this.current = Buffer.allocUnsafe(size);
    stream.on('data', (chunk: Buffer) => {
      let off = 0;
      while (off < chunk.length) {
        const n = Math.min(chunk.length - off, this.size - this.filled);
        chunk.copy(this.current, this.filled, off, off + n);
        this.filled += n;
        off += n;
        if (this.filled === this.size) {
          this.ready.push(this.current);
          this.current = this.spare.pop() ?? Buffer.allocUnsafe(this.size);
          this.filled = 0;
        }
      }
      if (this.ready.length >= 4) stream.pause();
      this.notify();
    });
    stream.on('end', () => {
      this.ended = true;
      this.notify();
    });
  }
  private notify() {
    const w = this.wake;
    this.wake = null;
    w?.();
  }
  /** The next whole picture, or null when the stream ended. */
  async next(): Promise<Buffer | null> {
    for (;;) {
      const pic = this.ready.shift();
      if (pic) {
        if (this.ready.length < 2) this.stream.resume();
        return pic;
      }
      if (this.ended) return null;
      await new Promise<void>((r) => (this.wake = r));
    }
  }
  /** A picture buffer the caller has finished with. */
  recycle(pic: Buffer) {
    if (this.spare.length < 6) this.spare.push(pic);
  }
}

/**
 * Writes a picture; resolves when the stream takes more, calls `written` once the bytes are out
 * (the buffer may then be reused). A stream that closes or fails (ffmpeg killed on cancel)
 * rejects instead of waiting for a 'drain' that never comes.
 */
function write(stream: NodeJS.WritableStream, pic: Buffer, written: () => void): Promise<void> {
  return new Promise((resolveWrite, reject) => {
    const gone = () => {
      cleanup();
      reject(new NativeExportError('the encoder stopped taking pictures'));
    };
    const drained = () => {
      cleanup();
      resolveWrite();
    };
    const cleanup = () => {
      stream.removeListener('drain', drained);
      stream.removeListener('close', gone);
      stream.removeListener('error', gone);
    };
    if ((stream as NodeJS.WritableStream & { destroyed?: boolean }).destroyed) return gone();
    const ok = stream.write(pic, (e) => (e ? undefined : written()));
    if (ok) return resolveWrite();
    stream.once('drain', drained);
    stream.once('close', gone);
    stream.once('error', gone);
  });
}

function runPipeline(exe: string, req: NativeClipRequest, outPath: string): Promise<void> {
  const { width, height } = req;
  const card = req.cardFrames ?? 0;
  const total = card + req.frames;
  const matrix = req.matrix ?? defaultMatrix(height);
  const size = i420Size(width, height);
  const decoder = spawn(exe, decoderArgs(req), { stdio: ['ignore', 'pipe', 'pipe'] });
  const encoder = spawn(exe, encoderArgs(req, outPath), { stdio: ['pipe', 'ignore', 'pipe'] });
  // The renderer drawing the overlay is one thread on the critical path, ffmpeg many that can
  // take whatever is left: give ffmpeg the lower priority, or on a small machine its threads
  // crowd out the drawing and the encoder then waits for frames.
  for (const c of [decoder, encoder]) if (c.pid) try { setPriority(c.pid, 10); } catch { /* not allowed here: run as is */ }
  const decLog: string[] = [];
  const encLog: string[] = [];
  watchStderr(decoder, decLog);
  watchStderr(encoder, encLog, (n) => req.onProgress?.(Math.min(1, n / total)));
  encoder.stdin!.on('error', () => undefined); // reported by the exit code instead
  const pictures = new PictureReader(decoder.stdout!, size);
  const decoderDone = exited(decoder);
  const encoderDone = exited(encoder);
  return supervise([decoder, encoder], req, async () => {
    const overlay = req.overlay?.[Symbol.asyncIterator]();
    const black = Buffer.alloc(size);
    fillBlackI420(black, width, height);
    let sent = 0;
    for (let k = 0; k < total; k++) {
      const pic = k < card ? Buffer.from(black) : await pictures.next();
      if (!pic) break; // the footage ended before the out-frame: the file is shorter, ffprobe shows it
      if (overlay) {
        const next = await overlay.next();
        if (next.done) throw new NativeExportError(`${req.name}: the overlay frames stopped at picture ${k + 1} of ${total}; nothing was written`);
        blendRunsI420(pic, width, height, decodeRuns(next.value), matrix);
      }
      await write(encoder.stdin!, pic, () => k >= card && pictures.recycle(pic));
      sent++;
    }
    encoder.stdin!.end();
    decoder.kill('SIGTERM'); // it may still be reading past the out-frame
    await overlay?.return?.();
    const [, code] = await Promise.all([decoderDone, encoderDone]);
    if (code !== 0) throw new NativeExportError(`ffmpeg stopped (exit ${code}) encoding ${req.name}: ${encLog.slice(-4).join(' ').trim() || 'no message'}`);
    if (sent === card) throw new NativeExportError(`ffmpeg decoded no picture of ${req.name} at ${req.inT.toFixed(3)} s: ${decLog.slice(-4).join(' ').trim() || 'the footage ends before the in-point'}`);
  });
}
