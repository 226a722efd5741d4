export type DecodeEngine = 'native' | 'embedded';

export interface DecodeOptions {
  /** Output rate, Hz (default 16000: enough for whistles up to 4.5 kHz and a harmonic). */
  sampleRate?: number;
  /** Receives mono float32 PCM in order, as it is decoded. */
  onChunk: (pcm: Float32Array) => void;
  signal?: AbortSignal;
  /** Seconds of audio decoded so far. */
  onProgress?: (seconds: number) => void;
}

export interface DecodeResult {
  engine: DecodeEngine;
  sampleRate: number;
  samples: number;
  seconds: number;
}

/** ffmpeg arguments shared by both engines, so their output is the same. */
export function pcmArgs(input: string, sampleRate: number, output: string): string[] {
  return ['-i', input, '-map', '0:a:0', '-vn', '-ac', '1', '-ar', String(sampleRate), '-f', 'f32le', '-c:a', 'pcm_f32le', output];
}

/** Turns the last lines of ffmpeg's log into a message an analyst can act on. */
export function decodeFailure(file: string, engine: DecodeEngine, log: string[]): Error {
  const text = log.join('\n');
  if (/matches no streams|does not contain any stream/.test(text)) {
    return new Error(`${file}: the file has no audio track, so there is nothing to find whistles in. Choose footage with sound.`);
  }
  if (/No such file or directory/.test(text)) return new Error(`${file}: file not found. Check the path.`);
  if (/Invalid data found|moov atom not found|could not find codec/i.test(text)) {
    return new Error(`${file}: not a media file ffmpeg can read, or it is damaged (${engine} decoder said: ${lastLine(log)}). Check the file plays.`);
  }
  return new Error(`${file}: audio decode failed (${engine} ffmpeg): ${lastLine(log)}`);
}

function lastLine(log: string[]): string {
  return log.filter((l) => l.trim()).slice(-1)[0]?.trim() ?? 'no message';
}

export function abortError(signal: AbortSignal): unknown {
  return signal.reason ?? Object.assign(new Error('audio decode cancelled'), { name: 'AbortError' });
}
