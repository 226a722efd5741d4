/**
 * Collects tracking samples as they stream in, in compact growable typed arrays, until the
 * whole file has been read and the frames can be laid out per period (normalise.ts).
 * One "entry" per frame as it appears in the file; one "sample" per object position.
 */
import type { ObjectRole, TeamSide, TrackedObject } from '../../../shared-types/domain.ts';
import { parseObjectId } from '../object-ids.ts';

class Growable<T extends Float64Array | Float32Array | Int32Array | Int16Array> {
  length = 0;
  constructor(public data: T) {}
  push(v: number): void {
    if (this.length === this.data.length) {
      const bigger = new (this.data.constructor as new (n: number) => T)(this.data.length * 2);
      bigger.set(this.data);
      this.data = bigger;
    }
    this.data[this.length++] = v;
  }
}

export class FrameStore {
  // Per entry (frame as it appears in the file).
  readonly entryFrame = new Growable(new Float64Array(1024));
  readonly entryTime = new Growable(new Float64Array(1024));
  readonly entryPeriod = new Growable(new Int16Array(1024));
  readonly entryLine = new Growable(new Int32Array(1024));
  // Per sample: grown together, so one push writes five monomorphic typed arrays.
  sampleCount = 0;
  sampleEntry = new Int32Array(4096);
  sampleObject = new Int16Array(4096);
  sampleX = new Float32Array(4096);
  sampleY = new Float32Array(4096);
  sampleZ = new Float32Array(4096);

  readonly objects: TrackedObject[] = [];
  private readonly objectIndex = new Map<string, number>();

  get entries(): number {
    return this.entryFrame.length;
  }

  /** Index of an object, registering it on first sight with what its id and columns say. */
  object(id: string, extra?: { team?: TeamSide; shirt?: number; role?: ObjectRole }): number {
    let i = this.objectIndex.get(id);
    if (i === undefined) {
      const info = parseObjectId(id);
      const obj: TrackedObject = { id, role: extra?.role ?? info.role };
      const team = extra?.team ?? info.team;
      const shirt = extra?.shirt ?? info.shirt;
      if (team && obj.role === 'player') obj.team = team;
      if (shirt !== undefined && Number.isFinite(shirt) && obj.role === 'player') obj.shirt = shirt;
      i = this.objects.length;
      this.objects.push(obj);
      this.objectIndex.set(id, i);
    }
    return i;
  }

  /**
   * Starts a new entry, unless `sameFrameJoins` (long layout: a row per object) and this
   * row belongs to the same frame as the last one.
   */
  entry(period: number, frame: number, time: number, line: number, sameFrameJoins = false): number {
    const n = this.entryFrame.length;
    if (sameFrameJoins && n > 0 && this.entryPeriod.data[n - 1] === period) {
      const f = this.entryFrame.data[n - 1];
      const t = this.entryTime.data[n - 1];
      // NaN means "not in the file"; two NaN count as equal here.
      if ((f === frame || (f !== f && frame !== frame)) && (t === time || (t !== t && time !== time))) return n - 1;
    }
    this.entryFrame.push(frame);
    this.entryTime.push(time);
    this.entryPeriod.push(period);
    this.entryLine.push(line);
    return n;
  }

  sample(entry: number, object: number, x: number, y: number, z: number): void {
    const k = this.sampleCount;
    if (k === this.sampleX.length) this.growSamples();
    this.sampleEntry[k] = entry;
    this.sampleObject[k] = object;
    this.sampleX[k] = x;
    this.sampleY[k] = y;
    this.sampleZ[k] = z;
    this.sampleCount = k + 1;
  }

  /**
   * Grows the sample arrays once to hold `n` samples in all (an estimate from the file
   * size), instead of doubling (and copying) them many times while a big file streams in.
   */
  expectSamples(n: number): void {
    if (n <= this.sampleX.length) return;
    const k = this.sampleCount;
    const grow = <T extends Int32Array | Int16Array | Float32Array>(a: T, make: (len: number) => T): T => {
      const b = make(n);
      b.set(a.subarray(0, k));
      return b;
    };
    this.sampleEntry = grow(this.sampleEntry, (len) => new Int32Array(len));
    this.sampleObject = grow(this.sampleObject, (len) => new Int16Array(len));
    this.sampleX = grow(this.sampleX, (len) => new Float32Array(len));
    this.sampleY = grow(this.sampleY, (len) => new Float32Array(len));
    this.sampleZ = grow(this.sampleZ, (len) => new Float32Array(len));
  }

  /**
   * Room for `n` more samples, counted as taken: the caller writes slots [start, start + n)
   * of the sample arrays itself (wide rows fill a whole row of objects at once, without a
   * call per sample). Read the arrays after this call: growing replaces them.
   */
  reserveSamples(n: number): number {
    const start = this.sampleCount;
    while (start + n > this.sampleX.length) this.growSamples();
    this.sampleCount = start + n;
    return start;
  }

  private growSamples(): void {
    const n = this.sampleX.length * 2;
    const e = new Int32Array(n);
    e.set(this.sampleEntry);
    this.sampleEntry = e;
    const o = new Int16Array(n);
    o.set(this.sampleObject);
    this.sampleObject = o;
    const x = new Float32Array(n);
    x.set(this.sampleX);
    this.sampleX = x;
    const y = new Float32Array(n);
    y.set(this.sampleY);
    this.sampleY = y;
    const z = new Float32Array(n);
    z.set(this.sampleZ);
    this.sampleZ = z;
  }
}
