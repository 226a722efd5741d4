import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { probeFootageFile, sniffContainer } from '../../electron/host/footage/probe.ts';
import { frameTable, snapRate } from '../../electron/host/footage/frame-table.ts';
import { parseFramecrc, parseInputSummary } from '../../electron/host/footage/ffmpeg-log.ts';

// Reference: ffprobe (Debian ffmpeg 5.1) — `ffprobe -show_frames -show_streams -show_format`
// output committed beside each clip by fixtures/reference/make-reference.sh.
const refDir = new URL('../../fixtures/reference/', import.meta.url).pathname;

interface FfprobeJson {
  frames: { media_type: string; pts_time?: string; key_frame: number }[];
  streams: { codec_type: string; codec_name: string; width?: number; height?: number; r_frame_rate: string; sample_rate?: string; channels?: number }[];
  format: { format_name: string; start_time: string; duration: string };
}

function ffprobe(name: string): FfprobeJson {
  return JSON.parse(readFileSync(refDir + name + '.ffprobe.json', 'utf8')) as FfprobeJson;
}

function ratio(r: string): number {
  const [n, d] = r.split('/').map(Number);
  return n / d;
}

// Which clips the generating script made variable-rate (make-reference.sh, steps 3 and 4).
const clips: { name: string; variable: boolean }[] = [
  { name: 'cfr25.mp4', variable: false },
  { name: 'ntsc.mov', variable: false },
  { name: 'vfr.mp4', variable: true },
  { name: 'vfr.mkv', variable: true },
  { name: 'offset.m2t', variable: false },
  { name: 'cfr25.webm', variable: false },
  { name: 'fragmented.mp4', variable: false },
];

describe('probeFootageFile equals ffprobe (Debian ffmpeg 5.1) on the reference clips', () => {
  for (const clip of clips) {
    it(`${clip.name}: frame table, keyframes, start, streams — ffprobe (Debian ffmpeg 5.1)`, async () => {
      const ref = ffprobe(clip.name);
      const p = await probeFootageFile(refDir + clip.name);
      const frames = ref.frames.filter((f) => f.media_type === 'video');
      const firstPts = Number(frames[0].pts_time);
      expect(p.frameCount).toBe(frames.length);
      expect(p.pts.length).toBe(frames.length);
      // ffprobe prints six decimals: equal to within half a microsecond.
      frames.forEach((f, i) => expect(Math.abs(p.pts[i] - (Number(f.pts_time) - firstPts))).toBeLessThan(1e-6 + 1e-9));
      expect(p.keyframes).toEqual(frames.flatMap((f, i) => (f.key_frame === 1 ? [i] : [])));
      expect(p.startTime).toBeCloseTo(firstPts, 6);
      const v = ref.streams.find((s) => s.codec_type === 'video')!;
      expect(p.videoCodec).toBe(v.codec_name);
      expect([p.width, p.height]).toEqual([v.width, v.height]);
      const a = ref.streams.find((s) => s.codec_type === 'audio');
      expect(p.hasAudio).toBe(Boolean(a));
      if (a) {
        expect(p.audioCodec).toBe(a.codec_name);
        expect(p.audioSampleRate).toBe(Number(a.sample_rate));
        expect(p.audioChannels).toBe(a.channels);
      }
      expect(p.variableRate).toBe(clip.variable);
      // ffprobe's r_frame_rate is the nominal rate for constant-rate clips.
      if (!clip.variable) expect(p.nominalFps).toBeCloseTo(ratio(v.r_frame_rate), 9);
      // Measured rate: frames over the span of their timestamps, from ffprobe's own table.
      const span = Number(frames[frames.length - 1].pts_time) - firstPts;
      expect(p.measuredFps).toBeCloseTo((frames.length - 1) / span, 3);
      // The container duration also counts audio; ours is the video's: within one frame.
      expect(Math.abs(p.duration - Number(ref.format.duration))).toBeLessThanOrEqual(0.0401);
    });
  }
});

describe('container sniffing by magic numbers (ISO/IEC 14496-12 ftyp, EBML 1A45DFA3, MPEG-TS 0x47 every 188 bytes)', () => {
  it('recognises each reference clip', () => {
    const head = (n: string) => new Uint8Array(readFileSync(refDir + n).subarray(0, 940));
    expect(sniffContainer(head('cfr25.mp4'))).toBe('mp4');
    expect(sniffContainer(head('ntsc.mov'))).toBe('mov'); // 'qt  ' major brand of MOV files (ISO/IEC 14496-12 ftyp box, brand list from memory)
    expect(sniffContainer(head('vfr.mkv'))).toBe('matroska');
    expect(sniffContainer(head('cfr25.webm'))).toBe('matroska');
    expect(sniffContainer(head('offset.m2t'))).toBe('mpegts');
    expect(sniffContainer(new TextEncoder().encode('frame,player,x,y\n1,7,0.5,0.2\n'))).toBe('unknown');
  });
});

describe('frame table helpers', () => {
  it('sorts decode order into presentation order and keeps integer-tick precision (ffprobe prints 0.040000 for 3600/90000)', () => {
    // B-frame decode order I P B B as in H.264 (ITU-T H.264 reordering), ticks at 90 kHz (MPEG-TS clock).
    const t = frameTable([
      { ticks: 900000, key: true }, { ticks: 910800, key: false }, { ticks: 903600, key: false }, { ticks: 907200, key: false },
    ], 90000);
    expect(t.pts).toEqual([0, 0.04, 0.08, 0.12]);
    expect(t.startTime).toBe(10);
    expect(t.keyframes).toEqual([0]);
    expect(t.nominalFps).toBe(25);
    expect(t.variableRate).toBe(false);
  });
  it('does not call 1 ms Matroska rounding of 30000/1001 a variable rate (Matroska TimestampScale 1 ms, common practice)', () => {
    const ticks = Array.from({ length: 60 }, (_, i) => ({ ticks: Math.round((i * 1001) / 30), key: i === 0 }));
    const t = frameTable(ticks, 1000);
    expect(t.variableRate).toBe(false);
    expect(t.nominalFps).toBe(30000 / 1001);
  });
  it('snaps to the standard broadcast rates (common practice) and leaves others alone', () => {
    expect(snapRate(29.97)).toBe(30000 / 1001);
    expect(snapRate(25.01)).toBe(25);
    expect(snapRate(12.5)).toBe(12.5);
  });
  it('refuses a file without frames with a clear message', () => {
    expect(() => frameTable([], 1000)).toThrow(/no video frames/);
  });
});

describe('ffmpeg log parsing (format of ffmpeg 5.1 stderr and the framecrc muxer)', () => {
  it('reads the input summary and packet flags', () => {
    const s = parseInputSummary([
      "Input #0, matroska,webm, from '/in/input':",
      '  Duration: 00:01:03.97, start: -0.007000, bitrate: 248 kb/s',
      '  Stream #0:0: Video: vp9 (Profile 0), yuv420p(tv, progressive), 1280x720, SAR 1:1 DAR 16:9, 50 fps, 50 tbr, 1k tbn',
      '  Stream #0:1(eng): Audio: opus, 48000 Hz, 5.1, fltp',
    ]);
    expect(s).toEqual({ container: 'matroska,webm', duration: 63.97, start: -0.007, video: { codec: 'vp9', width: 1280, height: 720, fps: 50 }, audio: { codec: 'opus', sampleRate: 48000, channels: 6 } });
    const c = parseFramecrc('#tb 0: 1/90000\n#media_type 0: video\n0,   -3600,    3600,     3600,   100, 0x1\n0, 0, 10800, 3600, 50, 0x2, F=0x0\n0, 3600, 7200, 3600, 50, 0x3, F=0x5\n');
    expect(c.timebase).toBe(90000);
    expect(c.frames).toEqual([{ ticks: 3600, key: true }, { ticks: 10800, key: false }, { ticks: 7200, key: true }]);
  });
  it('says plainly when the input is not media', () => {
    expect(() => parseInputSummary(['/in/input: Invalid data found when processing input'])).toThrow(/did not recognise/);
  });
});

describe('probe errors name the file and what to do', () => {
  it('missing file', async () => {
    await expect(probeFootageFile('/nonexistent/whistlemark-missing.mp4')).rejects.toThrow(/whistlemark-missing\.mp4: file not found/);
  });
  it('a recording cut off before its moov box (recorder still writing, or crashed)', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'wm-probe-'));
    try {
      // cfr25.mp4 keeps its moov after the mdat (ffmpeg's default layout): the first 30 kB have none.
      writeFileSync(join(dir, 'cut.mp4'), readFileSync(refDir + 'cfr25.mp4').subarray(0, 30_000));
      await expect(probeFootageFile(join(dir, 'cut.mp4'))).rejects.toThrow(/cut\.mp4: no movie header \(moov box\) found; the recording may be incomplete/);
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });
  it('a text file handed in as footage', async () => {
    await expect(probeFootageFile(refDir + 'make-reference.sh')).rejects.toThrow(/make-reference\.sh: .*is this a video file\?/);
  });
});
