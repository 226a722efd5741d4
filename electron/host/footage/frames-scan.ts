/**
 * Host service: the cut candidates of one footage file — decode small grey frames (native
 * ffmpeg or the embedded core) straight into the streaming cut detector, each frame timed
 * by the probed presentation table (so variable-rate and offset files get true times).
 *
 * Example: `const { cuts } = await scanFootageCuts('match.mp4', { signal })`
 */
import { CutDetector, FrameSplitter, ptsTimer, type CutCandidate, type CutDetectorOptions } from '../../../engine/cuts/index.ts';
import type { FootageProbe } from '../../../shared-types/domain.ts';
import type { DecodeEngine } from '../audio/decode-types.ts';
import { CUT_FRAME_HEIGHT, CUT_FRAME_WIDTH, decodeRaw, lumaFrameArgs, pickEngine } from './frames-decode.ts';
import { probeFootageFile } from './probe.ts';

export interface CutScanFileOptions extends Omit<CutDetectorOptions, 'width' | 'height'> {
  engine?: DecodeEngine | 'auto';
  signal?: AbortSignal;
  /** The file's probe when the caller has it (else it is probed here). */
  probe?: FootageProbe;
  /** Frames scanned, of how many, and cuts found so far. */
  onProgress?: (frames: number, total: number, found: number) => void;
}

export interface FootageCutScan {
  engine: DecodeEngine;
  frames: number;
  /** Frames the probe lists (frames may differ by a few when a decoder drops broken ones). */
  probedFrames: number;
  cuts: CutCandidate[];
}

export async function scanFootageCuts(file: string, opts: CutScanFileOptions = {}): Promise<FootageCutScan> {
  const { engine: wanted, signal, probe: given, onProgress, ...detectorOptions } = opts;
  const probe = given ?? (await probeFootageFile(file));
  const engine = pickEngine(wanted);
  const detector = new CutDetector({ ...detectorOptions, width: CUT_FRAME_WIDTH, height: CUT_FRAME_HEIGHT });
  const cuts: CutCandidate[] = [];
  const splitter = new FrameSplitter(CUT_FRAME_WIDTH * CUT_FRAME_HEIGHT, ptsTimer(probe.pts, probe.nominalFps), (luma, t, i) => {
    cuts.push(...detector.push(luma, t));
    if (i % 250 === 0) onProgress?.(i, probe.frameCount, cuts.length);
  });
  await decodeRaw(file, lumaFrameArgs('{input}', '{output}'), engine, { onBytes: (b) => splitter.push(b), signal });
  cuts.push(...detector.finish());
  onProgress?.(splitter.frames, probe.frameCount, cuts.length);
  return { engine, frames: splitter.frames, probedFrames: probe.frameCount, cuts };
}
