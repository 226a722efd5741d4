/**
 * A footage file served over HTTP (the host's /files/ or wmfile:// URL), read in place
 * by the embedded ffmpeg core in a worker: WORKERFS asks a Blob-like object for `size`
 * and `slice()`, and a reader for the bytes of each slice, synchronously (ffmpeg's read
 * call cannot wait). Synchronous XHR with a Range header is allowed in workers; reads
 * are served from 4 MB blocks kept in a small cache, so ffmpeg's 32 kB reads cost one
 * request per block and the whole file is never in memory.
 */

export const BLOCK_BYTES = 4 << 20;
const CACHED_BLOCKS = 4;

export class RangeFile {
  private readonly blocks = new Map<number, Uint8Array>();
  /** HTTP requests made (for the benchmark and the tests). */
  requests = 0;
  bytesFetched = 0;

  constructor(
    readonly url: string,
    readonly size: number,
    private readonly name: string,
  ) {}

  /** The bytes [from, to) of the file. */
  read(from: number, to: number): Uint8Array {
    const end = Math.min(to, this.size);
    const out = new Uint8Array(Math.max(0, end - from));
    let at = from;
    while (at < end) {
      const b = Math.floor(at / BLOCK_BYTES);
      const block = this.block(b);
      const offset = at - b * BLOCK_BYTES;
      const n = Math.min(block.length - offset, end - at);
      if (n <= 0) throw new Error(`${this.name}: the file ended at byte ${b * BLOCK_BYTES + block.length} of ${this.size}; was it changed while being scanned?`);
      out.set(block.subarray(offset, offset + n), at - from);
      at += n;
    }
    return out;
  }

  private block(b: number): Uint8Array {
    const hit = this.blocks.get(b);
    if (hit) {
      // Most recently used last.
      this.blocks.delete(b);
      this.blocks.set(b, hit);
      return hit;
    }
    const first = b * BLOCK_BYTES;
    const last = Math.min(this.size, first + BLOCK_BYTES) - 1;
    const xhr = new XMLHttpRequest();
    xhr.open('GET', this.url, false);
    xhr.responseType = 'arraybuffer';
    xhr.withCredentials = true;
    xhr.setRequestHeader('Range', `bytes=${first}-${last}`);
    xhr.send();
    if (xhr.status !== 206 && xhr.status !== 200) {
      throw new Error(`${this.name}: could not read bytes ${first}–${last} (HTTP ${xhr.status}). Is the file still there?`);
    }
    let bytes = new Uint8Array(xhr.response as ArrayBuffer);
    // A server that ignores Range sends the whole file: keep only the block asked for.
    if (xhr.status === 200 && bytes.length > last - first + 1) bytes = bytes.slice(first, last + 1);
    this.requests++;
    this.bytesFetched += bytes.length;
    this.blocks.set(b, bytes);
    if (this.blocks.size > CACHED_BLOCKS) this.blocks.delete(this.blocks.keys().next().value!);
    return bytes;
  }

  /** The Blob stand-in WORKERFS mounts: only size and slice are used. */
  blobLike(): RangeSlice {
    return new RangeSlice(this, 0, this.size);
  }
}

export class RangeSlice {
  constructor(
    readonly file: RangeFile,
    readonly start: number,
    readonly size: number,
  ) {}
  slice(from: number, to: number): RangeSlice {
    const a = Math.max(0, from);
    const b = Math.min(this.size, to ?? this.size);
    return new RangeSlice(this.file, this.start + a, Math.max(0, b - a));
  }
}

/** The reader WORKERFS calls in place of FileReaderSync. */
export const rangeReader = {
  readAsArrayBuffer(s: RangeSlice): ArrayBuffer {
    const bytes = s.file.read(s.start, s.start + s.size);
    return bytes.buffer as ArrayBuffer;
  },
};
