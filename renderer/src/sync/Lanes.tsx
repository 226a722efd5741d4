/**
 * The three clocks as parallel lanes on the footage time axis: footage anchors on top,
 * tracking restarts in the middle (placed through the footage fit), event-log anchors at
 * the bottom (through the events fit, then the footage fit). Lines join the anchors a fit
 * pairs across lanes; a slanted line is a residual you can see. Non-live footage is
 * shaded. Footage anchors can be dragged (snapped to frames on release); wheel zooms about
 * the pointer, Shift+wheel pans.
 */
import { useRef, useState, type PointerEvent as ReactPointerEvent, type WheelEvent as ReactWheelEvent } from 'react';
import type { AnchorKind } from '../../../shared-types/index.ts';
import { kindWord } from '../../../engine/footage-sync/index.ts';

export interface LaneMark {
  key: string;
  t: number;
  kind: AnchorKind;
  /** Placed provisionally (no fit yet ties this lane to footage). */
  provisional?: boolean;
  excluded?: boolean;
  title: string;
}

export interface LaneLink {
  from: { lane: 0 | 1 | 2; t: number };
  to: { lane: 0 | 1 | 2; t: number };
  kind: 'pair' | 'proposal' | 'events';
}

const LANE_NAMES = ['Footage', 'Tracking', 'Event log'] as const;
const LANE_H = 46;
const TOP = 22;
const LEFT = 86;

/** Shapes by kind: kick-offs a tall bar, other restarts a diamond, whistles a ring, period ends a square, cuts a tick. */
function Glyph({ kind, x, y, cls }: { kind: AnchorKind; x: number; y: number; cls: string }) {
  switch (kind) {
    case 'kick_off':
    case 'period_start':
      return <rect className={cls} x={x - 3} y={y - 12} width={6} height={24} rx={2} />;
    case 'whistle':
      return <circle className={cls} cx={x} cy={y} r={6} />;
    case 'period_end':
      return <rect className={cls} x={x - 6} y={y - 6} width={12} height={12} />;
    case 'cut':
      return <line className={cls} x1={x} x2={x} y1={y - 12} y2={y + 12} />;
    default:
      return <path className={cls} d={`M${x},${y - 8} L${x + 7},${y} L${x},${y + 8} L${x - 7},${y} Z`} />;
  }
}

export function Lanes(props: {
  lanes: [LaneMark[], LaneMark[], LaneMark[]];
  links: LaneLink[];
  nonLive: { fromT: number; toT: number; confirmed: boolean }[];
  playhead: number | undefined;
  duration: number;
  selected: string | undefined;
  onSelect: (key: string | undefined) => void;
  onSeek: (t: number) => void;
  onDrag: (key: string, t: number) => void;
}) {
  const { duration } = props;
  const [view, setView] = useState<[number, number]>([0, Math.max(1, duration)]);
  const svg = useRef<SVGSVGElement>(null);
  const [drag, setDrag] = useState<{ key: string; t: number } | null>(null);
  const width = 1000;
  const h = TOP + 3 * LANE_H + 8;
  const [v0, v1] = view;
  const x = (t: number) => LEFT + ((t - v0) / (v1 - v0)) * (width - LEFT - 8);
  const tOf = (clientX: number) => {
    const r = svg.current!.getBoundingClientRect();
    const px = ((clientX - r.left) / r.width) * width;
    return v0 + ((px - LEFT) / (width - LEFT - 8)) * (v1 - v0);
  };
  const laneY = (lane: number) => TOP + lane * LANE_H + LANE_H / 2;

  const onWheel = (e: ReactWheelEvent) => {
    const span = v1 - v0;
    if (e.shiftKey) {
      const d = (e.deltaY / 500) * span;
      setView([Math.max(0, v0 + d), Math.min(duration, v1 + d)]);
      return;
    }
    const at = tOf(e.clientX);
    const k = e.deltaY > 0 ? 1.25 : 0.8;
    const n0 = Math.max(0, at - (at - v0) * k), n1 = Math.min(duration, at + (v1 - at) * k);
    if (n1 - n0 > 2) setView([n0, n1]);
  };
  const ticks = tickTimes(v0, v1);
  const dragT = (m: LaneMark) => (drag && drag.key === m.key ? drag.t : m.t);

  return (
    <div className="sy-lanes-wrap">
      <svg
        ref={svg}
        className="sy-lanes"
        viewBox={`0 0 ${width} ${h}`}
        role="group"
        aria-label="Clocks as lanes: footage, tracking, event log"
        onWheel={onWheel}
        onPointerMove={(e) => drag && setDrag({ key: drag.key, t: Math.max(0, Math.min(duration, tOf(e.clientX))) })}
        onPointerUp={() => {
          if (drag) props.onDrag(drag.key, drag.t);
          setDrag(null);
        }}
        onPointerLeave={() => setDrag(null)}
      >
        {ticks.map((t) => (
          <g key={t} className="sy-tick">
            <line x1={x(t)} x2={x(t)} y1={TOP - 4} y2={h - 6} />
            <text x={x(t) + 3} y={TOP - 8}>{`${Math.floor(t / 60)}:${String(Math.floor(t % 60)).padStart(2, '0')}`}</text>
          </g>
        ))}
        {props.nonLive.map((n, i) => (
          <rect key={i} className={n.confirmed ? 'sy-nonlive' : 'sy-nonlive proposed'} x={x(n.fromT)} y={TOP} width={Math.max(1, x(n.toT) - x(n.fromT))} height={3 * LANE_H} />
        ))}
        {LANE_NAMES.map((name, i) => (
          <g key={name}>
            <rect className="sy-lane" x={LEFT} y={TOP + i * LANE_H + 3} width={width - LEFT - 8} height={LANE_H - 6} rx={4} onClick={(e) => props.onSeek(tOf(e.clientX))} />
            <text className="sy-lane-name" x={8} y={laneY(i) + 4}>
              {name}
            </text>
          </g>
        ))}
        {props.links.map((l, i) => (
          <line key={i} className={`sy-link ${l.kind}`} x1={x(l.from.t)} y1={laneY(l.from.lane) + 10} x2={x(l.to.t)} y2={laneY(l.to.lane) - 10} />
        ))}
        {props.lanes.map((marks, lane) =>
          marks
            .filter((m) => m.t >= v0 - 1 && m.t <= v1 + 1)
            .map((m) => {
              const cls = `sy-mark k-${m.kind}${m.provisional ? ' provisional' : ''}${m.excluded ? ' excluded' : ''}${props.selected === m.key ? ' selected' : ''}`;
              return (
                <g
                  key={m.key}
                  className="sy-mark-g"
                  data-kind={m.kind}
                  data-lane={LANE_NAMES[lane]}
                  onPointerDown={(e: ReactPointerEvent) => {
                    e.stopPropagation();
                    props.onSelect(m.key);
                    if (lane === 0) {
                      (e.target as Element).setPointerCapture?.(e.pointerId);
                      setDrag({ key: m.key, t: m.t });
                    }
                  }}
                >
                  <title>{m.title}</title>
                  <Glyph kind={m.kind} x={x(dragT(m))} y={laneY(lane)} cls={cls} />
                </g>
              );
            }),
        )}
        {props.playhead !== undefined && props.playhead >= v0 && props.playhead <= v1 && <line className="sy-playhead" x1={x(props.playhead)} x2={x(props.playhead)} y1={TOP - 2} y2={h - 4} />}
      </svg>
      <div className="sy-lanes-foot small muted">
        <span>
          Showing {fmt(v0)}–{fmt(v1)} of footage. Wheel: zoom · Shift+wheel: pan · drag a footage anchor to move it · click a lane to go there.
        </span>
        <button type="button" className="quiet" onClick={() => setView([0, Math.max(1, duration)])}>
          Whole footage
        </button>
        <button type="button" className="quiet" onClick={() => props.playhead !== undefined && setView([Math.max(0, props.playhead - 15), Math.min(duration, props.playhead + 15)])}>
          ±15 s around the playhead
        </button>
      </div>
      <p className="sy-legend small muted" aria-label="Anchor shapes">
        <span className="lg k-kick_off">▮ kick-off</span> <span className="lg">◆ other restart</span> <span className="lg">○ whistle</span> <span className="lg">■ period end</span> <span className="lg">│ cut</span> · lines: <span className="lg pair">paired</span> <span className="lg proposal">proposed</span> <span className="lg events">events fit</span> · shaded: not live play
      </p>
    </div>
  );
}

const fmt = (t: number) => `${Math.floor(t / 60)}:${(t % 60).toFixed(1).padStart(4, '0')}`;

function tickTimes(v0: number, v1: number): number[] {
  const span = v1 - v0;
  const step = [1, 2, 5, 10, 15, 30, 60, 120, 300, 600, 900].find((s) => span / s <= 12) ?? 1800;
  const out: number[] = [];
  for (let t = Math.ceil(v0 / step) * step; t <= v1; t += step) out.push(t);
  return out;
}

export { kindWord };
