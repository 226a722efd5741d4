/**
 * Reads what ffmpeg prints: the input summary on stderr ("Input #0, …", "Duration: …",
 * "Stream #0:0: Video: …") and the framecrc muxer's packet table (one line a packet:
 * stream, dts, pts, duration, size, checksum[, F=flags]; "#tb 0: 1/1000" gives the
 * time base). Plain text in, plain data out; no ffmpeg is run here.
 *
 * Example: parseFramecrc('#tb 0: 1/1000\n0, 7, 7, 20, 3900, 0x8034ac74\n')
 *   → { timebase: 1000, frames: [{ ticks: 7, key: true }] }
 */
import type { RawFrame } from './frame-table.ts';

export interface InputSummary {
  container: string;
  duration?: number;
  start?: number;
  video?: { codec: string; width: number; height: number; fps?: number };
  audio?: { codec: string; sampleRate?: number; channels?: number };
}

const LAYOUT_CHANNELS: Record<string, number> = {
  mono: 1, stereo: 2, '2.1': 3, '3.0': 3, quad: 4, '4.0': 4, '5.0': 5, '5.0(side)': 5,
  '5.1': 6, '5.1(side)': 6, '6.1': 7, '7.1': 8, '7.1(wide)': 8,
};

function seconds(hms: string): number {
  const [h, m, s] = hms.split(':').map(Number);
  return h * 3600 + m * 60 + s;
}

/** Parses the "Input #0" block of ffmpeg's stderr (the first video and audio stream). */
export function parseInputSummary(lines: string[]): InputSummary {
  const input = lines.find((l) => /^Input #0, /.test(l.trim()));
  if (!input) throw new Error('ffmpeg did not recognise the file as media');
  const container = input.trim().replace(/^Input #0, /, '').replace(/, from '.*$/, '');
  const summary: InputSummary = { container };
  for (const raw of lines) {
    const line = raw.trim();
    if (/^Output #/.test(line)) break;
    const d = line.match(/^Duration: (\d+:\d+:[\d.]+|N\/A)(?:, start: (-?[\d.]+))?/);
    if (d) {
      if (d[1] !== 'N/A') summary.duration = seconds(d[1]);
      if (d[2] !== undefined) summary.start = Number(d[2]);
      continue;
    }
    const v = line.match(/^Stream #0:\d+[^:]*: Video: ([\w-]+)/);
    if (v && !summary.video) {
      const size = line.match(/, (\d{2,5})x(\d{2,5})\b/);
      const fps = line.match(/, ([\d.]+) fps\b/);
      summary.video = {
        codec: v[1],
        width: size ? Number(size[1]) : 0,
        height: size ? Number(size[2]) : 0,
        fps: fps ? Number(fps[1]) : undefined,
      };
      continue;
    }
    const a = line.match(/^Stream #0:\d+[^:]*: Audio: ([\w-]+)/);
    if (a && !summary.audio) {
      const rate = line.match(/, (\d+) Hz\b/);
      const layout = line.match(/ Hz, ([^,]+)/);
      let channels: number | undefined;
      if (layout) {
        const name = layout[1].trim();
        const n = name.match(/^(\d+) channels/);
        channels = n ? Number(n[1]) : LAYOUT_CHANNELS[name];
      }
      summary.audio = { codec: a[1], sampleRate: rate ? Number(rate[1]) : undefined, channels };
    }
  }
  return summary;
}

/** Parses framecrc output for stream 0 (map only the video stream into it). */
export function parseFramecrc(text: string): { timebase: number; frames: RawFrame[] } {
  let timebase = 0;
  const frames: RawFrame[] = [];
  for (const line of text.split('\n')) {
    if (line.startsWith('#tb 0:')) {
      const m = line.match(/#tb 0: (\d+)\/(\d+)/);
      if (m) timebase = Number(m[2]) / Number(m[1]);
      continue;
    }
    if (line.startsWith('#') || line.trim() === '') continue;
    const cols = line.split(',').map((c) => c.trim());
    if (cols[0] !== '0' || cols.length < 6) continue;
    const pts = Number(cols[2]);
    if (!Number.isFinite(pts)) continue;
    const flagCol = cols.slice(6).find((c) => c.startsWith('F='));
    // framecrc writes F= only when the flags are not exactly "key".
    const key = flagCol ? (parseInt(flagCol.slice(2), 16) & 1) === 1 : true;
    frames.push({ ticks: pts, key });
  }
  if (!timebase) throw new Error('ffmpeg gave no time base for the video stream');
  return { timebase, frames };
}
