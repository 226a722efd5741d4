/**
 * Streaming whistle detector on mono PCM: feed chunks of any length with `push`, call
 * `finish` at the end; each returns the candidates completed so far. State (the samples
 * of a partly filled frame, an open blast, a group waiting for a second blast) is kept
 * between calls, so a 90-minute file can go through in pieces, in a worker.
 *
 * Method (../shared/DESIGN.md): short-time spectrum (Hann window, ~32 ms frames, 10 ms
 * hop); a frame is tonal when its strongest bin in 2–4.5 kHz stands well above the band's
 * median and the harmonic at 2f stands out; a blast is a run of tonal frames with a smooth
 * pitch lasting >= 0.15 s; blasts less than 0.6 s apart form one double (or multiple)
 * candidate.
 *
 * Example:
 *   const d = new WhistleDetector({ sampleRate: 16000 });
 *   const found = [...d.push(chunk1), ...d.push(chunk2), ...d.finish()];
 */
import { BlastGrouper } from './blast-grouper.ts';
import { BlastTracker } from './blast-tracker.ts';
import { RealFft } from './fft.ts';
import { TonalFrameAnalyser } from './tonal-frame.ts';
import { resolveOptions, type WhistleCandidate, type WhistleDetectorOptions } from './whistle-types.ts';

export class WhistleDetector {
  readonly sampleRate: number;
  readonly frameSize: number;
  readonly hopSize: number;
  private readonly fft: RealFft;
  private readonly hann: Float64Array;
  private readonly frame: Float64Array;
  private readonly power: Float64Array;
  private readonly analyser: TonalFrameAnalyser;
  private readonly tracker: BlastTracker;
  private readonly grouper: BlastGrouper;
  /** Samples not yet consumed by a full frame; starts at sample `bufferStart` of the stream. */
  private buffer = new Float32Array(0);
  private frameIndex = 0;
  private samplesSeen = 0;
  private finished = false;

  constructor(options: WhistleDetectorOptions) {
    const opts = resolveOptions(options);
    this.sampleRate = opts.sampleRate;
    // ~32 ms frames: fine enough in time for 0.15 s blasts, ~31 Hz bins at 16 kHz.
    this.frameSize = 2 ** Math.round(Math.log2(0.032 * opts.sampleRate));
    this.hopSize = Math.round(0.01 * opts.sampleRate);
    this.fft = new RealFft(this.frameSize);
    this.hann = new Float64Array(this.frameSize);
    for (let i = 0; i < this.frameSize; i++) this.hann[i] = 0.5 - 0.5 * Math.cos((2 * Math.PI * i) / this.frameSize);
    this.frame = new Float64Array(this.frameSize);
    this.power = new Float64Array(this.frameSize / 2 + 1);
    this.analyser = new TonalFrameAnalyser(opts, this.frameSize);
    const hopS = this.hopSize / opts.sampleRate;
    this.tracker = new BlastTracker(opts, hopS, this.frameSize / 2 / opts.sampleRate);
    this.grouper = new BlastGrouper(opts.groupGapS);
  }

  /** Seconds of audio fed so far. */
  get secondsSeen(): number {
    return this.samplesSeen / this.sampleRate;
  }

  push(chunk: Float32Array): WhistleCandidate[] {
    if (this.finished) throw new Error('whistle detector: push after finish; make a new detector for a new stream');
    this.samplesSeen += chunk.length;
    const data = this.buffer.length ? concat(this.buffer, chunk) : chunk;
    const out: WhistleCandidate[] = [];
    let start = 0;
    while (start + this.frameSize <= data.length) {
      this.analyseFrame(data, start, out);
      start += this.hopSize;
    }
    this.buffer = data.slice(start);
    return out;
  }

  finish(): WhistleCandidate[] {
    this.finished = true;
    const out: WhistleCandidate[] = [];
    const blast = this.tracker.flush();
    if (blast) this.keep(this.grouper.add(blast), out);
    this.keep(this.grouper.flush(), out);
    return out;
  }

  private analyseFrame(data: Float32Array, start: number, out: WhistleCandidate[]): void {
    const { frame, hann } = this;
    for (let i = 0; i < this.frameSize; i++) frame[i] = data[start + i] * hann[i];
    this.fft.power(frame, this.power);
    const tonal = this.analyser.analyse(this.power);
    const index = this.frameIndex++;
    const blast = this.tracker.push(index, tonal);
    if (blast) this.keep(this.grouper.add(blast), out);
    const nowS = (index * this.hopSize + this.frameSize / 2) / this.sampleRate;
    this.keep(this.grouper.advance(nowS, this.tracker.openOnsetS), out);
  }

  private keep(c: WhistleCandidate | null, out: WhistleCandidate[]): void {
    if (c) out.push(c);
  }
}

function concat(a: Float32Array, b: Float32Array): Float32Array {
  const out = new Float32Array(a.length + b.length);
  out.set(a, 0);
  out.set(b, a.length);
  return out;
}
