/**
 * Audio decode with the embedded ffmpeg.wasm core, for machines without ffmpeg.
 *
 * The core runs in a worker thread (pcm-worker.mjs): its exec() blocks a thread for the
 * whole decode, which must never be the host's. The file is mounted, not copied, and the
 * PCM streams back as ffmpeg writes it, so memory stays flat over a 90-minute file.
 * Cancelling terminates the worker.
 */
import { Worker } from 'node:worker_threads';
import { compiledCoreModule } from './embedded-core.ts';
import { PcmChunker } from './pcm-chunker.ts';
import { abortError, decodeFailure, pcmArgs, type DecodeOptions, type DecodeResult } from './decode-types.ts';

export interface EmbeddedOptions extends DecodeOptions {
  /**
   * 'mount' (default): read the file in place. 'copy': write it whole into wasm memory
   * first — kept so bench/whistle.bench.ts can measure what mounting saves.
   */
  input?: 'mount' | 'copy';
}

const workerUrl = new URL('./pcm-worker.mjs', import.meta.url);

type WorkerMessage =
  | { type: 'pcm'; bytes: ArrayBuffer }
  | { type: 'done'; code: number; log: string[] }
  | { type: 'failed'; message: string };

export async function decodeEmbedded(file: string, opts: EmbeddedOptions): Promise<DecodeResult> {
  const sampleRate = opts.sampleRate ?? 16000;
  const { signal } = opts;
  if (signal?.aborted) throw abortError(signal);
  const wasmModule = await compiledCoreModule();
  const args = pcmArgs('{input}', sampleRate, '{output}');
  const worker = new Worker(workerUrl, { workerData: { file, args, input: opts.input ?? 'mount', wasmModule } });
  const chunker = new PcmChunker((pcm) => {
    opts.onChunk(pcm);
    opts.onProgress?.(chunker.samples / sampleRate);
  });
  return new Promise<DecodeResult>((resolve, reject) => {
    let settled = false;
    const finish = (err: unknown, result?: DecodeResult) => {
      if (settled) return;
      settled = true;
      signal?.removeEventListener('abort', onAbort);
      void worker.terminate();
      if (err) reject(err);
      else resolve(result!);
    };
    const onAbort = () => finish(abortError(signal!));
    signal?.addEventListener('abort', onAbort, { once: true });
    worker.on('message', (m: WorkerMessage) => {
      if (settled) return;
      if (m.type === 'pcm') {
        try {
          chunker.push(new Uint8Array(m.bytes));
        } catch (err) {
          finish(err);
        }
        // A consumer may have aborted from inside onChunk / onProgress.
        if (signal?.aborted) finish(abortError(signal));
      } else if (m.type === 'done') {
        if (m.code !== 0) finish(decodeFailure(file, 'embedded', m.log));
        else finish(null, { engine: 'embedded', sampleRate, samples: chunker.samples, seconds: chunker.samples / sampleRate });
      } else {
        finish(new Error(`${file}: the embedded ffmpeg stopped: ${m.message}`));
      }
    });
    worker.once('error', (e) => finish(new Error(`${file}: the embedded ffmpeg worker failed: ${e.message}`)));
    worker.once('exit', (code) => finish(new Error(`${file}: the embedded ffmpeg worker stopped (exit code ${code}) before finishing`)));
  });
}
