/**
 * Browser side of bench/overlay.bench.ts: the overlay renderer with every layer on at 1080p,
 * the same shapes drawn with Canvas 2D as the reference, and the demo footage played with
 * the overlay drawn on each presented frame.
 */
import { seededRandom } from '../engine/geometry/prng.ts';
import type { OverlayScene, ScenePlayer, SceneTrail } from '../renderer/src/overlay/contract.ts';
import { createOverlayRenderer } from '../renderer/src/overlay/renderer.ts';
import { allLayers, DEFAULT_TEAMS } from '../renderer/src/overlay/style.ts';

/** The engine's seeded PRNG (mulberry32), so every run draws the same scenes. */
const prng = seededRandom;

/** A broadcast-like homography for 1920x1080 footage (camera on the halfway line, looking down). */
const H = [12.6383 * 3, 4.60975 * 3, 960, 0, -1.04973 * 3, 164.701 * 3, 0, 0.0144055, 1];

export function scenes(count: number, width = 1920, height = 1080, view: 'footage' | 'pitch' = 'footage'): OverlayScene[] {
  const rnd = prng(7);
  const base: { x: number; y: number; vx: number; vy: number; team: 'home' | 'away'; shirt: number }[] = [];
  for (const team of ['home', 'away'] as const)
    for (let s = 1; s <= 11; s++) base.push({ x: (rnd() - 0.5) * 60, y: (rnd() - 0.5) * 50, vx: (rnd() - 0.5) * 6, vy: (rnd() - 0.5) * 6, team, shirt: s });
  const history: number[][] = base.map(() => []);
  const out: OverlayScene[] = [];
  for (let f = 0; f < count + 75; f++) {
    base.forEach((p, i) => {
      p.x = Math.max(-50, Math.min(50, p.x + p.vx / 25));
      p.y = Math.max(-32, Math.min(32, p.y + p.vy / 25));
      if (rnd() < 0.02) p.vx = (rnd() - 0.5) * 12;
      history[i].push(p.x, p.y);
      if (history[i].length > 150) history[i].splice(0, 2);
    });
    if (f < 75) continue;
    const players: ScenePlayer[] = base.map((p, i) => ({ id: `${p.team}_${p.shirt}`, team: p.team, shirt: p.shirt, goalkeeper: p.shirt === 1, x: p.x, y: p.y, _i: i }) as ScenePlayer);
    const trails: SceneTrail[] = players.map((p, i) => ({ id: p.id, team: p.team, points: Float32Array.from(history[i]) }));
    out.push({
      width,
      height,
      pitch: { length: 105, width: 68 },
      view: view === 'footage' ? { kind: 'footage', homography: H, imageWidth: 1920, imageHeight: 1080 } : { kind: 'pitch', margin: 24 },
      moment: { period: 1, t: f / 25 },
      live: true,
      players,
      ball: { x: base[3].x + 1, y: base[3].y },
      trails,
      teams: DEFAULT_TEAMS,
      layers: allLayers(true),
      homeAttacks: 'positive_x',
      distancePair: ['home_4', 'home_5'],
      teamLineCount: 3,
    });
  }
  return out;
}

function stats(ms: number[]) {
  const s = [...ms].sort((a, b) => a - b);
  return { median: s[Math.floor(s.length / 2)], p95: s[Math.floor(s.length * 0.95)], n: s.length };
}

/** Overlay draw time per frame (update + render + 1-pixel readback so the GPU work is counted). */
export async function pixiDraw(frames: number, prefer: 'webgl' | 'canvas' | 'auto' = 'webgl'): Promise<{ median: number; p95: number; n: number; backend: string }> {
  const sc = scenes(frames);
  const canvas = document.createElement('canvas');
  document.body.appendChild(canvas);
  const r = await createOverlayRenderer({ width: 1920, height: 1080, canvas, prefer });
  const gl = r.backend === 'webgl' ? ((canvas.getContext('webgl2') ?? canvas.getContext('webgl')) as WebGL2RenderingContext | null) : null;
  const c2d = r.backend === 'canvas' ? canvas.getContext('2d') : null;
  const px = new Uint8Array(4);
  for (let i = 0; i < 10; i++) r.draw(sc[i]); // warm-up (shader compile, font atlas)
  const ms: number[] = [];
  for (const s of sc) {
    const t0 = performance.now();
    r.draw(s);
    gl?.readPixels(0, 0, 1, 1, gl.RGBA, gl.UNSIGNED_BYTE, px);
    c2d?.getImageData(0, 0, 1, 1);
    ms.push(performance.now() - t0);
  }
  const out = { ...stats(ms), backend: r.backend };
  r.destroy();
  canvas.remove();
  return out;
}

/** Reference: the same shapes (markers, numbers, trails, lines, polygons) with Canvas 2D. */
export function canvas2dDraw(frames: number): { median: number; p95: number; n: number } {
  const sc = scenes(frames);
  const canvas = document.createElement('canvas');
  canvas.width = 1920;
  canvas.height = 1080;
  document.body.appendChild(canvas);
  const ctx = canvas.getContext('2d')!;
  const proj = (x: number, y: number) => {
    const w = H[6] * x + H[7] * y + H[8];
    return [(H[0] * x + H[1] * y + H[2]) / w, (H[3] * x + H[4] * y + H[5]) / w];
  };
  const hex = (c: number) => `#${c.toString(16).padStart(6, '0')}`;
  const ms: number[] = [];
  for (const s of sc) {
    const t0 = performance.now();
    ctx.clearRect(0, 0, 1920, 1080);
    for (const tr of s.trails) {
      ctx.beginPath();
      for (let i = 0; i < tr.points.length; i += 2) {
        const [u, v] = proj(tr.points[i], tr.points[i + 1]);
        if (i) ctx.lineTo(u, v);
        else ctx.moveTo(u, v);
      }
      ctx.strokeStyle = hex(s.teams[tr.team as 'home'].colour);
      ctx.lineWidth = 3;
      ctx.stroke();
    }
    for (const team of ['home', 'away'] as const) {
      // hull-like polygon and Voronoi-like fills: one polygon per player
      ctx.globalAlpha = 0.2;
      ctx.fillStyle = hex(s.teams[team].colour);
      for (const p of s.players.filter((q) => q.team === team)) {
        ctx.beginPath();
        for (const [dx, dy] of [[-4, -4], [4, -4], [5, 3], [-3, 5]]) {
          const [u, v] = proj(p.x + dx, p.y + dy);
          ctx.lineTo(u, v);
        }
        ctx.closePath();
        ctx.fill();
      }
      ctx.globalAlpha = 1;
    }
    for (let k = 0; k < 8; k++) {
      const [a, b] = [proj(-20 + k * 5, -34), proj(-20 + k * 5, 34)];
      ctx.beginPath();
      ctx.moveTo(a[0], a[1]);
      ctx.lineTo(b[0], b[1]);
      ctx.strokeStyle = '#fff3a0';
      ctx.stroke();
    }
    ctx.font = 'bold 13px sans-serif';
    ctx.textAlign = 'center';
    ctx.textBaseline = 'middle';
    for (const p of s.players) {
      const [u, v] = proj(p.x, p.y);
      const st = s.teams[p.team];
      ctx.beginPath();
      ctx.arc(u, v, 11, 0, Math.PI * 2);
      ctx.fillStyle = hex(st.colour);
      ctx.fill();
      ctx.strokeStyle = hex(st.outline);
      ctx.lineWidth = 2.4;
      ctx.stroke();
      ctx.fillStyle = hex(st.label);
      ctx.fillText(String(p.shirt), u, v);
    }
    ctx.getImageData(0, 0, 1, 1);
    ms.push(performance.now() - t0);
  }
  canvas.remove();
  return stats(ms);
}

/** Plays the footage for `seconds` with the full overlay drawn on every presented frame. */
export async function playback(url: string, seconds: number): Promise<{ presented: number; expected: number; dropped: number; drawMedian: number; drawP95: number; fps: number }> {
  const video = document.createElement('video');
  video.muted = true;
  video.src = url;
  video.style.width = '1280px';
  document.body.appendChild(video);
  await new Promise((r) => video.addEventListener('canplay', r, { once: true }));
  const canvas = document.createElement('canvas');
  document.body.appendChild(canvas);
  const r = await createOverlayRenderer({ width: 1920, height: 1080, canvas });
  const sc = scenes(seconds * 25 + 50);
  const ms: number[] = [];
  let presented = 0;
  let first = -1;
  let last = 0;
  await new Promise<void>((done) => {
    const onFrame = (_now: number, meta: VideoFrameCallbackMetadata) => {
      if (first < 0) first = meta.mediaTime;
      last = meta.mediaTime;
      presented++;
      const t0 = performance.now();
      r.draw(sc[presented % sc.length]);
      ms.push(performance.now() - t0);
      if (meta.mediaTime - first >= seconds) return done();
      video.requestVideoFrameCallback(onFrame);
    };
    video.requestVideoFrameCallback(onFrame);
    void video.play();
  });
  video.pause();
  const q = video.getVideoPlaybackQuality();
  const s = stats(ms);
  r.destroy();
  return { presented, expected: Math.round((last - first) * 25) + 1, dropped: q.droppedVideoFrames, drawMedian: s.median, drawP95: s.p95, fps: presented / (last - first || 1) };
}
