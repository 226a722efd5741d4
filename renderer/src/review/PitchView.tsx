/**
 * A small top-down pitch (SVG, metres, centre origin, y up) with every tracked position at
 * one instant, the logged place (open ring) and the proposed place (filled square, signal
 * colour) joined by a line. The proposed place can be dragged; `onPlace` gets the metres
 * on release. Markings per the Laws of the Game, Law 1 (penalty area 16.5 m deep and
 * 40.32 m wide, goal area 5.5 m × 18.32 m, centre circle radius 9.15 m, penalty mark 11 m).
 */
import { useRef, useState, type PointerEvent as ReactPointerEvent } from 'react';
import type { PitchSize, TeamSide } from '../../../shared-types/index.ts';

export interface PitchDot {
  x: number;
  y: number;
  team?: TeamSide;
  label?: string;
  ball?: boolean;
  /** The player the event names (drawn with a ring). */
  tagged?: boolean;
}

export interface PitchViewProps {
  pitch: PitchSize;
  dots: PitchDot[];
  logged?: { x: number; y: number };
  proposed?: { x: number; y: number };
  /** Which moment the dots show (caption only). */
  caption: string;
  onPlace?: (x: number, y: number) => void;
}

export function PitchView({ pitch, dots, logged, proposed, caption, onPlace }: PitchViewProps) {
  const L = pitch.length, W = pitch.width;
  const m = 3;
  const svg = useRef<SVGSVGElement | null>(null);
  const [drag, setDrag] = useState<{ x: number; y: number } | null>(null);
  const toPitch = (e: ReactPointerEvent) => {
    const el = svg.current!;
    const pt = el.createSVGPoint();
    pt.x = e.clientX;
    pt.y = e.clientY;
    const p = pt.matrixTransform(el.getScreenCTM()!.inverse());
    // The drawing flips y (SVG y goes down); clamp to the pitch and a little beyond.
    return { x: Math.max(-L / 2 - 2, Math.min(L / 2 + 2, p.x)), y: Math.max(-W / 2 - 2, Math.min(W / 2 + 2, -p.y)) };
  };
  const shown = drag ?? proposed;
  const pa = (sign: 1 | -1) => {
    const gx = sign * L / 2;
    return (
      <g key={sign}>
        <rect x={sign > 0 ? gx - 16.5 : gx} y={-20.16} width={16.5} height={40.32} />
        <rect x={sign > 0 ? gx - 5.5 : gx} y={-9.16} width={5.5} height={18.32} />
        <circle cx={gx - sign * 11} cy={0} r={0.25} className="pv-spot" />
        <rect x={sign > 0 ? gx : gx - 1.5} y={-3.66} width={1.5} height={7.32} className="pv-goal" />
      </g>
    );
  };
  return (
    <figure className="pitch-view">
      <svg
        ref={svg}
        viewBox={`${-L / 2 - m} ${-W / 2 - m} ${L + 2 * m} ${W + 2 * m}`}
        role="img"
        aria-label={`Pitch view, ${caption}: ${dots.filter((d) => !d.ball).length} players${logged ? ', logged place' : ''}${shown ? ', proposed place' : ''}`}
        onPointerMove={(e) => drag && setDrag(toPitch(e))}
        onPointerUp={(e) => {
          if (!drag) return;
          const p = toPitch(e);
          setDrag(null);
          onPlace?.(p.x, p.y);
        }}
        onPointerCancel={() => setDrag(null)}
      >
        <g className="pv-lines">
          <rect x={-L / 2} y={-W / 2} width={L} height={W} />
          <line x1={0} y1={-W / 2} x2={0} y2={W / 2} />
          <circle cx={0} cy={0} r={9.15} />
          <circle cx={0} cy={0} r={0.25} className="pv-spot" />
          {pa(1)}
          {pa(-1)}
        </g>
        {dots.map((d, i) =>
          d.ball ? (
            <circle key={i} cx={d.x} cy={-d.y} r={0.8} className="pv-ball" />
          ) : (
            <g key={i} className={`pv-player pv-${d.team ?? 'other'}${d.tagged ? ' pv-tagged' : ''}`}>
              {d.team === 'away' ? (
                <rect x={d.x - 1.1} y={-d.y - 1.1} width={2.2} height={2.2} transform={`rotate(45 ${d.x} ${-d.y})`} />
              ) : (
                <circle cx={d.x} cy={-d.y} r={1.2} />
              )}
              {d.label && (
                <text x={d.x} y={-d.y + 0.6} textAnchor="middle">
                  {d.label}
                </text>
              )}
            </g>
          ),
        )}
        {logged && shown && <line className="pv-shift" x1={logged.x} y1={-logged.y} x2={shown.x} y2={-shown.y} />}
        {logged && (
          <g className="pv-logged" data-testid="pitch-logged">
            <circle cx={logged.x} cy={-logged.y} r={2.2} />
            <text x={logged.x} y={-logged.y - 3}>logged</text>
          </g>
        )}
        {shown && (
          <g
            className={`pv-proposed${drag ? ' pv-dragging' : ''}`}
            data-testid="pitch-proposed"
            onPointerDown={(e) => {
              if (!onPlace) return;
              (e.currentTarget.ownerSVGElement ?? svg.current)?.setPointerCapture(e.pointerId);
              setDrag(toPitch(e));
            }}
          >
            <rect x={shown.x - 1.6} y={-shown.y - 1.6} width={3.2} height={3.2} />
            <circle cx={shown.x} cy={-shown.y} r={4} className="pv-grab" />
            <text x={shown.x} y={-shown.y + 5.2 > W / 2 + m - 0.5 ? -shown.y - 4.5 : -shown.y + 5.2}>{drag ? `${shown.x.toFixed(1)}, ${shown.y.toFixed(1)}` : 'proposed'}</text>
          </g>
        )}
      </svg>
      <figcaption className="small muted">{caption}{onPlace ? ' · drag the square to move the proposed place' : ''}</figcaption>
    </figure>
  );
}
