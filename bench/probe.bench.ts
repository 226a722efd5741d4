/**
 * Footage probe timings: our probeFootageFile (mp4box for MP4/MOV, ffmpeg.wasm framecrc
 * for Matroska/TS) against Debian's native ffprobe on the same files in the same run —
 * `ffprobe -show_frames` (what the tests compare with; it decodes every frame) and
 * `ffprobe -show_packets` (no decoding; the fairer like-for-like).
 * Files: the reference clips, then a 10-minute 720p recording made here by Debian's
 * ffmpeg in a temporary folder (MP4, and the same stream remuxed to Matroska), removed
 * afterwards. Prints figures and ratios; never fails on a timing.
 */
import { spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync, statSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { performance } from 'node:perf_hooks';
import { probeFootageFile } from '../electron/host/footage/probe.ts';

const refDir = new URL('../fixtures/reference/', import.meta.url).pathname;

function median(xs: number[]): number {
  const s = [...xs].sort((a, b) => a - b);
  return s[s.length >> 1];
}

async function timeOurs(path: string, runs: number): Promise<{ ms: number; frames: number }> {
  const times: number[] = [];
  let frames = 0;
  for (let i = 0; i < runs; i++) {
    const t0 = performance.now();
    frames = (await probeFootageFile(path)).frameCount;
    times.push(performance.now() - t0);
  }
  return { ms: median(times), frames };
}

function timeFfprobe(path: string, what: '-show_frames' | '-show_packets', runs: number): number {
  const times: number[] = [];
  for (let i = 0; i < runs; i++) {
    const t0 = performance.now();
    const r = spawnSync('ffprobe', ['-v', 'error', '-select_streams', 'v:0', what, '-of', 'json', path], { maxBuffer: 1 << 30 });
    if (r.status !== 0) throw new Error(`ffprobe failed on ${path}`);
    times.push(performance.now() - t0);
  }
  return median(times);
}

function row(name: string, size: number, ours: { ms: number; frames: number }, frames: number, packets: number) {
  console.log(
    [
      name.padEnd(22),
      `${(size / 1e6).toFixed(2).padStart(7)} MB`,
      `${String(ours.frames).padStart(6)} frames`,
      `ours ${ours.ms.toFixed(0).padStart(6)} ms`,
      `ffprobe -show_frames ${frames.toFixed(0).padStart(6)} ms (${(frames / ours.ms).toFixed(2)}x ours)`,
      `-show_packets ${packets.toFixed(0).padStart(6)} ms (${(packets / ours.ms).toFixed(2)}x ours)`,
    ].join('  '),
  );
}

console.log('Reference clips (median of 3 runs each):');
for (const name of ['cfr25.mp4', 'ntsc.mov', 'vfr.mp4', 'vfr.mkv', 'offset.m2t', 'cfr25.webm']) {
  const path = refDir + name;
  row(name, statSync(path).size, await timeOurs(path, 3), timeFfprobe(path, '-show_frames', 3), timeFfprobe(path, '-show_packets', 3));
}

const tmp = mkdtempSync(join(tmpdir(), 'wm-probe-bench-'));
try {
  const piece = join(tmp, 'piece-720p.mp4');
  const mp4 = join(tmp, 'long-720p.mp4');
  const mkv = join(tmp, 'long-720p.mkv');
  console.log('\nMaking a 10-minute 720p 25 fps H.264 recording with Debian ffmpeg: 20 s encoded, then looped');
  console.log('30 times without re-encoding (moov at the end, as recorders write it)…');
  const t0 = performance.now();
  const made = spawnSync('ffmpeg', [
    '-hide_banner', '-loglevel', 'error', '-y', '-f', 'lavfi', '-i', 'testsrc2=size=1280x720:rate=25:duration=20',
    '-c:v', 'libx264', '-preset', 'ultrafast', '-crf', '30', '-g', '50', '-pix_fmt', 'yuv420p', piece,
  ]);
  if (made.status !== 0) throw new Error(`ffmpeg could not make the long file: ${made.stderr}`);
  spawnSync('ffmpeg', ['-hide_banner', '-loglevel', 'error', '-y', '-stream_loop', '29', '-i', piece, '-c', 'copy', mp4]);
  spawnSync('ffmpeg', ['-hide_banner', '-loglevel', 'error', '-y', '-i', mp4, '-c', 'copy', mkv]);
  console.log(`  made in ${((performance.now() - t0) / 1000).toFixed(1)} s`);
  const heapBefore = process.memoryUsage().rss;
  row('long-720p.mp4', statSync(mp4).size, await timeOurs(mp4, 1), timeFfprobe(mp4, '-show_frames', 1), timeFfprobe(mp4, '-show_packets', 1));
  console.log(`  process RSS grew by ${((process.memoryUsage().rss - heapBefore) / 1e6).toFixed(0)} MB while probing the MP4 (file is streamed, not read whole)`);
  row('long-720p.mkv', statSync(mkv).size, await timeOurs(mkv, 1), timeFfprobe(mkv, '-show_frames', 1), timeFfprobe(mkv, '-show_packets', 1));
} finally {
  rmSync(tmp, { recursive: true, force: true });
}
