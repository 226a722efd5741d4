/**
 * Decisions -> rows: the correction's status / edited value and the event's `current`
 * copy change in one history commit, and undo restores both. On the demo match, the
 * accepted corrections are measured against the simulator's truth (fixtures/demo/truth.json):
 * the corrected log must have more events within 0.2 s of the true moment than the raw log.
 */
import 'fake-indexeddb/auto';
import { readFileSync } from 'node:fs';
import fc from 'fast-check';
import { afterEach, beforeAll, describe, expect, it } from 'vitest';
import { mapTime } from '../../../engine/fit/clock.ts';
import { syncMatch } from '../../../engine/sync.ts';
import { trueToSource, type Truth } from '../../../fixtures/sim/index.ts';
import { WhistlemarkDb } from '../../../renderer/src/db/database.ts';
import type { CorrectionRow, EventRow } from '../../../renderer/src/db/rows.ts';
import { commit, undo } from '../../../renderer/src/history/history.ts';
import { decide, decisionChanges, eventClockTime, frameOf, type Decision } from '../../../renderer/src/review/decisions.ts';
import { isProposal } from '../../../renderer/src/analysis/store-analysis.ts';
import type { ClockFit } from '../../../shared-types/index.ts';
import { DEMO, loadSources } from '../project-file/demo-project.ts';

const RATE = 25;
const fit: ClockFit = {
  source: 'events', method: 'huber',
  segments: [{ period: 1, fromT: 0, toT: 3000, offset: 2, rate: 1.0002, driftPpm: 200, offsetSe: 0, rateSe: 0, rmsResidual: 0, leaveOneOutMax: 0, points: [] }],
};

function rows(): { c: CorrectionRow; e: EventRow } {
  const logged = { id: 'e7', row: 7, period: 1, t: 100, kind: 'corner' as const, rawKind: 'corner', team: 'home' as const, x: 50, y: -30, raw: {} };
  const predicted = mapTime(fit, 1, 100);
  return {
    e: { id: 3, sourceId: 2, projectId: 1, eventId: 'e7', row: 7, period: 1, kind: 'corner', logged, current: { ...logged } },
    c: {
      id: 9, projectId: 1, sourceId: 2, eventId: 'e7', status: 'proposed', updatedAt: 0,
      proposal: { eventId: 'e7', trackingPeriod: 1, trackingTime: predicted + 1.2, trackingFrame: 500 + Math.round((predicted + 1.2) * RATE), predictedTime: predicted, x: 52.4, y: -34, change: 'time+location', confidence: 0.9, reason: 'r', placed: true },
    },
  };
}

describe('decision -> rows', () => {
  it('accept: status accepted, event current at the proposal (back on the event clock through the fit) and place', () => {
    const { c, e } = rows();
    const r = decide({ type: 'accept' }, c, e, fit, RATE, 5);
    expect(r.correction).toEqual({ ...c, status: 'accepted', updatedAt: 5 });
    // Event clock: t = (tTrk - offset) / rate, the inverse of the fit (t_trk = offset + rate * t).
    expect(r.event.current.t).toBeCloseTo((c.proposal.trackingTime - 2) / 1.0002, 9);
    expect(r.event.current).toMatchObject({ x: 52.4, y: -34, period: 1 });
    expect(r.event.logged).toEqual(e.logged);
    expect(e.current.t).toBe(100); // inputs untouched
  });

  it('reject and reopen put the logged time and place back', () => {
    const { c, e } = rows();
    const accepted = decide({ type: 'accept' }, c, e, fit, RATE);
    for (const type of ['reject', 'reopen'] as const) {
      const r = decide({ type }, accepted.correction, accepted.event, fit, RATE);
      expect(r.correction.status).toBe(type === 'reject' ? 'rejected' : 'proposed');
      expect(r.correction.edited).toBeUndefined();
      expect(r.event.current).toEqual(e.logged);
    }
  });

  it('nudges land on the tracking frame grid and add up; a place edit keeps the nudged time', () => {
    const { c, e } = rows();
    const one = decide({ type: 'nudge', frames: 1 }, c, e, fit, RATE);
    expect(one.correction.status).toBe('edited');
    const k0 = Math.round(c.proposal.trackingTime * RATE);
    expect(one.correction.edited!.t).toBeCloseTo((k0 + 1) / RATE, 12);
    const six = decide({ type: 'nudge', frames: 5 }, one.correction, one.event, fit, RATE);
    expect(six.correction.edited!.t).toBeCloseTo((k0 + 6) / RATE, 12);
    expect(frameOf(c, six.correction.edited!.t, RATE)).toBe(c.proposal.trackingFrame + 6);
    const back = decide({ type: 'nudge', frames: -5 }, six.correction, six.event, fit, RATE);
    expect(back.correction.edited!.t).toBeCloseTo((k0 + 1) / RATE, 12);
    const placed = decide({ type: 'place', x: 40, y: 10 }, six.correction, six.event, fit, RATE);
    expect(placed.correction.edited).toEqual({ period: 1, t: six.correction.edited!.t, x: 40, y: 10 });
    expect(placed.event.current).toMatchObject({ x: 40, y: 10 });
    expect(placed.event.current.t).toBeCloseTo(eventClockTime(c, e, six.correction.edited!.t, fit), 12);
    // Accepting after an edit takes the engine's proposal again.
    expect(decide({ type: 'accept' }, placed.correction, placed.event, fit, RATE).correction.edited).toBeUndefined();
  });

  it('without a fit the shift is carried over at rate 1', () => {
    const { c, e } = rows();
    const r = decide({ type: 'accept' }, c, e, undefined, RATE);
    expect(r.event.current.t).toBeCloseTo(100 + 1.2, 9);
  });
});

describe('decisions through the undo history', () => {
  let db: WhistlemarkDb;
  let n = 0;
  afterEach(async () => {
    await db?.delete();
  });

  it('any sequence of decisions, undone as many times, gives back both rows as they were (property)', async () => {
    const decision = fc.oneof(
      fc.constant<Decision>({ type: 'accept' }),
      fc.constant<Decision>({ type: 'reject' }),
      fc.constant<Decision>({ type: 'reopen' }),
      fc.integer({ min: -5, max: 5 }).map<Decision>((frames) => ({ type: 'nudge', frames })),
      fc.record({ x: fc.double({ min: -52, max: 52, noNaN: true }), y: fc.double({ min: -34, max: 34, noNaN: true }) }).map<Decision>((p) => ({ type: 'place', ...p })),
    );
    await fc.assert(
      fc.asyncProperty(fc.array(decision, { minLength: 1, maxLength: 8 }), async (ds) => {
        db = new WhistlemarkDb(`decisions-${n++}`);
        const { c, e } = rows();
        await db.projects.add({ id: 1, title: 'p', createdAt: 0, updatedAt: 0 });
        await db.corrections.add(c);
        await db.events.add(e);
        for (const d of ds) {
          const cc = (await db.corrections.get(9))!;
          const ee = (await db.events.get(3))!;
          await commit(db, { projectId: 1, user: 'u', subject: 'correction', what: d.type, changes: decisionChanges(d, cc, ee, fit, RATE) });
          // Both rows always agree: current equals what the correction says.
          const now = (await db.events.get(3))!;
          const cn = (await db.corrections.get(9))!;
          if (cn.status === 'rejected' || cn.status === 'proposed') expect(now.current).toEqual(e.logged);
          else expect(now.current.t).toBeCloseTo(eventClockTime(c, e, cn.edited?.t ?? cn.proposal.trackingTime, fit), 9);
        }
        for (let k = 0; k < ds.length; k++) await undo(db, 1, 'u');
        expect(await db.corrections.get(9)).toEqual(c);
        expect(await db.events.get(3)).toEqual(e);
        await db.delete();
      }),
      { numRuns: 25 },
    );
  });
});

describe('accepted corrections on the demo against the simulator truth', () => {
  let share: { raw: number; corrected: number; n: number };
  beforeAll(async () => {
    const src = await loadSources();
    const sync = syncMatch(src.tracking.data, src.events.data);
    const truth = JSON.parse(readFileSync(DEMO + 'truth.json', 'utf8')) as Truth;
    let raw = 0, corrected = 0, n = 0;
    src.events.data.events.forEach((logged, i) => {
      const p = sync.corrections[i];
      const te = truth.events.find((x) => x.row === logged.row);
      const trueTrk = te && trueToSource(truth, 'tracking', te.trueT);
      if (!trueTrk) return;
      const e: EventRow = { id: i + 1, sourceId: 2, projectId: 1, eventId: logged.id, row: logged.row, period: logged.period, kind: logged.kind, logged, current: { ...logged } };
      let current = logged;
      if (isProposal(p)) {
        const c: CorrectionRow = { id: i + 1, projectId: 1, sourceId: 2, eventId: logged.id, status: 'proposed', proposal: p, updatedAt: 0 };
        current = decide({ type: 'accept' }, c, e, sync.fit, src.tracking.data.rate).event.current;
      }
      // Both through the same fit onto the tracking clock, compared with the true tracking time.
      n++;
      if (Math.abs(mapTime(sync.fit, logged.period, logged.t) - trueTrk.t) <= 0.2) raw++;
      if (Math.abs(mapTime(sync.fit, current.period, current.t) - trueTrk.t) <= 0.2) corrected++;
    });
    share = { raw: raw / n, corrected: corrected / n, n };
    console.log(`demo: events within 0.2 s of the truth: raw log ${(100 * share.raw).toFixed(0)} %, all proposals accepted ${(100 * share.corrected).toFixed(0)} % (${n} events)`);
  }, 120_000);

  it('event current rows after accepting beat the raw log', () => {
    expect(share.n).toBeGreaterThan(50);
    expect(share.corrected).toBeGreaterThan(share.raw + 0.2);
  });
});
