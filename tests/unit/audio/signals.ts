/**
 * Test signals made in-test from a seeded PRNG: crowd-like noise and referee-like whistle
 * blasts (a pea whistle's tone: fundamental with a fast warble and strong harmonics,
 * common practice), mixed at a chosen SNR. No outside media needed.
 */

export function mulberry32(seed: number): () => number {
  return () => {
    seed = (seed + 0x6d2b79f5) | 0;
    let t = Math.imul(seed ^ (seed >>> 15), 1 | seed);
    t = (t + Math.imul(t ^ (t >>> 7), 61 | t)) ^ t;
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** Standard normal by Box–Muller. */
export function gaussian(rnd: () => number): () => number {
  return () => Math.sqrt(-2 * Math.log(rnd() + 1e-12)) * Math.cos(2 * Math.PI * rnd());
}

/**
 * Crowd-like noise: pink noise (Kellet's filter) whose loudness swells and falls over
 * seconds, with cheers (louder, brighter bursts) now and then, and a low murmur of many
 * detuned voices. RMS normalised to 1.
 */
export function crowdNoise(seconds: number, sampleRate: number, seed: number): Float32Array {
  const rnd = mulberry32(seed);
  const g = gaussian(rnd);
  const n = Math.round(seconds * sampleRate);
  const out = new Float32Array(n);
  let b0 = 0, b1 = 0, b2 = 0, b3 = 0, b4 = 0, b5 = 0, b6 = 0;
  let level = 1;
  let levelTarget = 1;
  let cheer = 0;
  // A few chanting voices: harmonic stacks (to ~15 × f0, 1/k amplitudes) whose pitch wanders,
  // so the band holds narrow, moving peaks that are not whistles.
  const voices = Array.from({ length: 4 }, () => ({ f0: 140 + rnd() * 160, phase: rnd() * 6.28, wander: 0 }));
  for (let i = 0; i < n; i++) {
    const w = g();
    b0 = 0.99886 * b0 + w * 0.0555179;
    b1 = 0.99332 * b1 + w * 0.0750759;
    b2 = 0.969 * b2 + w * 0.153852;
    b3 = 0.8665 * b3 + w * 0.3104856;
    b4 = 0.55 * b4 + w * 0.5329522;
    b5 = -0.7616 * b5 - w * 0.016898;
    const pink = b0 + b1 + b2 + b3 + b4 + b5 + b6 + w * 0.5362;
    b6 = w * 0.115926;
    if (i % sampleRate === 0) {
      levelTarget = 0.5 + rnd() * 1.5;
      if (rnd() < 0.08) cheer = 1;
    }
    level += (levelTarget - level) * (2 / sampleRate);
    cheer *= 1 - 1.5 / sampleRate;
    let murmur = 0;
    for (const v of voices) {
      v.wander = 0.9995 * v.wander + (rnd() - 0.5) * 0.05;
      v.phase += (2 * Math.PI * v.f0 * (1 + 0.03 * Math.tanh(v.wander))) / sampleRate;
      // sin(k p) by the Chebyshev recurrence: one sin and one cos per voice per sample.
      const s1 = Math.sin(v.phase);
      const twoCos = 2 * Math.cos(v.phase);
      let prev = 0;
      let cur = s1;
      for (let k = 1; k <= 15; k++) {
        murmur += cur / k;
        const next = twoCos * cur - prev;
        prev = cur;
        cur = next;
      }
    }
    out[i] = (level * (1 + 2 * cheer) * pink) / 3 + murmur * 0.05;
  }
  return normaliseRms(out);
}

/** Plain white Gaussian noise, RMS 1. */
export function whiteNoise(seconds: number, sampleRate: number, seed: number): Float32Array {
  const g = gaussian(mulberry32(seed));
  const out = new Float32Array(Math.round(seconds * sampleRate));
  for (let i = 0; i < out.length; i++) out[i] = g();
  return out;
}

export interface BlastSpec {
  onset: number;
  duration: number;
  hz: number;
}

/**
 * One blast, RMS 1 over its duration: fundamental with a ~30 Hz warble of ±2 % (the pea),
 * 2nd harmonic at −6 dB, 3rd at −12 dB, 10 ms attack and release.
 */
export function blastSamples(spec: BlastSpec, sampleRate: number, seed: number): Float32Array {
  const rnd = mulberry32(seed);
  const n = Math.round(spec.duration * sampleRate);
  const out = new Float32Array(n);
  const warbleHz = 25 + rnd() * 10;
  const depth = 0.02 * spec.hz;
  let phase = rnd() * 6.28;
  const ramp = 0.01 * sampleRate;
  for (let i = 0; i < n; i++) {
    const f = spec.hz + depth * Math.sin((2 * Math.PI * warbleHz * i) / sampleRate);
    phase += (2 * Math.PI * f) / sampleRate;
    const env = Math.min(1, i / ramp, (n - 1 - i) / ramp);
    out[i] = env * (Math.sin(phase) + 0.5 * Math.sin(2 * phase) + 0.25 * Math.sin(3 * phase));
  }
  return normaliseRms(out);
}

/** Adds blasts into noise so that each blast's RMS is `snrDb` above the noise's RMS (1). */
export function mixBlasts(noise: Float32Array, blasts: BlastSpec[], snrDb: number, sampleRate: number, seed: number): Float32Array {
  const out = Float32Array.from(noise);
  const gain = 10 ** (snrDb / 20);
  blasts.forEach((b, k) => {
    const s = blastSamples(b, sampleRate, seed + k);
    const at = Math.round(b.onset * sampleRate);
    for (let i = 0; i < s.length && at + i < out.length; i++) out[at + i] += gain * s[i];
  });
  return out;
}

function normaliseRms(x: Float32Array): Float32Array {
  let sum = 0;
  for (let i = 0; i < x.length; i++) sum += x[i] * x[i];
  const rms = Math.sqrt(sum / Math.max(1, x.length)) || 1;
  for (let i = 0; i < x.length; i++) x[i] /= rms;
  return x;
}

/** Referee-like whistles across a recording: singles and doubles at random times. */
export function whistlePlan(seconds: number, count: number, seed: number): { whistles: BlastSpec[][]; blasts: BlastSpec[] } {
  const rnd = mulberry32(seed);
  const whistles: BlastSpec[][] = [];
  const spacing = seconds / count;
  for (let k = 0; k < count; k++) {
    const t = k * spacing + 1 + rnd() * (spacing - 4);
    const hz = 2300 + rnd() * 1400;
    const first = { onset: t, duration: 0.2 + rnd() * 0.6, hz };
    if (rnd() < 0.35) {
      const second = { onset: first.onset + first.duration + 0.12 + rnd() * 0.25, duration: 0.15 + rnd() * 0.3, hz: hz + (rnd() - 0.5) * 100 };
      whistles.push([first, second]);
    } else whistles.push([first]);
  }
  return { whistles, blasts: whistles.flat() };
}
