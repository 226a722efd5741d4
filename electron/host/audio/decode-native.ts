/**
 * Audio decode with Debian's native ffmpeg (the fast path): PCM streams from its stdout,
 * so memory stays flat however long the recording.
 */
import { spawn, spawnSync } from 'node:child_process';
import { PcmChunker } from './pcm-chunker.ts';
import { abortError, decodeFailure, pcmArgs, type DecodeOptions, type DecodeResult } from './decode-types.ts';

let found: string | null | undefined;

/** Path of an ffmpeg on PATH that runs, or null. Asked once per process. */
export function findNativeFfmpeg(): string | null {
  if (found !== undefined) return found;
  const r = spawnSync('ffmpeg', ['-hide_banner', '-version'], { encoding: 'utf8', timeout: 10_000 });
  found = r.status === 0 ? 'ffmpeg' : null;
  return found;
}

export function decodeNative(file: string, opts: DecodeOptions): Promise<DecodeResult> {
  const exe = findNativeFfmpeg();
  if (!exe) return Promise.reject(new Error('no native ffmpeg on PATH; install Debian\'s ffmpeg or use the embedded decoder (--embedded)'));
  const sampleRate = opts.sampleRate ?? 16000;
  const { signal } = opts;
  return new Promise((resolve, reject) => {
    if (signal?.aborted) return reject(abortError(signal));
    const child = spawn(exe, ['-hide_banner', '-nostdin', '-v', 'error', ...pcmArgs(file, sampleRate, 'pipe:1')], {
      stdio: ['ignore', 'pipe', 'pipe'],
    });
    const log: string[] = [];
    let failed: unknown = null;
    const chunker = new PcmChunker((pcm) => {
      try {
        opts.onChunk(pcm);
        opts.onProgress?.(chunker.samples / sampleRate);
      } catch (err) {
        failed ??= err;
        child.kill('SIGKILL');
      }
    });
    const onAbort = () => {
      failed ??= abortError(signal!);
      child.kill('SIGKILL');
    };
    signal?.addEventListener('abort', onAbort, { once: true });
    child.stdout.on('data', (b: Buffer) => chunker.push(b));
    child.stderr.setEncoding('utf8').on('data', (t: string) => log.push(...t.split('\n')));
    child.on('error', (err) => reject(err));
    child.on('close', (code) => {
      signal?.removeEventListener('abort', onAbort);
      if (failed) return reject(failed);
      if (code !== 0) return reject(decodeFailure(file, 'native', log));
      resolve({ engine: 'native', sampleRate, samples: chunker.samples, seconds: chunker.samples / sampleRate });
    });
  });
}
