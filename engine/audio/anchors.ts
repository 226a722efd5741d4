/**
 * Whistle candidates as footage anchors for the clock fit (../shared/DESIGN.md data flow:
 * "footage: whistle and cut candidates"). The anchor time is the first blast's onset.
 *
 * Example: `whistleAnchors(candidates, 1)` → [{ id: 'w1', source: 'footage', kind: 'whistle', t: 29.99, ... }]
 */
import type { Anchor, PeriodId } from '../../shared-types/domain.ts';
import type { WhistleCandidate } from './whistle-types.ts';

/**
 * Confidence grows with the strength above the band median (15 dB, the detection
 * threshold, gives 0.2; 40 dB and more gives 0.9) and gains 0.1 when the harmonic was
 * seen in every blast.
 */
export function whistleConfidence(c: WhistleCandidate): number {
  const fromStrength = 0.2 + 0.7 * Math.min(1, Math.max(0, (c.strengthDb - 15) / 25));
  const harmonic = c.blasts.every((b) => b.harmonicChecked) ? 0.1 : 0;
  return Math.min(1, fromStrength + harmonic);
}

/** `period` is the footage period the caller assigns (one file may hold several). */
export function whistleAnchors(candidates: WhistleCandidate[], period: PeriodId): Anchor[] {
  return candidates.map((c, i) => ({
    id: `w${i + 1}`,
    source: 'footage',
    kind: 'whistle',
    period,
    t: c.onset,
    confidence: whistleConfidence(c),
    note: `${c.pattern} whistle, ${c.duration.toFixed(2)} s, ${c.strengthDb.toFixed(0)} dB above the band, ${Math.round(c.fundamentalHz)} Hz`,
  }));
}
