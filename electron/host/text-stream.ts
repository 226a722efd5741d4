/**
 * Node file streaming for the importers: text chunks from a file, UTF-8 safe across chunk
 * borders (TextDecoder in stream mode keeps a split multi-byte character for the next
 * chunk), byte-order mark stripped, abortable.
 *
 * for await (const chunk of readTextChunks('tracking.csv')) parser.push(chunk);
 */
import { createReadStream } from 'node:fs';
import { open } from 'node:fs/promises';

export interface ReadTextOptions {
  signal?: AbortSignal;
  /** Bytes per read; 1 MiB by default (big enough to amortise, small enough for steady progress). */
  chunkBytes?: number;
  /** Called with the byte count of each chunk read. */
  onBytes?: (n: number) => void;
}

export async function* readTextChunks(path: string, opts: ReadTextOptions = {}): AsyncIterable<string> {
  const stream = createReadStream(path, { highWaterMark: opts.chunkBytes ?? 1 << 20, signal: opts.signal });
  // ignoreBOM: false (the default) makes the decoder drop a leading byte-order mark.
  const decoder = new TextDecoder('utf-8');
  try {
    for await (const buf of stream as AsyncIterable<Buffer>) {
      opts.onBytes?.(buf.byteLength);
      const text = decoder.decode(buf, { stream: true });
      if (text.length) yield text;
    }
    const rest = decoder.decode();
    if (rest.length) yield rest;
  } finally {
    stream.destroy();
  }
}

/** The first `bytes` of a file as text, for detection; a character cut at the end is dropped. */
export async function readHead(path: string, bytes = 65536): Promise<string> {
  const fh = await open(path, 'r');
  try {
    const buf = Buffer.alloc(bytes);
    const { bytesRead } = await fh.read(buf, 0, bytes, 0);
    // stream: true keeps an incomplete trailing sequence back instead of emitting U+FFFD.
    return new TextDecoder('utf-8').decode(buf.subarray(0, bytesRead), { stream: true });
  } finally {
    await fh.close();
  }
}
