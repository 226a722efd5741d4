import { beforeAll, describe, expect, it } from 'vitest';
import { Matrix, SingularValueDecomposition } from 'ml-matrix';
import { rightSvd } from '../../../engine/geometry/linalg.ts';
import { applyHomography, composeHomography, GeometryError, invertHomography, reprojectionErrors, solveHomography, type Vec2 } from '../../../engine/geometry/homography.ts';
import { fitHomography } from '../../../engine/geometry/ransac.ts';
import { refineHomography } from '../../../engine/geometry/refine.ts';
import { seededRandom } from '../../../engine/geometry/prng.ts';
import { cvFindHomography, loadOpenCv } from './opencv.ts';
import { maxGridDisagreement, scene, visibleGrid } from './points.ts';

// eslint-disable-next-line @typescript-eslint/no-explicit-any
let cv: any;
beforeAll(async () => {
  ({ cv } = await loadOpenCv());
});

describe('Jacobi SVD against ml-matrix (npm) SingularValueDecomposition', () => {
  it('gives the same singular values and right singular vectors on random matrices', () => {
    const rnd = seededRandom(3);
    let worstValue = 0;
    let worstVector = 0;
    for (let trial = 0; trial < 40; trial++) {
      const m = 9 + Math.floor(rnd() * 30);
      const a = Array.from({ length: m * 9 }, () => rnd() * 2 - 1);
      const ours = rightSvd(a, m, 9);
      const ref = new SingularValueDecomposition(new Matrix(Array.from({ length: m }, (_, r) => a.slice(r * 9, r * 9 + 9))));
      const V = ref.rightSingularVectors;
      for (let k = 0; k < 9; k++) {
        worstValue = Math.max(worstValue, Math.abs(ours.values[k] - ref.diagonal[k]) / ref.diagonal[0]);
        let dot = 0;
        for (let i = 0; i < 9; i++) dot += ours.v[i * 9 + k] * V.get(i, k);
        worstVector = Math.max(worstVector, 1 - Math.abs(dot));
      }
    }
    console.log(`SVD vs ml-matrix: worst relative singular value difference ${worstValue.toExponential(2)}, worst 1-|cos| of vectors ${worstVector.toExponential(2)}`);
    expect(worstValue).toBeLessThan(1e-12);
    expect(worstVector).toBeLessThan(1e-9);
  });
});

describe('normalised DLT', () => {
  it('recovers a known homography exactly from 4 and from 20 clean points', () => {
    for (const n of [4, 20]) {
      const s = scene(11, n, 0);
      const h = solveHomography(s.pitch, s.image);
      for (let i = 0; i < 9; i++) expect(h[i]).toBeCloseTo(s.h[i], 6);
    }
  });

  it('maps the unit square example of the doc comment', () => {
    const h = solveHomography([[0, 0], [1, 0], [1, 1], [0, 1]], [[10, 10], [20, 10], [20, 20], [10, 20]]);
    [10, 0, 10, 0, 10, 10, 0, 0, 1].forEach((v, i) => expect(h[i]).toBeCloseTo(v, 9));
  });

  it('inverts and composes: H⁻¹·H is the identity and inverse maps image back to pitch', () => {
    const s = scene(5, 8, 0);
    const inv = invertHomography(s.h);
    const id = composeHomography(inv, s.h);
    [1, 0, 0, 0, 1, 0, 0, 0, 1].forEach((v, i) => expect(id[i]).toBeCloseTo(v, 9));
    for (let k = 0; k < s.pitch.length; k++) {
      const back = applyHomography(inv, s.clean[k]);
      expect(back[0]).toBeCloseTo(s.pitch[k][0], 6);
      expect(back[1]).toBeCloseTo(s.pitch[k][1], 6);
    }
  });

  it('agrees with OpenCV findHomography (least squares, method 0) on random noisy point sets', () => {
    const rows: string[] = [];
    const ds: number[] = [];
    let worstRatio = 0;
    let worstDltRatio = 0;
    const rms = (e: number[]) => Math.sqrt(e.reduce((t, x) => t + x * x, 0) / e.length);
    for (let seed = 1; seed <= 30; seed++) {
      const n = 5 + (seed % 12);
      const s = scene(seed, n, 0.5);
      const dltH = solveHomography(s.pitch, s.image);
      const ours = refineHomography(dltH, s.pitch, s.image);
      const ref = cvFindHomography(cv, s.pitch, s.image);
      const d = maxGridDisagreement(ours, ref.h, visibleGrid(s.h, s.pitch));
      const dDlt = maxGridDisagreement(dltH, ref.h, visibleGrid(s.h, s.pitch));
      const eDlt = rms(reprojectionErrors(dltH, s.pitch, s.image));
      const eOurs = rms(reprojectionErrors(ours, s.pitch, s.image));
      const eCv = rms(reprojectionErrors(ref.h, s.pitch, s.image));
      ds.push(d);
      worstRatio = Math.max(worstRatio, eOurs / eCv);
      worstDltRatio = Math.max(worstDltRatio, eDlt / eCv);
      if (seed <= 6) rows.push(`n=${n}: grid disagreement DLT ${dDlt.toFixed(3)} px, DLT+LM ${d.toFixed(4)} px; rms reprojection DLT ${eDlt.toFixed(4)}, DLT+LM ${eOurs.toFixed(4)}, OpenCV ${eCv.toFixed(4)} px`);
    }
    ds.sort((x, y) => x - y);
    console.log(`ours vs OpenCV findHomography(method 0), 0.5 px noise, 640×360, grid inside the landmarks' box:\n  ${rows.join('\n  ')}\n  over 30 sets (DLT+LM): median grid disagreement ${ds[ds.length >> 1].toFixed(4)} px, worst ${ds[ds.length - 1].toFixed(4)} px; worst rms ratio ours/OpenCV ${worstRatio.toFixed(4)} (DLT alone ${worstDltRatio.toFixed(3)})`);
    // OpenCV polishes its DLT by Levenberg–Marquardt on the reprojection error, as refine.ts does.
    expect(worstRatio).toBeLessThan(1.001);
    expect(ds[ds.length - 1]).toBeLessThan(0.05);
    expect(worstDltRatio).toBeLessThan(1.2);
  });

  it('agrees with OpenCV on near-degenerate sets (a point 0.1 % off the line through two others)', () => {
    const s = scene(21, 4, 0);
    const [a, b] = s.pitch;
    const mid: Vec2 = [(a[0] + b[0]) / 2 + (b[1] - a[1]) * 1e-3, (a[1] + b[1]) / 2 - (b[0] - a[0]) * 1e-3];
    const pitch: Vec2[] = [a, b, mid, s.pitch[3]];
    const image = pitch.map((p) => applyHomography(s.h, p));
    const ours = solveHomography(pitch, image);
    const ref = cvFindHomography(cv, pitch, image);
    const d = maxGridDisagreement(ours, ref.h, visibleGrid(s.h));
    const dTruth = maxGridDisagreement(ours, s.h, visibleGrid(s.h));
    const dCvTruth = maxGridDisagreement(ref.h, s.h, visibleGrid(s.h));
    console.log(`near-degenerate 4 points (exact images): ours vs truth ${dTruth.toExponential(2)} px, OpenCV vs truth ${dCvTruth.toExponential(2)} px, ours vs OpenCV ${d.toExponential(2)} px`);
    expect(dTruth).toBeLessThan(1e-3);
    expect(d).toBeLessThan(0.1);
  });
});

describe('refuses degenerate landmark sets with a message that says what to do', () => {
  const sq: Vec2[] = [[0, 0], [10, 0], [10, 10], [0, 10]];
  const img: Vec2[] = [[100, 100], [200, 100], [200, 200], [100, 200]];
  const problem = (f: () => unknown) => {
    try {
      f();
    } catch (e) {
      expect(e).toBeInstanceOf(GeometryError);
      return e as GeometryError;
    }
    throw new Error('no error');
  };
  it('three of four on one line', () => {
    const e = problem(() => solveHomography([[0, 0], [5, 0], [10, 0], [0, 10]], img));
    expect(e.problem).toBe('collinear');
    expect(e.points).toEqual([0, 1, 2]);
    expect(e.message).toMatch(/#1, #2 and #3 lie on one line in the pitch.*Add a landmark/);
  });
  it('three on one line in the image', () => {
    const e = problem(() => solveHomography(sq, [[100, 100], [200, 100], [300, 100], [100, 200]]));
    expect(e.message).toMatch(/in the image/);
  });
  it('repeated points', () => {
    const e = problem(() => solveHomography([[0, 0], [10, 0], [10, 0], [0, 10]], img));
    expect(e.problem).toBe('repeated');
    expect(e.message).toMatch(/#2 and #3 are at the same pitch position \(10, 0\) m/);
  });
  it('too few, not finite, all on a line, a line plus one', () => {
    expect(problem(() => solveHomography(sq.slice(0, 3), img.slice(0, 3))).message).toMatch(/at least 4 landmarks, got 3: click 1 more landmark/);
    expect(problem(() => solveHomography([[0, 0], [NaN, 0], [10, 10], [0, 10]], img)).problem).toBe('not_finite');
    const line: Vec2[] = [[0, 0], [1, 0], [2, 0], [3, 0], [4, 0]];
    const imgs: Vec2[] = [[1, 1], [5, 2], [3, 7], [9, 9], [2, 8]];
    expect(problem(() => solveHomography(line, imgs)).message).toMatch(/All 5 landmarks lie on one line in the pitch/);
    const linePlus: Vec2[] = [[0, 0], [1, 0], [2, 0], [3, 0], [4, 3]];
    expect(problem(() => fitHomography(linePlus, imgs)).message).toMatch(/All but one of the 5 landmarks/);
  });
  it('a singular matrix has no inverse', () => {
    expect(problem(() => invertHomography([1, 2, 3, 2, 4, 6, 0, 0, 1])).problem).toBe('singular');
  });
});

describe('RANSAC against OpenCV findHomography(RANSAC)', () => {
  it('finds the same inliers and a fit as close to the truth with 30 % outliers', () => {
    const rows: string[] = [];
    let worstTruth = 0;
    let worstCvTruth = 0;
    let maskDiff = 0;
    for (let seed = 1; seed <= 20; seed++) {
      const s = scene(100 + seed, 30, 0.7);
      const rnd = seededRandom(seed);
      const outlier = s.image.map(() => rnd() < 0.3);
      const image = s.image.map((q, i): Vec2 => (outlier[i] ? [q[0] + 20 + rnd() * 150, q[1] - 20 - rnd() * 80] : q));
      const ours = fitHomography(s.pitch, image, { threshold: 3, seed });
      const ref = cvFindHomography(cv, s.pitch, image, 3);
      const grid = visibleGrid(s.h, s.pitch);
      const dTruth = maxGridDisagreement(ours.h, s.h, grid);
      const dCvTruth = maxGridDisagreement(ref.h, s.h, grid);
      const dCv = maxGridDisagreement(ours.h, ref.h, grid);
      worstTruth = Math.max(worstTruth, dTruth);
      worstCvTruth = Math.max(worstCvTruth, dCvTruth);
      const diff = ours.inliers.filter((v, i) => v !== ref.mask[i]).length;
      maskDiff += diff;
      // Every planted outlier is refused.
      outlier.forEach((o, i) => o && expect(ours.inliers[i]).toBe(false));
      if (seed <= 6) rows.push(`outliers ${outlier.filter(Boolean).length}/30: ours vs truth ${dTruth.toFixed(2)} px, OpenCV vs truth ${dCvTruth.toFixed(2)} px, ours vs OpenCV ${dCv.toFixed(2)} px, inlier masks differ on ${diff}, trials ${ours.iterations}, rms ${ours.rms.toFixed(2)} px`);
    }
    console.log(`RANSAC (3 px, 0.7 px noise, 640×360):\n  ${rows.join('\n  ')}\n  worst grid error vs truth over 20 sets: ours ${worstTruth.toFixed(2)} px, OpenCV ${worstCvTruth.toFixed(2)} px; inlier masks differ on ${maskDiff} of 600 points`);
    expect(worstTruth).toBeLessThan(Math.max(3, 1.5 * worstCvTruth));
    // Masks may differ only on points near the 3 px threshold.
    expect(maskDiff).toBeLessThan(600 * 0.05);
  });

  it('is repeatable for a seed and reports per-point errors', () => {
    const s = scene(7, 12, 0.3);
    const image = s.image.slice();
    image[3] = [image[3][0] + 40, image[3][1]];
    const a = fitHomography(s.pitch, image, { seed: 9 });
    const b = fitHomography(s.pitch, image, { seed: 9 });
    expect(a).toEqual(b);
    expect(a.inliers[3]).toBe(false);
    expect(a.errors[3]).toBeGreaterThan(30);
    expect(a.errors.filter((_, i) => i !== 3).every((e) => e < 3)).toBe(true);
  });
});
