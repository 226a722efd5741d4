/**
 * playableCopy(path, probe, cacheDir) -> a file Chromium's <video> can play with the same
 * frames: the file itself for MP4/MOV/Matroska/WebM; for MPEG-TS (which Chromium cannot
 * open) an MP4 remuxed without re-encoding (`-c copy`) into a cache folder, by Debian's
 * native ffmpeg when it is on PATH, else by the embedded ffmpeg.wasm core.
 *
 * The copy's frame table is read back (mp4box) and must equal the original's frame for
 * frame (times relative to the first frame); its first frame's PTS is returned as the
 * media offset the player needs. Written to a temporary name and renamed, so a cancelled
 * or failed remux never leaves a half file that looks finished.
 *
 *   await playableCopy('/media/match.m2t', probe, '/tmp/cache') -> { path: '/tmp/cache/3f…mp4', remuxed: true, mediaOffset: 0 }
 */
import { spawn } from 'node:child_process';
import { createHash } from 'node:crypto';
import { mkdir, open, rename, rm, stat, writeFile } from 'node:fs/promises';
import { join, resolve } from 'node:path';
import type { FootageProbe } from '../../../shared-types/domain.ts';
import { findNativeFfmpeg } from '../audio/decode-native.ts';
import { probeMp4 } from './mp4-probe.ts';
import { sniffContainer, type ContainerGuess } from './probe.ts';
import { runWasmFfmpeg } from './wasm-probe.ts';

export interface PlayableCopy {
  path: string;
  remuxed: boolean;
  /** Media time of the copy's first frame (footage time 0), when the host knows it. */
  mediaOffset?: number;
  /** Which ffmpeg made the copy. */
  by?: 'native' | 'embedded' | 'cache';
}

/** Containers Chromium's <video> cannot open but ffmpeg can copy into MP4. */
export function needsRemux(kind: ContainerGuess): boolean {
  return kind === 'mpegts';
}

/** The embedded core keeps the whole output in memory: refuse what cannot fit. */
const EMBEDDED_LIMIT = 1.5 * 2 ** 30;

async function sniff(path: string): Promise<ContainerGuess> {
  const handle = await open(path, 'r');
  try {
    const head = new Uint8Array(188 * 5);
    const { bytesRead } = await handle.read(head, 0, head.length, 0);
    return sniffContainer(head.subarray(0, bytesRead));
  } finally {
    await handle.close();
  }
}

function copyArgs(input: string, output: string): string[] {
  // First video and (if any) first audio stream, packets copied; moov first for seeking.
  return ['-hide_banner', '-nostdin', '-v', 'error', '-y', '-i', input, '-map', '0:v:0', '-map', '0:a:0?', '-c', 'copy', '-movflags', '+faststart', '-f', 'mp4', output];
}

function remuxNative(exe: string, input: string, output: string): Promise<void> {
  return new Promise((ok, fail) => {
    const child = spawn(exe, copyArgs(input, output), { stdio: ['ignore', 'ignore', 'pipe'] });
    const err: string[] = [];
    child.stderr.on('data', (d: Buffer) => err.push(d.toString()));
    child.on('error', fail);
    child.on('close', (code) => (code === 0 ? ok() : fail(new Error(`ffmpeg could not copy the streams into MP4 (exit ${code}): ${err.join('').trim().split('\n').slice(-2).join(' / ')}`))));
  });
}

async function remuxEmbedded(input: string, output: string, size: number): Promise<void> {
  if (size > EMBEDDED_LIMIT) {
    throw new Error(`the file is ${(size / 2 ** 30).toFixed(1)} GB; the embedded ffmpeg can copy at most ${EMBEDDED_LIMIT / 2 ** 30} GB. Install Debian's ffmpeg (apt-get install ffmpeg) and open the footage again`);
  }
  const out = '/playable.mp4';
  const args = copyArgs('{input}', out).filter((a) => a !== '-nostdin');
  const { code, log, binary } = await runWasmFfmpeg(input, args, out, { binary: true });
  if (code !== 0 || !binary) throw new Error(`the embedded ffmpeg could not copy the streams into MP4 (exit ${code}): ${log.slice(-2).join(' / ')}`);
  await writeFile(output, binary);
}

/** Where a copy of this exact file (path, size, modification time) is kept. */
export function cachedCopyPath(cacheDir: string, abs: string, size: number, mtimeMs: number): string {
  const key = createHash('sha256').update(`${abs}\0${size}\0${mtimeMs}`).digest('hex').slice(0, 32);
  return join(cacheDir, `${key}.mp4`);
}

/** The copy must show the same frames at the same relative times as the original. */
function checkSameFrames(original: FootageProbe, copy: FootageProbe, name: string): void {
  if (copy.frameCount !== original.frameCount) {
    throw new Error(`${name}: the MP4 copy has ${copy.frameCount} frames, the original ${original.frameCount}; it cannot stand in for it frame by frame`);
  }
  for (let i = 0; i < copy.pts.length; i++) {
    if (Math.abs(copy.pts[i] - original.pts[i]) > 1e-4) {
      throw new Error(`${name}: frame ${i} is at ${copy.pts[i].toFixed(6)} s in the MP4 copy but at ${original.pts[i].toFixed(6)} s in the original; the copy cannot stand in for it`);
    }
  }
}

export async function playableCopy(path: string, probe: FootageProbe, cacheDir: string, opts: { embeddedOnly?: boolean } = {}): Promise<PlayableCopy> {
  const abs = resolve(path);
  const kind = await sniff(abs);
  if (!needsRemux(kind)) return { path: abs, remuxed: false };
  const info = await stat(abs);
  const target = cachedCopyPath(cacheDir, abs, info.size, info.mtimeMs);
  let by: PlayableCopy['by'] = 'cache';
  const cached = await stat(target).catch(() => null);
  if (!cached) {
    await mkdir(cacheDir, { recursive: true });
    const partial = `${target}.${process.pid}.partial`;
    try {
      const exe = opts.embeddedOnly ? null : findNativeFfmpeg();
      if (exe) {
        by = 'native';
        await remuxNative(exe, abs, partial);
      } else {
        by = 'embedded';
        await remuxEmbedded(abs, partial, info.size);
      }
      const copy = await probeMp4(partial, 'mp4');
      checkSameFrames(probe, copy, abs);
      await rename(partial, target);
    } catch (e) {
      await rm(partial, { force: true });
      throw new Error(`${abs}: cannot be played directly (MPEG-TS) and making a playable MP4 copy failed: ${(e as Error).message}`);
    }
  }
  const copy = await probeMp4(target, 'mp4');
  checkSameFrames(probe, copy, abs);
  return { path: target, remuxed: true, mediaOffset: copy.startTime, by };
}
