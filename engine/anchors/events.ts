/**
 * Anchors from the event log: restart rows (kick-off, goal kick, corner, throw-in, free
 * kick, penalty) and period start / end rows, at their logged time.
 */
import type { Anchor, AnchorKind, EventLog } from '../../shared-types/domain.ts';
import { isRestartKind } from '../../shared-types/domain.ts';

/**
 * How far a logged time of each kind can be trusted as an anchor (common practice:
 * goal kicks are the least reliable, the tagger often cannot see the moment).
 */
const KIND_CONFIDENCE: Partial<Record<AnchorKind, number>> = {
  kick_off: 0.9, corner: 0.75, throw_in: 0.7, free_kick: 0.65, penalty: 0.8, goal_kick: 0.35,
  period_start: 0.6, period_end: 0.3,
};

/** `eventAnchors(log) -> Anchor[]` (restart and period rows, in log order). */
export function eventAnchors(log: EventLog): Anchor[] {
  const out: Anchor[] = [];
  for (const e of log.events) {
    if (!(isRestartKind(e.kind) || e.kind === 'period_start' || e.kind === 'period_end')) continue;
    out.push({
      id: `evt-${e.id}`, source: 'events', kind: e.kind, period: e.period, t: e.t, x: e.x, y: e.y,
      confidence: KIND_CONFIDENCE[e.kind] ?? 0.5, note: `logged ${e.rawKind} (row ${e.row})`, eventId: e.id,
    });
  }
  return out;
}
