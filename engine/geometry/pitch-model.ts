/**
 * The field markings of the Laws of the Game, Law 1, for a pitch of any length × width in
 * metres, with the origin at the centre mark, x along the length and y across (y up when
 * x points right, as tracking). "Left" is the −x end and "top" the +y touchline, as the
 * 2-D pitch view draws them.
 */
import type { PitchSize } from '../../shared-types/domain.ts';
import type { Vec2 } from './homography.ts';

/** Law 1 distances in metres (IFAB Laws of the Game, Law 1 — The Field of Play). */
export const LAW1_MARKINGS = {
  centreCircleRadius: 9.15,
  penaltyAreaDepth: 16.5,
  /** 16.5 m beyond each post: 7.32 + 2 × 16.5. */
  penaltyAreaWidth: 40.32,
  goalAreaDepth: 5.5,
  /** 5.5 m beyond each post: 7.32 + 2 × 5.5. */
  goalAreaWidth: 18.32,
  penaltyMarkDistance: 11,
  penaltyArcRadius: 9.15,
  cornerArcRadius: 1,
  goalWidth: 7.32,
} as const;

export type MarkingKind = 'line' | 'arc' | 'circle' | 'spot';

/** A marking to draw, as a polyline in pitch metres (arcs sampled finely enough to look round). */
export interface PitchMarking {
  id: string;
  kind: MarkingKind;
  points: Vec2[];
  closed: boolean;
}

/** A point an analyst can click to register the footage: a stable id, a label, where it is. */
export interface PitchLandmark {
  id: string;
  label: string;
  at: Vec2;
}

export interface PitchModel {
  length: number;
  width: number;
  markings: PitchMarking[];
  landmarks: PitchLandmark[];
}

function arc(cx: number, cy: number, r: number, from: number, to: number, maxStepM: number): Vec2[] {
  const steps = Math.max(4, Math.ceil((Math.abs(to - from) * r) / maxStepM));
  return Array.from({ length: steps + 1 }, (_, i): Vec2 => {
    const a = from + ((to - from) * i) / steps;
    return [cx + r * Math.cos(a), cy + r * Math.sin(a)];
  });
}

/**
 * Markings and landmarks of a length × width pitch; arcs sampled every `arcStep` metres.
 * `pitchModel({ length: 105, width: 68 }).landmarks.find((l) => l.id === 'penalty-mark-right').at -> [41.5, 0]`
 */
export function pitchModel(size: PitchSize, arcStep = 0.5): PitchModel {
  const L = LAW1_MARKINGS;
  const hl = size.length / 2;
  const hw = size.width / 2;
  const markings: PitchMarking[] = [];
  const landmarks: PitchLandmark[] = [];
  const line = (id: string, points: Vec2[], closed = false) => markings.push({ id, kind: 'line', points, closed });
  const mark = (id: string, label: string, at: Vec2) => landmarks.push({ id, label, at });

  line('boundary', [[-hl, -hw], [hl, -hw], [hl, hw], [-hl, hw]], true);
  line('halfway-line', [[0, -hw], [0, hw]]);
  markings.push({ id: 'centre-circle', kind: 'circle', points: arc(0, 0, L.centreCircleRadius, 0, 2 * Math.PI, arcStep).slice(0, -1), closed: true });
  markings.push({ id: 'centre-mark', kind: 'spot', points: [[0, 0]], closed: false });
  mark('centre-mark', 'Centre mark', [0, 0]);
  mark('halfway-top', 'Halfway line meets top touchline', [0, hw]);
  mark('halfway-bottom', 'Halfway line meets bottom touchline', [0, -hw]);
  mark('centre-circle-top', 'Centre circle meets halfway line, top', [0, L.centreCircleRadius]);
  mark('centre-circle-bottom', 'Centre circle meets halfway line, bottom', [0, -L.centreCircleRadius]);
  mark('centre-circle-left', 'Centre circle, left-most point', [-L.centreCircleRadius, 0]);
  mark('centre-circle-right', 'Centre circle, right-most point', [L.centreCircleRadius, 0]);

  for (const [end, s] of [['left', -1], ['right', 1]] as const) {
    const Name = end === 'left' ? 'Left' : 'Right';
    const gx = s * hl;
    const pa = L.penaltyAreaWidth / 2;
    const ga = L.goalAreaWidth / 2;
    const paX = s * (hl - L.penaltyAreaDepth);
    const gaX = s * (hl - L.goalAreaDepth);
    const spotX = s * (hl - L.penaltyMarkDistance);
    line(`penalty-area-${end}`, [[gx, pa], [paX, pa], [paX, -pa], [gx, -pa]]);
    line(`goal-area-${end}`, [[gx, ga], [gaX, ga], [gaX, -ga], [gx, -ga]]);
    markings.push({ id: `penalty-mark-${end}`, kind: 'spot', points: [[spotX, 0]], closed: false });
    // The penalty arc is the part of the 9.15 m circle round the mark outside the area.
    const half = Math.acos(Math.min(1, (L.penaltyAreaDepth - L.penaltyMarkDistance) / L.penaltyArcRadius));
    const facing = s > 0 ? Math.PI : 0;
    markings.push({ id: `penalty-arc-${end}`, kind: 'arc', points: arc(spotX, 0, L.penaltyArcRadius, facing - half, facing + half, arcStep), closed: false });
    const arcY = L.penaltyArcRadius * Math.sin(half);
    mark(`penalty-mark-${end}`, `${Name} penalty mark`, [spotX, 0]);
    for (const [side, t] of [['top', 1], ['bottom', -1]] as const) {
      mark(`corner-${end}-${side}`, `${Name} ${side} corner`, [gx, t * hw]);
      mark(`penalty-area-${end}-${side}-goal-line`, `${Name} penalty area meets goal line, ${side}`, [gx, t * pa]);
      mark(`penalty-area-${end}-${side}-corner`, `${Name} penalty area, ${side} corner`, [paX, t * pa]);
      mark(`goal-area-${end}-${side}-goal-line`, `${Name} goal area meets goal line, ${side}`, [gx, t * ga]);
      mark(`goal-area-${end}-${side}-corner`, `${Name} goal area, ${side} corner`, [gaX, t * ga]);
      mark(`penalty-arc-${end}-${side}`, `${Name} penalty arc meets penalty area, ${side}`, [paX, t * arcY]);
      mark(`goalpost-${end}-${side}`, `${Name} goal, ${side} post (on the goal line)`, [gx, (t * L.goalWidth) / 2]);
      // Corner arcs: a quarter circle of 1 m inside the field at each corner.
      const from = t > 0 ? (s > 0 ? Math.PI : 1.5 * Math.PI) : s > 0 ? 0.5 * Math.PI : 0;
      markings.push({ id: `corner-arc-${end}-${side}`, kind: 'arc', points: arc(gx, t * hw, L.cornerArcRadius, from, from + Math.PI / 2, arcStep / 4), closed: false });
    }
    mark(`penalty-area-${end}-centre`, `${Name} penalty area line, centre`, [paX, 0]);
    mark(`penalty-arc-${end}-apex`, `${Name} penalty arc, furthest point`, [spotX - s * L.penaltyArcRadius, 0]);
  }
  return { length: size.length, width: size.width, markings, landmarks };
}
