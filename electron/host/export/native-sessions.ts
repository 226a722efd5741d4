/**
 * Native clip exports driven from the renderer (HostApi nativeClip* calls): each session runs
 * exportClipNative and is fed the overlay frames the renderer sends in batches. A batch call
 * resolves only when the session has room again, so a fast renderer never queues more than a
 * few frames ahead of the encoder. A session that hears nothing for IDLE_MS (the window was
 * closed or reloaded mid-export) is cancelled, which removes its temporary file.
 *
 *   const s = new NativeSessions();
 *   const { sessionId } = s.start('/m/footage.mp4', req);
 *   await s.frames(sessionId, batchBytes);  …  await s.finish(sessionId);
 */
import { randomBytes } from 'node:crypto';
import { stat } from 'node:fs/promises';
import type { NativeClipProgress, NativeClipStart, SaveResult } from '../../../shared-types/host-api.ts';
import { OverlayFrameError, unpackBatch, wordsOf } from '../../../engine/overlay-frames/index.ts';
import { exportClipNative } from './native-export.ts';

/** Frames a session holds ahead of the encoder before a batch call waits. */
const HIGH_WATER = 12;
const IDLE_MS = 120_000;

class FrameFeed implements AsyncIterable<Uint32Array> {
  private items: Uint32Array[] = [];
  private ended = false;
  private wakeReader: (() => void) | null = null;
  private wakeWriters: (() => void)[] = [];
  push(frames: Uint32Array[]) {
    this.items.push(...frames);
    this.wakeReader?.();
    this.wakeReader = null;
  }
  end() {
    this.ended = true;
    this.wakeReader?.();
    this.wakeReader = null;
    this.releaseWriters();
  }
  get queued() {
    return this.items.length;
  }
  /** Resolves when the queue is below the high-water mark (or the feed ended). */
  room(): Promise<void> {
    if (this.items.length < HIGH_WATER || this.ended) return Promise.resolve();
    return new Promise((r) => this.wakeWriters.push(r));
  }
  private releaseWriters() {
    const w = this.wakeWriters;
    this.wakeWriters = [];
    for (const r of w) r();
  }
  async *[Symbol.asyncIterator]() {
    for (;;) {
      const next = this.items.shift();
      if (next) {
        if (this.items.length < HIGH_WATER) this.releaseWriters();
        yield next;
      } else if (this.ended) return;
      else await new Promise<void>((r) => (this.wakeReader = r));
    }
  }
}

interface Session {
  id: string;
  feed?: FrameFeed;
  abort: AbortController;
  done: Promise<{ path: string }>;
  failure?: Error;
  encoded: number;
  total: number;
  received: number;
  idle?: ReturnType<typeof setTimeout>;
}

export class NativeSessions {
  private sessions = new Map<string, Session>();

  /** Starts the encoder for `input` (the opened file's path). */
  async start(input: string, req: NativeClipStart): Promise<NativeClipProgress> {
    const info = await stat(input).catch(() => null);
    if (!info?.isFile()) throw new Error(`${input} is no longer there; relink the footage before exporting`);
    const id = randomBytes(12).toString('base64url');
    const abort = new AbortController();
    const feed = req.overlay ? new FrameFeed() : undefined;
    const total = (req.cardFrames ?? 0) + req.frames;
    const s: Session = { id, abort, encoded: 0, total, received: 0, ...(feed ? { feed } : {}), done: Promise.resolve({ path: '' }) };
    s.done = exportClipNative({
      input,
      inT: req.inT,
      frames: req.frames,
      fps: req.fps,
      width: req.width,
      height: req.height,
      ...(req.cardFrames ? { cardFrames: req.cardFrames } : {}),
      ...(feed ? { overlay: feed } : {}),
      directory: req.directory,
      name: req.name,
      ...(req.overwrite ? { overwrite: true } : {}),
      signal: abort.signal,
      onProgress: (f) => (s.encoded = Math.round(f * total)),
    });
    s.done.catch((e: Error) => {
      s.failure = e;
      feed?.end();
    });
    this.sessions.set(id, s);
    this.touch(s);
    return this.progress(s);
  }

  async frames(sessionId: string, batch: Uint8Array): Promise<NativeClipProgress> {
    const s = this.get(sessionId);
    if (!s.feed) throw new Error('nativeClipFrames: this export was started without an overlay');
    let frames: Uint32Array[];
    try {
      frames = unpackBatch(wordsOf(batch));
    } catch (e) {
      if (e instanceof OverlayFrameError) void this.cancel(sessionId);
      throw e;
    }
    if (s.received + frames.length > s.total) {
      void this.cancel(sessionId);
      throw new Error(`nativeClipFrames: ${s.received + frames.length} overlay frames sent for a clip of ${s.total} pictures; the export was stopped`);
    }
    s.received += frames.length;
    s.feed.push(frames);
    this.touch(s);
    await s.feed.room();
    if (s.failure) throw s.failure;
    return this.progress(s);
  }

  async finish(sessionId: string): Promise<SaveResult> {
    const s = this.get(sessionId);
    s.feed?.end();
    clearTimeout(s.idle);
    try {
      const { path } = await s.done;
      const info = await stat(path);
      return { path, bytesWritten: info.size };
    } finally {
      this.sessions.delete(sessionId);
    }
  }

  async cancel(sessionId: string): Promise<void> {
    const s = this.sessions.get(sessionId);
    if (!s) return;
    this.sessions.delete(sessionId);
    clearTimeout(s.idle);
    s.abort.abort();
    s.feed?.end();
    await s.done.catch(() => undefined);
  }

  /** Stops every session (host shutting down). */
  async cancelAll(): Promise<void> {
    await Promise.all([...this.sessions.keys()].map((id) => this.cancel(id)));
  }

  private get(sessionId: string): Session {
    const s = this.sessions.get(sessionId);
    if (!s) throw new Error(`no export session ${sessionId}: it finished, was cancelled, or timed out after ${IDLE_MS / 1000} s without frames`);
    if (s.failure) {
      this.sessions.delete(sessionId);
      throw s.failure;
    }
    return s;
  }

  private touch(s: Session) {
    clearTimeout(s.idle);
    s.idle = setTimeout(() => void this.cancel(s.id), IDLE_MS);
    s.idle.unref?.();
  }

  private progress(s: Session): NativeClipProgress {
    return { sessionId: s.id, encodedFrames: s.encoded, totalFrames: s.total };
  }
}
