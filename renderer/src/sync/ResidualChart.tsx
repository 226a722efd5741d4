/**
 * A small residual chart on a canvas: one dot per fit point, residual (ms) against time,
 * used points filled, excluded or rejected ones hollow, the ±1 frame band shaded. Canvas,
 * not SVG, so a long match with hundreds of event points redraws at once.
 */
import { useEffect, useRef } from 'react';

export interface ResidualPoint {
  t: number;
  /** Residual, seconds. */
  r: number;
  used: boolean;
  /** Marked frames are drawn as discs, lagged pairings (whistles) as diamonds. */
  shape: 'disc' | 'diamond';
}

export function ResidualChart({ title, points, bandS, from, to, label }: { title: string; points: ResidualPoint[]; bandS: number; from: number; to: number; label: string }) {
  const ref = useRef<HTMLCanvasElement>(null);
  const finite = points.filter((p) => Number.isFinite(p.r));
  // Scale to the marks (discs) and at most half a second more: one vague whistle must not
  // flatten the frame-accurate points into a line. Points beyond sit on the edge.
  const maxAbs = Math.max(bandS * 2, ...finite.filter((p) => p.shape === 'disc').map((p) => Math.abs(p.r)), Math.min(0.5, Math.max(0, ...finite.map((p) => Math.abs(p.r))))) * 1.1;
  useEffect(() => {
    const c = ref.current;
    if (!c) return;
    const dpr = window.devicePixelRatio || 1;
    const w = c.clientWidth, h = c.clientHeight;
    c.width = Math.round(w * dpr);
    c.height = Math.round(h * dpr);
    const g = c.getContext('2d');
    if (!g) return;
    g.setTransform(dpr, 0, 0, dpr, 0, 0);
    g.clearRect(0, 0, w, h);
    const x = (t: number) => 4 + ((t - from) / Math.max(1e-9, to - from)) * (w - 8);
    const y = (r: number) => h / 2 - (r / maxAbs) * (h / 2 - 6);
    g.fillStyle = 'rgba(120, 160, 200, 0.18)';
    g.fillRect(0, y(bandS), w, y(-bandS) - y(bandS));
    g.strokeStyle = 'rgba(180, 190, 200, 0.6)';
    g.beginPath();
    g.moveTo(0, y(0));
    g.lineTo(w, y(0));
    g.stroke();
    for (const p of finite) {
      const px = x(p.t), py = y(Math.max(-maxAbs, Math.min(maxAbs, p.r)));
      g.beginPath();
      if (p.shape === 'disc') g.arc(px, py, 3.5, 0, 2 * Math.PI);
      else {
        g.moveTo(px, py - 4.5);
        g.lineTo(px + 4.5, py);
        g.lineTo(px, py + 4.5);
        g.lineTo(px - 4.5, py);
        g.closePath();
      }
      if (p.used) {
        g.fillStyle = p.shape === 'disc' ? '#e8eef5' : '#f0c05a';
        g.fill();
      } else {
        g.strokeStyle = '#9aa4ae';
        g.lineWidth = 1.5;
        g.stroke();
      }
    }
  }, [finite, from, to, maxAbs, bandS]);
  return (
    <figure className="sy-resid">
      <figcaption>
        {title} <span className="muted small">±{Math.round(maxAbs * 1000)} ms; band ±{Math.round(bandS * 1000)} ms</span>
      </figcaption>
      <canvas ref={ref} role="img" aria-label={label} />
    </figure>
  );
}
