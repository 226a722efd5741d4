/**
 * ffmpeg arguments for the cut detector's frames, shared by native ffmpeg (CLI, host), the
 * embedded core in Node and the embedded core in the app's worker, so every path feeds the
 * detector the same frames: the first video track, one frame out per frame in
 * (presentation order, no rate conversion), scaled to 64 × 36 by area averaging, grey.
 * '{input}' and '{output}' are filled in by each path.
 */
export const CUT_FRAME_WIDTH = 64;
export const CUT_FRAME_HEIGHT = 36;

export function lumaFrameArgs(input = '{input}', output = '{output}', width = CUT_FRAME_WIDTH, height = CUT_FRAME_HEIGHT): string[] {
  return [
    '-i', input,
    '-map', '0:v:0', '-an', '-sn', '-dn',
    '-fps_mode', 'passthrough',
    '-vf', `scale=${width}:${height}:flags=area,format=gray`,
    '-f', 'rawvideo', output,
  ];
}
