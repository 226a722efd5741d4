import { describe, expect, it } from 'vitest';
import { whistleAnchors, whistleConfidence, type WhistleCandidate } from '../../../engine/audio/index.ts';

// Plain bookkeeping (no outside reference): the anchor carries the candidate's onset and a
// confidence that rises with strength.
const cand = (onset: number, strengthDb: number, harmonicChecked = true): WhistleCandidate => ({
  onset,
  offset: onset + 0.4,
  duration: 0.4,
  pattern: 'single',
  blasts: [{ onset, offset: onset + 0.4, strengthDb, fundamentalHz: 3100, harmonicChecked }],
  strengthDb,
  fundamentalHz: 3100,
});

describe('whistle anchors', () => {
  it('one footage anchor of kind whistle per candidate, at its onset, in the given period', () => {
    const a = whistleAnchors([cand(12.5, 30), cand(80, 20)], 2);
    expect(a.map((x) => [x.id, x.source, x.kind, x.period, x.t])).toEqual([
      ['w1', 'footage', 'whistle', 2, 12.5],
      ['w2', 'footage', 'whistle', 2, 80],
    ]);
    expect(a[0].note).toMatch(/single whistle, 0.40 s, 30 dB above the band, 3100 Hz/);
  });
  it('confidence rises with strength, stays in 0..1, and credits a seen harmonic', () => {
    expect(whistleConfidence(cand(0, 15))).toBeCloseTo(0.3, 9);
    expect(whistleConfidence(cand(0, 40))).toBeCloseTo(1, 9);
    expect(whistleConfidence(cand(0, 90))).toBeCloseTo(1, 9);
    expect(whistleConfidence(cand(0, 25))).toBeGreaterThan(whistleConfidence(cand(0, 20)));
    expect(whistleConfidence(cand(0, 25, false))).toBeLessThan(whistleConfidence(cand(0, 25, true)));
  });
});
