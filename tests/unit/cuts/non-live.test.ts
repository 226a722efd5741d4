import { describe, expect, it } from 'vitest';
import { cutAnchors, proposeNonLive, type CutCandidate } from '../../../engine/cuts/index.ts';

const cut = (t: number): CutCandidate => ({ t, frame: Math.round(t * 25), strength: 0.3, ratio: 20 });

describe('non-live proposals from cuts and whistles', () => {
  it('a short stretch between two cuts is a replay; a long one is not', () => {
    const p = proposeNonLive([cut(100), cut(106), cut(200), cut(260)], []);
    expect(p).toEqual([{ fromT: 100, toT: 106, kind: 'replay', reason: expect.stringMatching(/6\.0 s between cuts/) }]);
  });

  it('half-time: a double whistle, a cut, then the kick-off whistle; that cut opens no replay', () => {
    const whistles = [
      { onset: 2700, offset: 2701, pattern: 'double' as const },
      { onset: 2712, offset: 2712.5, pattern: 'single' as const },
    ];
    const p = proposeNonLive([cut(2704), cut(2716)], whistles);
    expect(p).toHaveLength(1);
    expect(p[0]).toMatchObject({ fromT: 2700, toT: 2712, kind: 'half_time' });
  });

  it('a single whistle before a cut is not a period end', () => {
    expect(proposeNonLive([cut(50)], [{ onset: 45, offset: 45.5, pattern: 'single' }])).toEqual([]);
  });

  it('cut anchors are footage anchors of kind cut, with a confidence in 0..1', () => {
    const a = cutAnchors([cut(12.04), { t: 30, frame: 750, strength: 0.09, ratio: 3.1 }], 1);
    expect(a.map((x) => [x.source, x.kind, x.t])).toEqual([['footage', 'cut', 12.04], ['footage', 'cut', 30]]);
    expect(a[0].confidence).toBeGreaterThan(a[1].confidence);
    for (const x of a) expect(x.confidence).toBeGreaterThanOrEqual(0.2);
  });
});
