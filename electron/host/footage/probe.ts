/**
 * probeFootageFile(path) → FootageProbe: container, codecs, size, audio and the real
 * per-frame presentation table of one footage file.
 *
 * MP4/MOV (recognised by their `ftyp`/`moov` boxes) go to mp4box, which reads only the
 * sample tables; everything else (Matroska/WebM, MPEG-TS, …) goes to ffmpeg.wasm.
 * Example: await probeFootageFile('/media/match.mp4') → { frameCount: 135000, pts: [0, 0.04, …], … }
 */
import { open, stat } from 'node:fs/promises';
import type { FootageProbe } from '../../../shared-types/domain.ts';
import { probeMp4 } from './mp4-probe.ts';
import { probeWithWasm } from './wasm-probe.ts';

export type ContainerGuess = 'mp4' | 'mov' | 'matroska' | 'mpegts' | 'unknown';

/** Guesses the container from the first bytes (magic numbers, not the file name). */
export function sniffContainer(head: Uint8Array): ContainerGuess {
  const ascii = (from: number, to: number) => String.fromCharCode(...head.subarray(from, to));
  const box = ascii(4, 8);
  if (box === 'ftyp') return ascii(8, 12) === 'qt  ' ? 'mov' : 'mp4';
  if (['moov', 'mdat', 'free', 'wide', 'skip'].includes(box)) return 'mov';
  if (head[0] === 0x1a && head[1] === 0x45 && head[2] === 0xdf && head[3] === 0xa3) return 'matroska';
  // MPEG-TS: a 0x47 sync byte every 188 bytes (or 192 with a 4-byte timecode prefix).
  for (const [start, step] of [[0, 188], [4, 192]] as const) {
    let hits = 0;
    for (let p = start; p < head.length; p += step) hits += head[p] === 0x47 ? 1 : -10;
    if (hits >= 3) return 'mpegts';
  }
  return 'unknown';
}

export async function probeFootageFile(path: string): Promise<FootageProbe> {
  const info = await stat(path).catch(() => null);
  if (!info) throw new Error(`${path}: file not found; was it moved or renamed?`);
  if (!info.isFile()) throw new Error(`${path}: not a file`);
  if (info.size === 0) throw new Error(`${path}: the file is empty`);
  const handle = await open(path, 'r');
  const head = new Uint8Array(188 * 5);
  let n = 0;
  try {
    n = (await handle.read(head, 0, head.length, 0)).bytesRead;
  } finally {
    await handle.close();
  }
  const kind = sniffContainer(head.subarray(0, n));
  if (kind !== 'mp4' && kind !== 'mov') return probeWithWasm(path);
  try {
    return await probeMp4(path, kind);
  } catch (mp4Error) {
    // An MP4/MOV mp4box cannot read may still be readable by ffmpeg (odd MOV
    // boxes, damaged index); if ffmpeg fails too, mp4box's message says more.
    try {
      return await probeWithWasm(path);
    } catch {
      throw mp4Error;
    }
  }
}
