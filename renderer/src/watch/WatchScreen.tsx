/**
 * The Watch screen: the footage with the overlay layers drawn for the frame on screen, a
 * 2-D pitch view of the same moment beside it, the layer toggles, and pitch registration
 * (landmarks clicked on a paused frame, keyframes for a moving camera).
 */
import { useCallback, useEffect, useMemo, useRef, useState } from 'react';
import { useServices } from '../app/context.ts';
import { isTypingTarget } from '../app/keys.ts';
import { useLive } from '../app/useLive.ts';
import type { DisplayedFrame } from '../player/contract.ts';
import type { LandmarkPair, OverlayData, OverlayRenderer, OverlaySettings, RegistrationData } from '../overlay/contract.ts';
import { isRegistrationData, loadOverlayData, loadRegistrationRow, overlaySources } from '../overlay/data.ts';
import { createOverlayRenderer } from '../overlay/renderer.ts';
import { buildOverlayScene, lastLiveMoment, notLiveAt } from '../overlay/scene.ts';
import { registrationAt } from '../overlay/registration-at.ts';
import { commit } from '../history/history.ts';
import { LayerPanel, layerForKey } from './LayerPanel.tsx';
import { LAYER_MENU } from '../overlay/layers/index.ts';
import { RegistrationPanel } from './registration/RegistrationPanel.tsx';
import { emptyRegistration, nudgePairs, suggestedPairs, withKeyframe, withoutKeyframe, withPair } from './registration/edit.ts';
import { markingsOf, solvePairs } from './registration/geometry.ts';
import { mergeSettings, saveSettings, settingsKey } from './overlay-settings.ts';
import { FootagePlayer, useFootageSource, type FootagePlayerControl } from '../player/index.ts';
import { MarksBar, useMarks } from '../marks/MarksBar.tsx';
import { MARK_KEYS } from '../marks/mark-keys.ts';
import './watch.css';

export function WatchScreen({ projectId }: { projectId: number }) {
  const { db, info } = useServices();
  const sources = useLive(() => overlaySources(db, projectId), [projectId]);
  const storedSettings = useLive(() => db.settings.get(settingsKey(projectId)).then((r) => r?.value ?? null), [projectId]);
  const settings = useMemo(() => mergeSettings(storedSettings), [storedSettings]);
  // Everything a scene is built from; reloaded when the fit, registration or non-live rows change.
  const version = useLive(
    async () => [await db.clockFits.where('projectId').equals(projectId).count(), JSON.stringify(await db.pitchRegistrations.where('projectId').equals(projectId).toArray()), JSON.stringify(await db.nonLive.where('projectId').equals(projectId).toArray())].join('|'),
    [projectId],
  );
  const regRow = useLive(() => (sources ? loadRegistrationRow(db, projectId, sources.footageSourceId) : Promise.resolve(undefined)), [sources?.footageSourceId, projectId]);
  const [data, setData] = useState<OverlayData | undefined>();
  const [loadError, setLoadError] = useState('');
  useEffect(() => {
    if (!sources || version === undefined) return;
    let stop = false;
    loadOverlayData(db, projectId, sources)
      .then((d) => !stop && setData(d))
      .catch((e) => !stop && setLoadError(`Loading the match for the overlay failed: ${(e as Error).message}`));
    return () => {
      stop = true;
    };
  }, [db, projectId, sources, version]);

  const footage = useFootageSource(projectId, sources?.footageSourceId);
  const probe = footage.probe;
  const [player, setPlayer] = useState<FootagePlayerControl | null>(null);
  const [frame, setFrame] = useState<DisplayedFrame | undefined>();
  const { marks, updateMarks } = useMarks(projectId, sources?.footageSourceId);

  // Registration working state (pairs on the current frame before they are saved).
  const [registering, setRegistering] = useState(false);
  const [pairs, setPairs] = useState<LandmarkPair[]>([]);
  const [landmarkId, setLandmarkId] = useState<string>('');
  const [selected, setSelected] = useState<number[] | 'all'>([]);
  const [message, setMessage] = useState('');
  const [showMarks, setShowMarks] = useState(false);
  const solved = useMemo(() => (pairs.length >= 4 ? solvePairs(pairs) : undefined), [pairs]);
  const registration: RegistrationData | undefined = regRow && isRegistrationData(regRow.data) ? regRow.data : undefined;

  const changeSettings = useCallback((s: OverlaySettings) => void saveSettings(db, projectId, s), [db, projectId]);

  // --- drawing -------------------------------------------------------------------------
  const footageHost = useRef<HTMLDivElement | null>(null);
  const pitchHost = useRef<HTMLDivElement | null>(null);
  const renderers = useRef<{ footage?: OverlayRenderer; pitch?: OverlayRenderer }>({});
  const [size, setSize] = useState({ width: 960, height: 540 });
  const stageRef = useRef<HTMLDivElement | null>(null);
  useEffect(() => {
    const el = stageRef.current;
    if (!el) return;
    const ro = new ResizeObserver(() => setSize({ width: Math.max(160, Math.round(el.clientWidth)), height: Math.max(90, Math.round(el.clientHeight)) }));
    ro.observe(el);
    return () => ro.disconnect();
  }, [footage.src, probe]);

  useEffect(() => {
    // Each mount makes its own canvases: a renderer destroyed late (StrictMode's second
    // mount, a fast screen switch) must not take the WebGL context of the live one with it.
    let dead = false;
    let made: { footage?: OverlayRenderer; pitch?: OverlayRenderer } = {};
    (async () => {
      const f = await createOverlayRenderer({ width: 960, height: 540 });
      const p = await createOverlayRenderer({ width: 480, height: 320 });
      made = { footage: f, pitch: p };
      if (dead) {
        f.destroy();
        p.destroy();
        return;
      }
      const fc = f.canvas as HTMLCanvasElement;
      fc.className = 'watch-overlay';
      fc.setAttribute('aria-label', 'Overlay on the footage');
      fc.dataset.testid = 'footage-overlay';
      const pc = p.canvas as HTMLCanvasElement;
      pc.setAttribute('aria-label', '2-D pitch view');
      pc.dataset.testid = 'pitch-view';
      renderers.current = made;
      setRenderersReady((n) => n + 1);
    })().catch((e) => setLoadError(`The overlay could not start: ${(e as Error).message}`));
    return () => {
      dead = true;
      made.footage?.destroy();
      made.pitch?.destroy();
      renderers.current = {};
    };
  }, []);
  const [renderersReady, setRenderersReady] = useState(0);
  // The canvases go into their hosts once both exist (the footage host appears with the player).
  useEffect(() => {
    const { footage: f, pitch: p } = renderers.current;
    if (f && footageHost.current && (f.canvas as HTMLCanvasElement).parentNode !== footageHost.current) footageHost.current.replaceChildren(f.canvas as HTMLCanvasElement);
    if (p && pitchHost.current && (p.canvas as HTMLCanvasElement).parentNode !== pitchHost.current) pitchHost.current.replaceChildren(p.canvas as HTMLCanvasElement);
  });
  useEffect(() => {
    const f = renderers.current.footage;
    if (!f) return;
    f.resize(size.width, size.height);
    (f.canvas as HTMLCanvasElement).style.width = `${size.width}px`;
    (f.canvas as HTMLCanvasElement).style.height = `${size.height}px`;
  }, [size, renderersReady]);

  const drawNow = useCallback(
    (f: DisplayedFrame | undefined) => {
      const r = renderers.current;
      if (!r.footage || !r.pitch || !data || !f) return;
      const working = registering && solved && 'homography' in solved ? solved.homography : undefined;
      // While registering, the fit being made is shown on this frame (markings and positions).
      const d = working ? { ...data, registration: { ...emptyRegistration(data.footage.width, data.footage.height), keyframes: [{ frame: f.index, t: f.t, pairs, homography: working, errors: [] }] } } : data;
      const markings = markingsOf(data.pitch);
      const scene = buildOverlayScene(d, f, settings, { width: size.width, height: size.height });
      r.footage.draw({ ...scene, markings, showMarkings: registering || showMarks });
      const pitchScene = buildOverlayScene(data, f, settings, { width: 480, height: 320, view: 'pitch', margin: 16 });
      r.pitch.draw({ ...pitchScene, markings });
    },
    [data, settings, size, registering, solved, pairs, showMarks],
  );

  useEffect(() => {
    if (!player) return;
    return player.onFrame((f) => {
      setFrame(f);
      drawNow(f);
    });
  }, [player, drawNow]);
  useEffect(() => drawNow(frame), [drawNow, frame, renderersReady]);

  // --- registration actions ------------------------------------------------------------
  const startRegistering = useCallback(() => {
    player?.pause();
    setRegistering(true);
    setMessage('');
    const f = player?.current;
    const kf = f && registration?.keyframes.find((k) => k.frame === f.index);
    if (kf) setPairs(kf.pairs);
    else if (f && registration?.keyframes.length && data) {
      // Quick add: start from the nearest keyframe's landmarks where the camera shows them now.
      const H = registrationAt(registration, f.index)!;
      const near = [...registration.keyframes].sort((a, b) => Math.abs(a.frame - f.index) - Math.abs(b.frame - f.index))[0];
      setPairs(suggestedPairs(near.pairs, H, data.footage.width, data.footage.height));
    } else setPairs([]);
  }, [player, registration, data]);

  const saveKeyframe = useCallback(async () => {
    const f = player?.current;
    if (!f || !data || !sources) return;
    if (!solved || !('homography' in solved)) {
      setMessage(solved && 'error' in solved ? solved.error : 'Click at least four landmarks first.');
      return;
    }
    const base = registration ?? emptyRegistration(data.footage.width, data.footage.height);
    const next = withKeyframe(base, { frame: f.index, t: f.t, pairs, homography: solved.homography, errors: solved.errors });
    await commit(db, {
      projectId,
      user: info.userName,
      subject: 'registration',
      what: `pitch registration: keyframe at frame ${f.index} (${pairs.length} landmarks)`,
      changes: [{ ...(regRow?.id !== undefined ? { key: regRow.id } : {}), table: 'pitchRegistrations', after: { projectId, footageSourceId: sources.footageSourceId, data: next, updatedAt: Date.now() } }],
    });
    setMessage(`Keyframe at frame ${f.index} saved.`);
    setRegistering(false);
  }, [player, data, sources, solved, registration, pairs, db, projectId, info.userName, regRow]);

  const deleteKeyframe = useCallback(
    async (frameIndex: number) => {
      if (!registration || regRow?.id === undefined) return;
      await commit(db, {
        projectId,
        user: info.userName,
        subject: 'registration',
        what: `pitch registration: delete keyframe at frame ${frameIndex}`,
        changes: [{ table: 'pitchRegistrations', key: regRow.id, after: { ...regRow, data: withoutKeyframe(registration, frameIndex), updatedAt: Date.now() } }],
      });
    },
    [registration, regRow, db, projectId, info.userName],
  );

  const onStageClick = useCallback(
    (e: React.MouseEvent<HTMLDivElement>) => {
      if (!registering || !data) return;
      if (!landmarkId) {
        setMessage('Choose the landmark to place in the list first.');
        return;
      }
      const lm = markingsLandmark(data, landmarkId);
      if (!lm) return;
      const rect = e.currentTarget.getBoundingClientRect();
      const u = ((e.clientX - rect.left) / rect.width) * data.footage.width;
      const v = ((e.clientY - rect.top) / rect.height) * data.footage.height;
      setPairs((ps) => withPair(ps, { landmarkId, x: lm.x, y: lm.y, u, v }));
      setLandmarkId(nextLandmark(data, landmarkId, pairs));
    },
    [registering, data, landmarkId, pairs],
  );

  // --- keys ------------------------------------------------------------------------------
  useEffect(() => {
    const onKey = (e: KeyboardEvent) => {
      // A focused layer checkbox takes no typed text: the layer keys still work there.
      const checkbox = e.target instanceof HTMLInputElement && e.target.type === 'checkbox';
      if ((isTypingTarget(e.target) && !checkbox) || e.altKey || e.metaKey) return;
      if (registering && e.ctrlKey && e.key.startsWith('Arrow')) {
        e.preventDefault();
        const step = e.shiftKey ? 0.25 : 1;
        const [du, dv] = { ArrowLeft: [-step, 0], ArrowRight: [step, 0], ArrowUp: [0, -step], ArrowDown: [0, step] }[e.key] ?? [0, 0];
        setPairs((ps) => nudgePairs(ps, selected, du, dv));
        return;
      }
      if (e.ctrlKey) return;
      if (e.key === 'r' || e.key === 'R') {
        e.preventDefault();
        if (registering) setRegistering(false);
        else startRegistering();
        return;
      }
      if (e.key === 'p' || e.key === 'P') {
        e.preventDefault();
        setShowMarks((v) => !v);
        return;
      }
      if (registering && (e.key === 's' || e.key === 'S')) {
        e.preventDefault();
        void saveKeyframe();
        return;
      }
      if (registering && e.key === 'Escape') {
        setRegistering(false);
        return;
      }
      const id = layerForKey(e.key);
      if (id) {
        e.preventDefault();
        const cur = settings.layers[id];
        const on = !(cur.home || cur.away);
        changeSettings({ ...settings, layers: { ...settings.layers, [id]: e.shiftKey ? { ...cur, away: !cur.away } : { home: on, away: on } } });
      }
    };
    window.addEventListener('keydown', onKey);
    return () => window.removeEventListener('keydown', onKey);
  }, [registering, selected, startRegistering, saveKeyframe, settings, changeSettings]);

  if (sources === undefined) return <p className="muted">Loading…</p>;
  if (!sources) {
    return (
      <section className="panel" aria-label="Watch">
        <h2>Watch</h2>
        <p className="muted">The Watch screen needs tracking and footage in this project. Add them on the Sources screen (Alt+1).</p>
      </section>
    );
  }
  const fitMissing = data && !data.fit;
  return (
    <section className="watch" aria-label="Watch">
      <div className="watch-main">
        {footage.error && <p className="error-text" role="alert">{footage.error}</p>}
        {footage.src && probe ? (
          <FootagePlayer src={footage.src} probe={probe} {...(footage.mediaOffset !== undefined ? { mediaOffset: footage.mediaOffset } : {})} clocks={footage.clocks} onControl={setPlayer} label="Footage with overlay" className="watch-player" {...(marks ? { marks } : {})}>
            <div className="watch-stage" ref={stageRef} data-registering={registering || undefined} onClick={onStageClick}>
              <div ref={footageHost} className="watch-overlay-host" />
              {registering && data && <PairMarkers pairs={pairs} solved={solved} w={data.footage.width} h={data.footage.height} selected={selected} />}
            </div>
          </FootagePlayer>
        ) : (
          <p className="muted">Opening the footage…</p>
        )}
        <WatchTransport frame={frame} data={data} showMarks={showMarks} onMarks={() => setShowMarks((v) => !v)} />
        <MarksBar projectId={projectId} marks={marks} updateMarks={updateMarks} probe={probe} clocks={footage.clocks} player={player} layers={LAYER_MENU.filter((l) => settings.layers[l.id].home || settings.layers[l.id].away).map((l) => l.id)} />
        <p className="muted small watch-keys">
 Overlay keys: {LAYER_MENU.map((l) => `${l.key} ${l.title.toLowerCase()}`).join(' · ')} (Shift: away only) · P pitch marks · R register · Clip marks: {MARK_KEYS.in} in · {MARK_KEYS.out} out · {MARK_KEYS.clear} clear
        </p>
        {loadError && <p className="error-text" role="alert">{loadError}</p>}
        {fitMissing && <p className="muted small">No footage clock fit yet: make one on the Sync screen (Alt+2); until then positions cannot be placed on the footage.</p>}
        {message && <p className="watch-message" role="status">{message}</p>}
      </div>
      <aside className="watch-side">
        <figure className="watch-pitch">
          <div ref={pitchHost} className="watch-pitch-host" />
          <figcaption className="muted small">Same moment on the pitch{frame && data ? '' : ''}</figcaption>
        </figure>
        <LayerPanel settings={settings} onChange={changeSettings} data={data} />
        <RegistrationPanel
          data={data}
          registration={registration}
          registering={registering}
          pairs={pairs}
          solved={solved}
          landmarkId={landmarkId}
          selected={selected}
          frame={frame}
          onLandmark={setLandmarkId}
          onSelect={setSelected}
          onStart={startRegistering}
          onCancel={() => setRegistering(false)}
          onSave={() => void saveKeyframe()}
          onClear={() => setPairs([])}
          onRemovePair={(i) => setPairs((ps) => ps.filter((_, j) => j !== i))}
          onNudge={(du, dv) => setPairs((ps) => nudgePairs(ps, selected, du, dv))}
          onGoTo={(k) => void player?.seekToFrame(k)}
          onDelete={(k) => void deleteKeyframe(k)}
        />
      </aside>
    </section>
  );
}

import { landmarksOf } from './registration/geometry.ts';

function markingsLandmark(data: OverlayData, id: string) {
  return landmarksOf(data.pitch).find((l) => l.id === id);
}

/** After a click, the next landmark of the list not placed yet. */
function nextLandmark(data: OverlayData, current: string, pairs: LandmarkPair[]): string {
  const all = landmarksOf(data.pitch);
  const placed = new Set([...pairs.map((p) => p.landmarkId), current]);
  const i = all.findIndex((l) => l.id === current);
  for (let k = 1; k <= all.length; k++) {
    const l = all[(i + k) % all.length];
    if (!placed.has(l.id)) return l.id;
  }
  return current;
}

function PairMarkers({ pairs, solved, w, h, selected }: { pairs: LandmarkPair[]; solved: ReturnType<typeof solvePairs> | undefined; w: number; h: number; selected: number[] | 'all' }) {
  return (
    <svg className="watch-pairs" viewBox={`0 0 ${w} ${h}`} preserveAspectRatio="none" aria-hidden="true">
      {pairs.map((p, i) => {
        const on = selected === 'all' || selected.includes(i);
        const err = solved && 'errors' in solved ? solved.errors[i] : undefined;
        return (
          <g key={p.landmarkId} className={on ? 'on' : undefined} data-error={err}>
            <line x1={p.u - 6} y1={p.v} x2={p.u + 6} y2={p.v} />
            <line x1={p.u} y1={p.v - 6} x2={p.u} y2={p.v + 6} />
            <circle cx={p.u} cy={p.v} r={4} />
          </g>
        );
      })}
    </svg>
  );
}

function WatchTransport({ frame, data, showMarks, onMarks }: { frame: DisplayedFrame | undefined; data: OverlayData | undefined; showMarks: boolean; onMarks: () => void }) {
  const reason = frame && data ? notLiveAt(data, frame.t) : undefined;
  const moment = frame && data ? lastLiveMoment(data, frame.t) : undefined;
  return (
    <div className="watch-transport">
      <button type="button" aria-pressed={showMarks} onClick={onMarks} title="Draw the registered pitch markings over the footage (P)" aria-keyshortcuts="P">
        Pitch marks <kbd>P</kbd>
      </button>
      <span className="mono" data-testid="watch-frame">
        {frame ? `frame ${frame.index} · ${frame.t.toFixed(2)} s` : 'no frame yet'}
      </span>
      {moment && (
        <span className="mono muted" data-testid="watch-moment">
          {reason ? `${reason}: last live moment ` : 'tracking '}P{moment.period} {formatClock(moment.t)}
        </span>
      )}
      {!moment && reason && <span className="muted small">{reason}</span>}
    </div>
  );
}

function formatClock(t: number): string {
  const m = Math.floor(t / 60);
  const s = t - m * 60;
  return `${m}:${s.toFixed(1).padStart(4, '0')}`;
}
