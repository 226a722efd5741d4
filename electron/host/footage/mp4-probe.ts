/**
 * MP4 / MOV probe with mp4box (npm mp4box, GPAC's parser): the sample tables in the moov
 * box give every frame's composition time and sync flag without decoding anything.
 * The file is streamed into mp4box in chunks, following the offsets it asks for, so a
 * 3 GB recording costs a few reads around the moov box rather than 3 GB of memory.
 */
import { open } from 'node:fs/promises';
import { createFile, Log, MP4BoxBuffer, type Movie, type Track } from 'mp4box';
import type { FootageProbe } from '../../../shared-types/domain.ts';
import { frameTable } from './frame-table.ts';

const CHUNK = 1 << 20;

// mp4box prints warnings about boxes it skips; only its errors matter to the analyst.
Log.setLogLevel(Log.error);

/** Reads the file into mp4box until its moov is parsed (or the whole file, if fragmented). */
async function parseMovie(path: string) {
  const mp4 = createFile(false);
  let info: Movie | undefined;
  let failure: string | undefined;
  mp4.onReady = (movie) => {
    info = movie;
  };
  mp4.onError = (module: string, message: string) => {
    failure = `${module}: ${message}`;
  };
  const handle = await open(path, 'r');
  try {
    const { size } = await handle.stat();
    let position = 0;
    let reads = 0;
    while (position < size) {
      const length = Math.min(CHUNK, size - position);
      const buf = Buffer.alloc(length);
      const { bytesRead } = await handle.read(buf, 0, length, position);
      if (bytesRead === 0) break;
      const ab = buf.buffer.slice(buf.byteOffset, buf.byteOffset + bytesRead);
      const next = mp4.appendBuffer(MP4BoxBuffer.fromArrayBuffer(ab, position), position + bytesRead >= size);
      if (failure) break;
      // A plain (non-fragmented) file is complete once the moov is read.
      if (info && !info.isFragmented) break;
      position = typeof next === 'number' && next > position ? next : position + bytesRead;
      if (++reads > 1_000_000) throw new Error('mp4 parser did not advance');
    }
    mp4.flush();
  } finally {
    await handle.close();
  }
  if (failure) throw new Error(`${path}: not a readable MP4/MOV file (${failure}); check that the recording finished writing`);
  if (!info || !info.hasMoov) throw new Error(`${path}: no movie header (moov box) found; the recording may be incomplete`);
  return { mp4, info };
}

/** Ticks (media timescale) the edit list cuts from the front, minus leading empty edits. */
function editOffset(track: Track): number {
  let offset = 0;
  for (const e of track.edits ?? []) {
    if (e.media_time === -1) {
      // An empty edit delays the track: movie timescale -> media timescale.
      offset -= (e.segment_duration * track.timescale) / track.movie_timescale;
      continue;
    }
    offset += e.media_time;
    break;
  }
  return offset;
}

/** Short codec name in ffprobe's spelling where the sample entry is well known. */
function codecName(fourcc: string): string {
  const entry = fourcc.split('.')[0];
  const names: Record<string, string> = {
    avc1: 'h264', avc3: 'h264', hvc1: 'hevc', hev1: 'hevc', vp09: 'vp9', vp08: 'vp8',
    av01: 'av1', mp4a: 'aac', Opus: 'opus', opus: 'opus', mp4v: 'mpeg4', 'ac-3': 'ac3', 'ec-3': 'eac3',
  };
  return names[entry] ?? entry;
}

export async function probeMp4(path: string, container: string): Promise<FootageProbe> {
  const { mp4, info } = await parseMovie(path);
  const video = info.videoTracks[0];
  if (!video) throw new Error(`${path}: the file has no video track`);
  const samples = mp4.getTrackSamplesInfo(video.id);
  if (samples.length === 0) throw new Error(`${path}: the video track has no frames`);
  const table = frameTable(
    samples.map((s) => ({ ticks: s.cts, key: s.is_sync })),
    video.timescale,
    editOffset(video),
  );
  const last = samples.reduce((m, s) => Math.max(m, s.cts + s.duration), 0);
  const first = samples.reduce((m, s) => Math.min(m, s.cts), Infinity);
  const audio = info.audioTracks[0];
  return {
    container,
    videoCodec: codecName(video.codec),
    audioCodec: audio ? codecName(audio.codec) : undefined,
    width: video.video?.width ?? video.track_width,
    height: video.video?.height ?? video.track_height,
    startTime: table.startTime,
    duration: (last - first) / video.timescale,
    nominalFps: table.nominalFps,
    measuredFps: table.measuredFps,
    variableRate: table.variableRate,
    frameCount: table.pts.length,
    pts: table.pts,
    keyframes: table.keyframes,
    hasAudio: Boolean(audio),
    audioSampleRate: audio?.audio?.sample_rate,
    audioChannels: audio?.audio?.channel_count,
  };
}
