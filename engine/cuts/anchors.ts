/**
 * Cut candidates as footage anchors: a cut is an exact frame boundary, so it snaps other
 * anchors and brackets non-live stretches. The anchor time is the first frame after the cut.
 *
 * Example: `cutAnchors(cuts, 2)` → [{ id: 'c1', source: 'footage', kind: 'cut', t: 268.6, ... }]
 */
import type { Anchor, PeriodId } from '../../shared-types/domain.ts';
import type { CutCandidate } from './cut-types.ts';

/** 0.2 at the detection floor of the ratio (3), 0.9 from a ratio of 20 and a score of 0.5 up. */
export function cutConfidence(c: CutCandidate): number {
  const fromRatio = Math.min(1, Math.max(0, (c.ratio - 3) / 17));
  const fromScore = Math.min(1, Math.max(0, c.strength / 0.5));
  return 0.2 + 0.7 * Math.min(fromRatio, fromScore);
}

export function cutAnchors(cuts: CutCandidate[], period: PeriodId): Anchor[] {
  return cuts.map((c, i) => ({
    id: `c${i + 1}`,
    source: 'footage',
    kind: 'cut',
    period,
    t: c.t,
    confidence: cutConfidence(c),
    note: `cut at frame ${c.frame}: difference ${c.strength.toFixed(2)}, ${c.ratio >= 100 ? '≥100' : c.ratio.toFixed(1)}× its neighbours`,
  }));
}
