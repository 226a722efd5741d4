/** Ordering, filters and counts of the review queue, on hand-made rows with known answers. */
import { describe, expect, it } from 'vitest';
import type { CorrectionRow, EventRow } from '../../../renderer/src/db/rows.ts';
import { buildQueue, countQueue, filterQueue, METRES_PER_SECOND, nextOpen, NO_FILTER, openAbove, orderQueue, queueItem } from '../../../renderer/src/review/queue.ts';
import type { EventKind, TeamSide } from '../../../shared-types/index.ts';

let rowNo = 0;
function pair(o: { kind: EventKind; shift: number; conf: number; team?: TeamSide; period?: number; moveM?: number; status?: CorrectionRow['status']; t?: number }) {
  const row = ++rowNo;
  const eventId = `e${row}`;
  const t = o.t ?? row * 10;
  const logged = { id: eventId, row, period: o.period ?? 1, t, kind: o.kind, rawKind: o.kind, x: 0, y: 0, raw: {}, ...(o.team ? { team: o.team } : {}) };
  const event: EventRow = { id: row, sourceId: 2, projectId: 1, eventId, row, period: o.period ?? 1, kind: o.kind, logged, current: { ...logged } };
  const correction: CorrectionRow = {
    id: 100 + row, projectId: 1, sourceId: 2, eventId, status: o.status ?? 'proposed', updatedAt: 0,
    proposal: { eventId, trackingPeriod: o.period ?? 1, trackingTime: t + 3 + o.shift, trackingFrame: 0, predictedTime: t + 3, x: o.moveM ?? 0, y: 0, change: 'time', confidence: o.conf, reason: '', placed: true },
  };
  return { correction, event };
}

function queueOf(specs: Parameters<typeof pair>[0][]) {
  const ps = specs.map(pair);
  return buildQueue(ps.map((p) => p.correction), ps.map((p) => p.event));
}

describe('review queue', () => {
  it('measures the size as time shift plus place shift at 5 m/s, weight = size × confidence', () => {
    const p = pair({ kind: 'corner', shift: -2, conf: 0.5, moveM: 10 });
    const q = queueItem(p.correction, p.event);
    expect(q.shiftS).toBeCloseTo(-2, 12);
    expect(q.placeShiftM).toBeCloseTo(10, 12);
    expect(q.size).toBeCloseTo(2 + 10 / METRES_PER_SECOND, 12);
    expect(q.weight).toBeCloseTo(0.5 * 4, 12);
    expect(q.restart).toBe(true);
  });

  it('puts restarts first, then orders by weight, ties in match order', () => {
    const q = orderQueue(
      queueOf([
        { kind: 'pass', shift: 5, conf: 1 },          // weight 5, open play
        { kind: 'throw_in', shift: 0.5, conf: 1 },    // weight 0.5, restart
        { kind: 'corner', shift: -3, conf: 0.5 },     // weight 1.5, restart
        { kind: 'shot', shift: 1, conf: 0.9 },        // weight 0.9
        { kind: 'pass', shift: 1, conf: 0.9 },        // weight 0.9, later in the match
        { kind: 'period_start', shift: 0.2, conf: 1 }, // a period start counts as a restart
      ]),
    );
    expect(q.map((i) => i.kind)).toEqual(['corner', 'throw_in', 'period_start', 'pass', 'shot', 'pass']);
    expect(q[4].event.row).toBeLessThan(q[5].event.row);
  });

  it('filters by kind, team, period, size of change and status', () => {
    const q = queueOf([
      { kind: 'pass', shift: 2, conf: 1, team: 'home', period: 1 },
      { kind: 'pass', shift: 0.3, conf: 1, team: 'away', period: 2 },
      { kind: 'corner', shift: 1, conf: 1, team: 'away', period: 2, status: 'accepted' },
      { kind: 'shot', shift: -4, conf: 1, period: 1, status: 'rejected' },
    ]);
    const ids = (f: Partial<typeof NO_FILTER>) => filterQueue(q, { ...NO_FILTER, ...f }).map((i) => i.event.row - q[0].event.row);
    expect(ids({})).toEqual([0, 1, 2, 3]);
    expect(ids({ kinds: ['pass'] })).toEqual([0, 1]);
    expect(ids({ kinds: ['pass', 'shot'] })).toEqual([0, 1, 3]);
    expect(ids({ team: 'away' })).toEqual([1, 2]);
    expect(ids({ team: 'none' })).toEqual([3]);
    expect(ids({ period: 2 })).toEqual([1, 2]);
    expect(ids({ minSize: 1 })).toEqual([0, 2, 3]);
    expect(ids({ status: 'open' })).toEqual([0, 1]);
    expect(ids({ status: 'decided' })).toEqual([2, 3]);
    expect(ids({ team: 'away', minSize: 0.5, status: 'open' })).toEqual([]);
  });

  it('counts done and left by status, takes the open ones above a confidence, finds the next open', () => {
    const q = queueOf([
      { kind: 'pass', shift: 1, conf: 0.95 },
      { kind: 'pass', shift: 1, conf: 0.6 },
      { kind: 'pass', shift: 1, conf: 0.99, status: 'accepted' },
      { kind: 'pass', shift: 1, conf: 0.9, status: 'edited' },
      { kind: 'pass', shift: 1, conf: 0.3, status: 'rejected' },
    ]);
    expect(countQueue(q)).toEqual({ done: 3, left: 2, accepted: 1, rejected: 1, edited: 1 });
    expect(openAbove(q, 0.9).map((i) => i.confidence)).toEqual([0.95]);
    expect(openAbove(q, 0.6)).toHaveLength(2);
    expect(nextOpen(q, 0)).toBe(1);
    expect(nextOpen(q, 1)).toBe(0); // wraps
    expect(nextOpen(q.slice(2), 0)).toBe(-1);
  });

  it('leaves out a correction whose event is gone, and one from another event log', () => {
    const a = pair({ kind: 'pass', shift: 1, conf: 1 });
    const b = pair({ kind: 'pass', shift: 1, conf: 1 });
    const other = { ...b.correction, sourceId: 9 };
    expect(buildQueue([a.correction, other], [a.event, b.event]).map((i) => i.event.eventId)).toEqual([a.event.eventId]);
    expect(buildQueue([a.correction, b.correction], [b.event])).toHaveLength(1);
  });
});
