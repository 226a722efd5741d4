/**
 * @techstark/opencv-js (OpenCV 4.10 compiled to WebAssembly, from the npm registry) as the
 * outside reference for homographies. Loaded once per test file.
 */
import { createRequire } from 'node:module';
import type { Vec2 } from '../../../engine/geometry/homography.ts';

// eslint-disable-next-line @typescript-eslint/no-explicit-any
type Cv = any;
let ready: Promise<{ cv: Cv }> | null = null;

/** `const { cv } = await loadOpenCv()` */
export function loadOpenCv(): Promise<{ cv: Cv }> {
  ready ??= (async () => {
    // require, not import(): the module object is a thenable that never settles, so an
    // awaited import() hangs; wait on the runtime hook instead.
    const cv: Cv = createRequire(import.meta.url)('@techstark/opencv-js');
    if (!cv.Mat) await new Promise<void>((resolve) => (cv.onRuntimeInitialized = () => resolve()));
    // Boxed: cv itself has a then(), so returning it bare from a promise would hang too.
    return { cv };
  })();
  return ready;
}

/** cv.findHomography(pitch, image, method, threshold): the matrix and the inlier mask. */
export function cvFindHomography(cv: Cv, pitch: readonly Vec2[], image: readonly Vec2[], ransacThreshold?: number): { h: number[]; mask: boolean[] } {
  const src = cv.matFromArray(pitch.length, 1, cv.CV_64FC2, pitch.flat());
  const dst = cv.matFromArray(image.length, 1, cv.CV_64FC2, image.flat());
  const mask = new cv.Mat();
  const H = ransacThreshold === undefined ? cv.findHomography(src, dst, 0, 3, mask) : cv.findHomography(src, dst, cv.RANSAC, ransacThreshold, mask, 2000, 0.995);
  const h = Array.from(H.data64F as Float64Array);
  const m = Array.from(mask.data as Uint8Array).map((x) => x !== 0);
  for (const x of [src, dst, mask, H]) x.delete();
  return { h, mask: m };
}
