/**
 * The lead-in of an embedded export: the title card's frames and the silence under them,
 * fed to mediabunny's Conversion through its `process` hooks. The first source frame (and
 * first audio chunk) of the clip is handed back behind the card's frames (or silence), and
 * every later one is moved later by the card's length, so one encoder writes card and clip
 * in a single pass (no second encode, no join, one decoder configuration).
 *
 *   const lead = leadIn(card, frames, step, width, height);
 *   video process: (s) => lead.video(drawnCanvas, s)    audio process: (s) => lead.audio(s)
 */
import { AudioSample, VideoSample } from 'mediabunny';
import { drawTitleCard, type TitleCard } from './title-card.ts';

export interface LeadIn {
  /** Seconds the clip is moved later by (whole frames of the card). */
  shiftS: number;
  /** The drawn picture of one source frame, moved; the card's frames first on the first call. */
  video(picture: OffscreenCanvas, sample: VideoSample): VideoSample[];
  /** One audio chunk, moved; silence under the card first on the first call. */
  audio(sample: AudioSample): AudioSample[];
}

/**
 * Median frame interval of the footage around `at` (the PTS table's own rate, so 29.97 fps
 * footage gets 1001/30000 s frames, not 1/30).
 */
export function frameStepAt(pts: ArrayLike<number>, at: number): number {
  const steps: number[] = [];
  const from = Math.max(0, Math.min(at, pts.length - 9));
  for (let i = from; i + 1 < pts.length && steps.length < 8; i++) steps.push(pts[i + 1] - pts[i]);
  const good = steps.filter((s) => s > 0).sort((a, b) => a - b);
  return good.length ? good[good.length >> 1] : 1 / 25;
}

/** One card frame drawn once; every card frame is a clone of it (one picture in memory). */
function cardPicture(card: TitleCard, width: number, height: number): OffscreenCanvas {
  const canvas = new OffscreenCanvas(width, height);
  const ctx = canvas.getContext('2d', { alpha: false })!;
  drawTitleCard(ctx, width, height, card);
  return canvas;
}

export function leadIn(card: TitleCard, frames: number, step: number, width: number, height: number): LeadIn {
  const shiftS = frames * step;
  const picture = cardPicture(card, width, height);
  let videoStarted = false;
  let audioStarted = false;

  const cardFrames = (): VideoSample[] => {
    const base = new VideoSample(picture, { timestamp: 0, duration: step });
    const out: VideoSample[] = [];
    for (let i = 0; i < frames; i++) {
      const s = base.clone();
      s.setTimestamp(i * step);
      s.setDuration(step);
      out.push(s);
    }
    base.close();
    return out;
  };

  return {
    shiftS,
    video(drawn, sample) {
      const moved = new VideoSample(drawn, { timestamp: sample.timestamp + shiftS, duration: sample.duration });
      if (videoStarted) return [moved];
      videoStarted = true;
      return [...cardFrames(), moved];
    },
    audio(sample) {
      const moved = sample.clone();
      moved.setTimestamp(sample.timestamp + shiftS);
      if (audioStarted) return [moved];
      audioStarted = true;
      // Zeros in the chunk's own layout, so the encoder sees one constant format throughout.
      const n = Math.round(shiftS * sample.sampleRate);
      if (n <= 0) return [moved];
      const silence = new AudioSample({
        data: new Float32Array(n * sample.numberOfChannels),
        format: 'f32-planar',
        numberOfChannels: sample.numberOfChannels,
        sampleRate: sample.sampleRate,
        timestamp: 0,
      });
      return [silence, moved];
    },
  };
}
