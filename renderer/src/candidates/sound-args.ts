/**
 * ffmpeg arguments for the whistle scan's sound in the app's worker: the same as the host's
 * (electron/host/audio/decode-types.ts pcmArgs; a unit test keeps them equal), so the app
 * and `whistlemark whistles` hear the same samples. 16 kHz mono float32.
 */
export const SOUND_RATE = 16000;

export function soundArgs(input = '{input}', output = '{output}', sampleRate = SOUND_RATE): string[] {
  return ['-i', input, '-map', '0:a:0', '-vn', '-ac', '1', '-ar', String(sampleRate), '-f', 'f32le', '-c:a', 'pcm_f32le', output];
}
