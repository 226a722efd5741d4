/**
 * Audio decode with the embedded ffmpeg.wasm core, for machines without ffmpeg.
 *
 * No whole-file copies: the footage is mounted read-only (WORKERFS, whose reads we serve
 * with `fs.readSync` on the real file — Node has no FileReaderSync), and ffmpeg writes its
 * PCM to a character device whose `write` hands each block straight to `onChunk`. So a
 * 90-minute file needs neither its own size nor its PCM's size in wasm memory.
 * exec() is synchronous and blocks its thread for the whole decode (about a minute or
 * two for 90 minutes on this machine). So in the app it belongs in a worker thread, and
 * cancelling from outside means terminating that worker; the AbortSignal is checked at
 * every PCM write (then the write fails with EIO and ffmpeg stops cleanly), which serves
 * aborts raised from inside onChunk/onProgress, e.g. by a consumer that has seen enough.
 */
import { closeSync, fstatSync, openSync, readFileSync, readSync } from 'node:fs';
import { basename } from 'node:path';
import { loadEmbeddedCore } from './embedded-core.ts';
import { PcmChunker } from './pcm-chunker.ts';
import { abortError, decodeFailure, pcmArgs, type DecodeOptions, type DecodeResult } from './decode-types.ts';

/** A stand-in for a Blob slice: WORKERFS only asks for `size` and `slice`. */
interface FileSlice {
  fd: number;
  start: number;
  size: number;
  slice(from: number, to: number): FileSlice;
}

function fileSlice(fd: number, start: number, size: number): FileSlice {
  return {
    fd,
    start,
    size,
    slice: (from, to) => fileSlice(fd, start + from, Math.max(0, Math.min(size, to) - from)),
  };
}

/** Serves WORKERFS reads from the file on disk. */
const diskReader = {
  readAsArrayBuffer(s: FileSlice): ArrayBuffer {
    const buf = new Uint8Array(s.size);
    let done = 0;
    while (done < s.size) {
      const n = readSync(s.fd, buf, done, s.size - done, s.start + done);
      if (n === 0) break;
      done += n;
    }
    return buf.buffer;
  },
};

const EIO = 29;

export interface EmbeddedOptions extends DecodeOptions {
  /**
   * 'mount' (default): read the file in place. 'copy': write it whole into wasm memory
   * first — kept so bench/whistle.bench.ts can measure what mounting saves.
   */
  input?: 'mount' | 'copy';
}

export async function decodeEmbedded(file: string, opts: EmbeddedOptions): Promise<DecodeResult> {
  const sampleRate = opts.sampleRate ?? 16000;
  const { signal } = opts;
  if (signal?.aborted) throw abortError(signal);
  const fd = openSync(file, 'r');
  try {
    const core = await loadEmbeddedCore();
    const log: string[] = [];
    core.setLogger((e) => log.push(e.message));
    const FS = core.FS;
    const workerfs = FS.filesystems.WORKERFS;
    workerfs.reader = diskReader;
    const name = basename(file).replace(/[^\w.-]/g, '_') || 'input';
    FS.mkdir('/footage');
    if (opts.input === 'copy') FS.writeFile(`/footage/${name}`, readFileSync(file));
    else FS.mount(workerfs, { blobs: [{ name, data: fileSlice(fd, 0, fstatSync(fd).size) }] }, '/footage');

    let failed: unknown = null;
    const chunker = new PcmChunker((pcm) => {
      opts.onChunk(pcm);
      opts.onProgress?.(chunker.samples / sampleRate);
    });
    const dev = FS.makedev(64, 0);
    FS.registerDevice(dev, {
      open: () => {},
      close: () => {},
      write: (_s: unknown, buffer: Int8Array, offset: number, length: number) => {
        if (failed) throw new FS.ErrnoError(EIO);
        if (signal?.aborted) {
          failed = abortError(signal);
          throw new FS.ErrnoError(EIO);
        }
        try {
          chunker.push(new Uint8Array(buffer.buffer, buffer.byteOffset + offset, length));
        } catch (err) {
          failed = err;
          throw new FS.ErrnoError(EIO);
        }
        return length;
      },
    });
    FS.mkdev('/pcm-out', dev);
    const code = core.exec('-hide_banner', '-v', 'error', ...pcmArgs(`/footage/${name}`, sampleRate, '/pcm-out'));
    if (failed) throw failed;
    if (code !== 0) throw decodeFailure(file, 'embedded', log);
    return { engine: 'embedded', sampleRate, samples: chunker.samples, seconds: chunker.samples / sampleRate };
  } finally {
    closeSync(fd);
  }
}
