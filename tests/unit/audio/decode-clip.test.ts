import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { WhistleDetector, type WhistleCandidate } from '../../../engine/audio/index.ts';
import { decodeAudio, findNativeFfmpeg, type DecodeEngine } from '../../../electron/host/audio/decode.ts';

// Reference media: fixtures/reference/audio/whistle-clip.mp4, made by Debian's ffmpeg 5.1
// (sine + anoisesrc lavfi sources) with the command in make-whistle-clip.sh; the blast
// times the command put in are in whistle-clip.json.
const dir = new URL('../../../fixtures/reference/audio/', import.meta.url).pathname;
const clip = join(dir, 'whistle-clip.mp4');
const reference = JSON.parse(readFileSync(join(dir, 'whistle-clip.json'), 'utf8')) as {
  whistles: { pattern: string; blasts: [number, number][]; hz: number }[];
  notWhistles: { from: number; to: number }[];
};
const native = findNativeFfmpeg() !== null;
const scratch = mkdtempSync(join(tmpdir(), 'wm-audio-'));
afterAll(() => rmSync(scratch, { recursive: true, force: true }));

async function decodeWhole(file: string, engine: DecodeEngine): Promise<Float32Array> {
  const parts: Float32Array[] = [];
  const r = await decodeAudio(file, { engine, onChunk: (c) => parts.push(c) });
  const all = new Float32Array(r.samples);
  let at = 0;
  for (const p of parts) {
    all.set(p, at);
    at += p.length;
  }
  expect(at).toBe(r.samples);
  return all;
}

function detectAll(pcm: Float32Array): WhistleCandidate[] {
  const d = new WhistleDetector({ sampleRate: 16000 });
  return [...d.push(pcm), ...d.finish()];
}

function expectReferenceWhistles(found: WhistleCandidate[]): void {
  expect(found.map((c) => c.pattern)).toEqual(reference.whistles.map((w) => w.pattern));
  found.forEach((c, i) => {
    const w = reference.whistles[i];
    c.blasts.forEach((b, k) => {
      expect(Math.abs(b.onset - w.blasts[k][0])).toBeLessThan(0.03);
      expect(Math.abs(b.offset - w.blasts[k][1])).toBeLessThan(0.03);
      expect(Math.abs(b.fundamentalHz - w.hz)).toBeLessThan(15);
    });
  });
  for (const n of reference.notWhistles) expect(found.filter((c) => c.offset > n.from && c.onset < n.to)).toEqual([]);
}

describe('decode + detect on the Debian-ffmpeg reference clip', () => {
  it('embedded ffmpeg.wasm: 16 s at 16 kHz mono; finds single, double, single at the command\'s times; skips the pure tone', async () => {
    const pcm = await decodeWhole(clip, 'embedded');
    // 16 s x 16000 Hz; AAC's priming and padding move the count by well under one 1024-sample frame.
    expect(Math.abs(pcm.length - 256_000)).toBeLessThan(1024);
    expectReferenceWhistles(detectAll(pcm));
  });
  it.skipIf(!native)('native ffmpeg gives the same samples as the embedded core (same ffmpeg 5.1, same arguments)', async () => {
    const [a, b] = [await decodeWhole(clip, 'native'), await decodeWhole(clip, 'embedded')];
    expect(a.length).toBe(b.length);
    let worst = 0;
    for (let i = 0; i < a.length; i++) worst = Math.max(worst, Math.abs(a[i] - b[i]));
    // Float32 rounding of the same arithmetic; one 16-bit LSB is 3e-5.
    expect(worst).toBeLessThan(1e-6);
    expectReferenceWhistles(detectAll(a));
  });
  it('embedded decode stops when its AbortSignal fires, and the next decode still works', async () => {
    const ctl = new AbortController();
    let chunks = 0;
    const run = decodeAudio(clip, { engine: 'embedded', signal: ctl.signal, onChunk: () => ++chunks === 2 && ctl.abort() });
    await expect(run).rejects.toThrow(/abort/i);
    expect(chunks).toBe(2);
    expect((await decodeWhole(clip, 'embedded')).length).toBeGreaterThan(250_000);
  });
  it('embedded decode stops on an abort from outside its callbacks (it runs in a worker thread)', async () => {
    const ctl = new AbortController();
    let chunks = 0;
    const run = decodeAudio(clip, {
      engine: 'embedded',
      signal: ctl.signal,
      onChunk: () => {
        // The abort comes from a later task, as a Cancel button's would.
        if (++chunks === 1) setTimeout(() => ctl.abort(), 0);
      },
    });
    await expect(run).rejects.toThrow(/abort/i);
  });
  it.skipIf(!native)('native decode stops when its AbortSignal fires', async () => {
    const ctl = new AbortController();
    const run = decodeAudio(clip, { engine: 'native', signal: ctl.signal, onChunk: () => ctl.abort() });
    await expect(run).rejects.toThrow(/abort/i);
  });
});

describe('decode failures say what and what to do', () => {
  const engines: DecodeEngine[] = native ? ['embedded', 'native'] : ['embedded'];
  for (const engine of engines) {
    it(`${engine}: footage without sound, a file that is not media, a missing file`, async () => {
      const silent = join(scratch, 'silent.mp4');
      if (native) {
        spawnSync('ffmpeg', ['-v', 'error', '-y', '-f', 'lavfi', '-i', 'testsrc=size=64x36:rate=5:duration=1', '-c:v', 'libx264', silent]);
        await expect(decodeAudio(silent, { engine, onChunk: () => {} })).rejects.toThrow(/silent\.mp4: the file has no audio track.*Choose footage with sound/);
      }
      const text = join(scratch, 'notes.mp4');
      writeFileSync(text, 'these are not video frames\n'.repeat(50));
      await expect(decodeAudio(text, { engine, onChunk: () => {} })).rejects.toThrow(/notes\.mp4: not a media file/);
      await expect(decodeAudio(join(scratch, 'missing.mp4'), { engine, onChunk: () => {} })).rejects.toThrow(/missing\.mp4.*(not found|ENOENT)/);
    });
  }
});
