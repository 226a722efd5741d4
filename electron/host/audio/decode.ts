/**
 * Decodes a footage file's audio to mono float32 PCM (16 kHz by default), streamed in
 * chunks to `onChunk`. Two engines give the same samples (same ffmpeg 5.1 arguments):
 * Debian's native ffmpeg when it is on PATH (fast), else the embedded ffmpeg.wasm core.
 *
 * Example:
 *   await decodeAudio('match.mp4', { onChunk: (pcm) => detector.push(pcm) });
 */
import { statSync } from 'node:fs';
import { decodeEmbedded } from './decode-embedded.ts';
import { decodeNative, findNativeFfmpeg } from './decode-native.ts';
import type { DecodeEngine, DecodeOptions, DecodeResult } from './decode-types.ts';

export type { DecodeEngine, DecodeOptions, DecodeResult } from './decode-types.ts';
export { findNativeFfmpeg } from './decode-native.ts';

export async function decodeAudio(file: string, opts: DecodeOptions & { engine?: DecodeEngine | 'auto' }): Promise<DecodeResult> {
  const st = statSync(file, { throwIfNoEntry: false });
  if (!st) throw new Error(`${file}: file not found. Check the path.`);
  if (!st.isFile()) throw new Error(`${file}: not a file. Give the footage file itself.`);
  const engine = opts.engine ?? 'auto';
  if (engine === 'native') return decodeNative(file, opts);
  if (engine === 'embedded') return decodeEmbedded(file, opts);
  return findNativeFfmpeg() ? decodeNative(file, opts) : decodeEmbedded(file, opts);
}
