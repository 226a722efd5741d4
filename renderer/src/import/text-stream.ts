/**
 * Reading an opened file's URL as a stream of text chunks (UTF-8), without holding the
 * whole file: fetch -> TextDecoderStream -> async iterable for the importers.
 */
import type { TextChunks } from './importers.ts';

export type FetchLike = (url: string, init?: RequestInit) => Promise<Response>;

export class ReadFailure extends Error {}

export async function openTextStream(fetchFn: FetchLike, url: string, signal?: AbortSignal): Promise<TextChunks> {
  let res: Response;
  try {
    res = await fetchFn(url, signal ? { signal } : {});
  } catch (err) {
    if (signal?.aborted) throw err;
    throw new ReadFailure(`could not read the file (${(err as Error).message}). Check that it still exists and open it again.`);
  }
  if (!res.ok || !res.body) {
    throw new ReadFailure(`the app's file service answered ${res.status} ${res.statusText}. Open the file again.`);
  }
  const reader = res.body.pipeThrough(new TextDecoderStream('utf-8')).getReader();
  return {
    async *[Symbol.asyncIterator]() {
      try {
        for (;;) {
          const { done, value } = await reader.read();
          if (done) return;
          if (value) yield value;
        }
      } finally {
        reader.releaseLock();
      }
    },
  };
}

/** The first `bytes` of a file as text, cut at the last full line (for detection). */
export async function readHead(fetchFn: FetchLike, url: string, bytes = 64 * 1024): Promise<string> {
  const res = await fetchFn(url, { headers: { Range: `bytes=0-${bytes - 1}` } });
  if (!res.ok) throw new ReadFailure(`the app's file service answered ${res.status} ${res.statusText}. Open the file again.`);
  const buf = new Uint8Array(await res.arrayBuffer());
  // A server that ignores Range sends everything: keep only the head.
  const head = buf.subarray(0, Math.min(bytes, buf.length));
  const text = new TextDecoder('utf-8').decode(head);
  if (head.length < bytes) return text;
  const lastNl = text.lastIndexOf('\n');
  return lastNl > 0 ? text.slice(0, lastNl + 1) : text;
}
