/**
 * The native export path: Debian's (or any PATH) ffmpeg re-encodes one clip of the footage
 * to H.264 + AAC MP4 while laying over it the overlay frames the renderer drew (RGBA, one
 * per output frame, streamed on stdin) — the same overlay renderer and caption drawing as
 * the embedded path, so both paths give the same picture.
 *
 * Frame accuracy: `-ss` before the input with re-encoding seeks exactly (ffmpeg's
 * accurate_seek, on by default since 2.1) and `-frames:v` stops on the out-frame; no
 * keyframe cut anywhere. The file is written under a temporary name in the target folder and
 * takes its real name only when ffmpeg finished cleanly (a hard link when replacing is not
 * allowed, so an existing file is never overwritten); on cancel or error the temporary file
 * is removed.
 *
 *   await exportClipNative({ input: '/m/footage.mp4', inT: 323.5, frames: 325, fps: 25, width: 1280, height: 720,
 *     overlay: framesFromRenderer(), directory: '/exports', name: 'corner-01.mp4' });
 */
import { spawn } from 'node:child_process';
import { randomBytes } from 'node:crypto';
import { link, rename, stat, unlink } from 'node:fs/promises';
import { join, resolve } from 'node:path';
import { checkFileName } from '../atomic-save.ts';
import { findNativeFfmpeg } from '../audio/decode-native.ts';

export interface NativeClipRequest {
  input: string;
  /** Footage seconds of the in-frame (its PTS from the probe table). */
  inT: number;
  /** Number of output frames (out-frame − in-frame). */
  frames: number;
  fps: number;
  width: number;
  height: number;
  /** RGBA frames width × height × 4 bytes, one per output frame, in order; absent: no overlay. */
  overlay?: AsyncIterable<Uint8Array>;
  directory: string;
  name: string;
  overwrite?: boolean;
  signal?: AbortSignal;
  /** fraction 0..1 from ffmpeg's own progress report. */
  onProgress?: (fraction: number) => void;
  /** x264 preset; veryfast by default (common practice for review copies). */
  preset?: string;
}

export class NativeExportError extends Error {}

export function nativeClipArgs(req: NativeClipRequest, outPath: string): string[] {
  const dur = req.frames / req.fps;
  const args = ['-hide_banner', '-nostdin', '-v', 'error', '-progress', 'pipe:2', '-y', '-ss', req.inT.toFixed(6), '-i', req.input];
  let filter = `[0:v]scale=${req.width}:${req.height},setsar=1,setpts=PTS-STARTPTS[base]`;
  if (req.overlay) {
    args.push('-f', 'rawvideo', '-pix_fmt', 'rgba', '-s', `${req.width}x${req.height}`, '-r', String(req.fps), '-i', 'pipe:0');
    filter += `;[1:v]setpts=PTS-STARTPTS[ov];[base][ov]overlay=0:0:eof_action=pass:format=auto,format=yuv420p[v]`;
  } else filter += ';[base]format=yuv420p[v]';
  args.push('-filter_complex', filter, '-map', '[v]', '-map', '0:a?', '-frames:v', String(req.frames), '-t', dur.toFixed(6));
  args.push('-c:v', 'libx264', '-preset', req.preset ?? 'veryfast', '-crf', '20', '-g', String(Math.round(req.fps * 2)), '-c:a', 'aac', '-b:a', '128k', '-movflags', '+faststart', '-f', 'mp4', outPath);
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
  const temp = join(dir, `.${name}.${randomBytes(6).toString('hex')}.partial`);
  try {
    await runFfmpeg(exe, nativeClipArgs(req, temp), req);
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

function runFfmpeg(exe: string, args: string[], req: NativeClipRequest): Promise<void> {
  return new Promise((resolvePromise, reject) => {
    if (req.signal?.aborted) return reject(new NativeExportError('export cancelled; nothing was written'));
    const child = spawn(exe, args, { stdio: [req.overlay ? 'pipe' : 'ignore', 'ignore', 'pipe'] });
    const log: string[] = [];
    let cancelled = false;
    const onAbort = () => {
      cancelled = true;
      child.kill('SIGKILL');
    };
    req.signal?.addEventListener('abort', onAbort, { once: true });
    const total = req.frames;
    child.stderr!.setEncoding('utf8').on('data', (t: string) => {
      for (const line of t.split('\n')) {
        const m = /^frame=(\d+)/.exec(line);
        if (m) req.onProgress?.(Math.min(1, Number(m[1]) / total));
        else if (line && !/^\w+=/.test(line)) log.push(line);
      }
    });
    if (req.overlay && child.stdin) {
      const stdin = child.stdin;
      stdin.on('error', () => undefined); // ffmpeg stops reading once it has its frames
      void (async () => {
        try {
          for await (const frame of req.overlay!) {
            if (cancelled || stdin.destroyed) break;
            if (!stdin.write(frame)) await new Promise<void>((r) => stdin.once('drain', () => r()));
          }
        } catch (e) {
          log.push(`overlay frames failed: ${(e as Error).message}`);
          child.kill('SIGKILL');
        } finally {
          stdin.end();
        }
      })();
    }
    child.on('error', (e) => reject(e));
    child.on('close', (code) => {
      req.signal?.removeEventListener('abort', onAbort);
      if (cancelled) return reject(new NativeExportError('export cancelled; nothing was written'));
      if (code !== 0) return reject(new NativeExportError(`ffmpeg stopped (exit ${code}) exporting ${req.name}: ${log.slice(-4).join(' ').trim() || 'no message'}`));
      req.onProgress?.(1);
      resolvePromise();
    });
  });
}
