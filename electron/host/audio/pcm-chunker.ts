/**
 * Bytes of little-endian float32 PCM, arriving in pieces of any length, to whole
 * Float32Array chunks (a sample may straddle two pieces).
 */
export class PcmChunker {
  private carry = new Uint8Array(0);
  samples = 0;

  constructor(private readonly onChunk: (pcm: Float32Array) => void) {}

  push(bytes: Uint8Array): void {
    const all = this.carry.length ? concatBytes(this.carry, bytes) : bytes;
    const whole = all.length - (all.length % 4);
    if (whole > 0) {
      // Copy into a fresh, aligned buffer: the source may be a view into wasm memory or a
      // pooled Node buffer that is reused after this call.
      const pcm = new Float32Array(whole / 4);
      new Uint8Array(pcm.buffer).set(all.subarray(0, whole));
      this.samples += pcm.length;
      this.onChunk(pcm);
    }
    this.carry = all.slice(whole);
  }
}

function concatBytes(a: Uint8Array, b: Uint8Array): Uint8Array {
  const out = new Uint8Array(a.length + b.length);
  out.set(a, 0);
  out.set(b, a.length);
  return out;
}
