/**
 * The Reels screen: several reels per match, clips built from the corrected events by a
 * filter (with pre-roll and post-roll), one event at a time or from in/out times; merge,
 * reorder (drag or Alt+↑/↓), title, note and overlay layers per clip; clips touching
 * non-live footage flagged; export to the analyst's folder through the queue.
 * Every change is one undoable step (history commit()).
 */
import { useCallback, useEffect, useMemo, useRef, useState, type KeyboardEvent } from 'react';
import { EVENT_KINDS, type ClockFit, type EventKind, type TeamSide } from '../../../shared-types/index.ts';
import { useServices } from '../app/context.ts';
import { ConfirmDialog } from '../app/Dialogs.tsx';
import { useLive } from '../app/useLive.ts';
import type { EventRow, ExportJobRow } from '../db/rows.ts';
import { LAYER_MENU } from '../overlay/layers/index.ts';
import { matchClockText, trackingToEventClock, type ClipPlan } from '../export-clips/plan.ts';
import { loadExportContext, outputNames, planClips, queueExport, type ExportContext } from '../export-clips/run-export.ts';
import { DEFAULT_TITLE_CARD_S } from '../export-clips/title-card.ts';
import { eventToTracking, eventsMatching, kindWord, spanFromPoints, spansFromEvents, type EventFilter } from './clip-rules.ts';
import { cancelJob, clipsLeft, startQueue, useLiveProgress, type LiveProgress } from './export-queue.ts';
import { addClips, addReel, clipsOfReel, deleteClips, deleteReel, mergeClipsInReel, moveClip, renameReel, updateClip, type StoredClip } from './reel-actions.ts';
import { loadLastReel, saveLastReel } from '../marks/mark-store.ts';
import './reels.css';

/** "12:04" / "46:10.5" (match clock) -> seconds since the period's start. */
export function parseClock(text: string, period: number | undefined): number | undefined {
  const m = /^\s*(\d{1,3})(?::(\d{1,2}(?:\.\d+)?))?\s*$/.exec(text);
  if (!m) return undefined;
  const s = m[2] === undefined ? Number(m[1]) * 60 : Number(m[1]) * 60 + Number(m[2]);
  return period === 2 && s >= 45 * 60 ? s - 45 * 60 : s;
}

export function ReelsScreen({ projectId }: { projectId: number }) {
  const { db, info } = useServices();
  const ctx = useMemo(() => ({ projectId, user: info.userName }), [projectId, info.userName]);
  const reels = useLive(() => db.reels.where('projectId').equals(projectId).sortBy('createdAt'), [projectId]);
  const [reelId, setReelId] = useState<number | undefined>();
  const [error, setError] = useState('');
  const [confirmDelete, setConfirmDelete] = useState(false);
  // The reel open here is the one Watch and Sync add marked clips to by default.
  const lastReel = useLive(() => loadLastReel(db, projectId).then((id) => id ?? null), [projectId]);
  const current = reels?.find((r) => r.id === (reelId ?? lastReel)) ?? reels?.[0];
  useEffect(() => {
    if (current?.id !== undefined && lastReel !== undefined && current.id !== lastReel) void saveLastReel(db, projectId, current.id);
  }, [db, projectId, current?.id, lastReel]);
  const safe = useCallback(
    async (f: () => Promise<unknown>) => {
      setError('');
      try {
        await f();
      } catch (e) {
        setError((e as Error).message);
      }
    },
    [],
  );

  return (
    <div className="reels" aria-label="Reels">
      <div className="screen-head">
        <h1>Reels</h1>
        <span className="muted">clip lists for a meeting, exported with the overlays as drawn on Watch</span>
      </div>
      {error && (
        <p className="error-text" role="alert">
          {error}
        </p>
      )}
      <div className="reels-layout">
        <nav className="panel reels-list" aria-label="Reels of this match">
          <h3>Reels</h3>
          <ul>
            {(reels ?? []).map((r) => (
              <li key={r.id}>
                <button className={r.id === current?.id ? 'reel-pick current' : 'reel-pick'} aria-current={r.id === current?.id} onClick={() => setReelId(r.id)}>
                  {r.title}
                </button>
              </li>
            ))}
          </ul>
          <button onClick={() => safe(async () => setReelId(await addReel(db, ctx, `Reel ${(reels?.length ?? 0) + 1}`)))}>New reel</button>
          {current && (
            <div className="reel-tools">
              <label className="field">
                Title
                <input
                  key={current.id + current.title}
                  defaultValue={current.title}
                  aria-label="Reel title"
                  onBlur={(e) => e.target.value.trim() && e.target.value !== current.title && void safe(() => renameReel(db, ctx, current.id!, e.target.value.trim()))}
                  onKeyDown={(e) => e.key === 'Enter' && (e.target as HTMLInputElement).blur()}
                />
              </label>
              <button className="quiet danger-text" onClick={() => setConfirmDelete(true)}>
                Delete reel
              </button>
            </div>
          )}
        </nav>
        <div className="reels-main">
          {!current ? (
            <div className="empty">
              <p>No reel yet. A reel is one topic for a meeting (every corner against us, one player's pressing).</p>
              <button className="primary" onClick={() => safe(async () => setReelId(await addReel(db, ctx, 'Corners')))}>
                Start a reel
              </button>
            </div>
          ) : (
            <ReelBody key={current.id} reelId={current.id!} reelTitle={current.title} projectId={projectId} ctx={ctx} onError={setError} />
          )}
        </div>
      </div>
      {confirmDelete && current && (
        <ConfirmDialog
          title="Delete reel"
          message={`Delete “${current.title}” and its clips? Ctrl+Z brings it back.`}
          confirmLabel="Delete"
          onCancel={() => setConfirmDelete(false)}
          onConfirm={() => {
            setConfirmDelete(false);
            void safe(() => deleteReel(db, ctx, current.id!));
          }}
        />
      )}
    </div>
  );
}

interface BodyProps {
  reelId: number;
  reelTitle: string;
  projectId: number;
  ctx: { projectId: number; user: string };
  onError: (m: string) => void;
}

function ReelBody({ reelId, reelTitle, projectId, ctx, onError }: BodyProps) {
  const { db, host } = useServices();
  const clips = useLive(() => clipsOfReel(db, reelId), [reelId]);
  const events = useLive(() => db.events.where('projectId').equals(projectId).toArray(), [projectId]);
  const fits = useLive(() => db.clockFits.where('projectId').equals(projectId).toArray(), [projectId]);
  const eventFit = useMemo(() => fits?.filter((f) => f.fit.source === 'events').sort((a, b) => b.createdAt - a.createdAt)[0]?.fit, [fits]);
  const [exportCtx, setExportCtx] = useState<ExportContext | undefined>();
  const [ctxProblem, setCtxProblem] = useState('');
  const nonLiveCount = useLive(() => db.nonLive.where('projectId').equals(projectId).count(), [projectId]);

  useEffect(() => {
    let live = true;
    loadExportContext(db, host, projectId).then(
      (c) => live && (setExportCtx(c), setCtxProblem('')),
      (e: Error) => live && (setExportCtx(undefined), setCtxProblem(e.message)),
    );
    return () => {
      live = false;
    };
  }, [db, host, projectId, fits, nonLiveCount]);

  const planned = useMemo(() => {
    const map = new Map<number, ClipPlan | string>();
    if (!exportCtx || !clips) return map;
    clips.forEach((c, i) => {
      const { plans, problems } = planClips(exportCtx, [{ ...c }]);
      map.set(c.id, plans[0] ? { ...plans[0], index: i } : problems[0] ?? 'cannot plan');
    });
    return map;
  }, [exportCtx, clips]);

  const safe = useCallback(
    async (f: () => Promise<unknown>) => {
      onError('');
      try {
        await f();
      } catch (e) {
        onError((e as Error).message);
      }
    },
    [onError],
  );

  return (
    <>
      <ClipBuilder events={events ?? []} eventFit={eventFit} onAdd={(spans) => safe(() => addClips(db, ctx, reelId, spans))} />
      <section className="panel" aria-label="Clips">
        <div className="panel-head">
          <h2>
            Clips <span className="muted">{clips?.length ?? 0}</span>
          </h2>
          <div className="actions">
            <button title="Join clips of the same period that overlap" onClick={() => safe(async () => {
              const n = await mergeClipsInReel(db, ctx, reelId);
              if (!n) onError('No clips overlap: nothing was merged.');
            })}>
              Merge overlapping
            </button>
          </div>
        </div>
        {!clips?.length ? (
          <p className="muted">No clips yet: pick events above and add them.</p>
        ) : (
          <ClipList clips={clips} planned={planned} eventFit={eventFit} reelId={reelId} ctx={ctx} safe={safe} />
        )}
      </section>
      <ExportPanel reelId={reelId} reelTitle={reelTitle} projectId={projectId} clips={clips ?? []} exportCtx={exportCtx} ctxProblem={ctxProblem} planned={planned} onError={onError} />
    </>
  );
}

function ClipBuilder({ events, eventFit, onAdd }: { events: EventRow[]; eventFit?: ClockFit; onAdd: (spans: ReturnType<typeof spansFromEvents>) => void }) {
  const [kinds, setKinds] = useState<EventKind[]>(['corner']);
  const [team, setTeam] = useState<'' | TeamSide>('');
  const [player, setPlayer] = useState('');
  const [period, setPeriod] = useState<'' | '1' | '2'>('');
  const [from, setFrom] = useState('');
  const [to, setTo] = useState('');
  const [corrected, setCorrected] = useState<'' | 'corrected' | 'uncorrected'>('');
  const [pre, setPre] = useState(5);
  const [post, setPost] = useState(8);
  const [mark, setMark] = useState({ period: '1', inT: '', outT: '' });
  const [markError, setMarkError] = useState('');
  const present = useMemo(() => EVENT_KINDS.filter((k) => events.some((e) => e.current.kind === k)), [events]);
  const per = period ? Number(period) : undefined;
  const filter: EventFilter = {
    ...(kinds.length ? { kinds } : {}),
    ...(team ? { team } : {}),
    ...(player.trim() ? { player } : {}),
    ...(per ? { period: per } : {}),
    ...(parseClock(from, per) !== undefined ? { fromT: parseClock(from, per) } : {}),
    ...(parseClock(to, per) !== undefined ? { toT: parseClock(to, per) } : {}),
    ...(corrected ? { corrected } : {}),
  };
  const picked = eventsMatching(events, filter).sort((a, b) => a.current.period - b.current.period || a.current.t - b.current.t);
  const roll = { preRoll: Math.max(0, pre), postRoll: Math.max(0, post) };

  return (
    <section className="panel" aria-label="Build clips">
      <div className="panel-head">
        <h2>Build clips from events</h2>
        <span className="muted small">times are the match clock of the corrected events</span>
      </div>
      <div className="reels-filter">
        <fieldset className="group">
          <legend>Kinds</legend>
          <div className="kind-chips">
            {present.map((k) => (
              <label key={k} className={kinds.includes(k) ? 'chip on' : 'chip'}>
                <input type="checkbox" checked={kinds.includes(k)} onChange={(e) => setKinds((ks) => (e.target.checked ? [...ks, k] : ks.filter((x) => x !== k)))} />
                {kindWord(k)}
              </label>
            ))}
          </div>
        </fieldset>
        <label className="field">
          Team
          <select value={team} onChange={(e) => setTeam(e.target.value as '' | TeamSide)} aria-label="Team">
            <option value="">both</option>
            <option value="home">home</option>
            <option value="away">away</option>
          </select>
        </label>
        <label className="field">
          Player
          <input value={player} onChange={(e) => setPlayer(e.target.value)} placeholder="shirt" size={5} aria-label="Player" />
        </label>
        <label className="field">
          Period
          <select value={period} onChange={(e) => setPeriod(e.target.value as '' | '1' | '2')} aria-label="Period">
            <option value="">any</option>
            <option value="1">1st</option>
            <option value="2">2nd</option>
          </select>
        </label>
        <label className="field">
          From
          <input value={from} onChange={(e) => setFrom(e.target.value)} placeholder="mm:ss" size={6} aria-label="From match clock" />
        </label>
        <label className="field">
          To
          <input value={to} onChange={(e) => setTo(e.target.value)} placeholder="mm:ss" size={6} aria-label="To match clock" />
        </label>
        <label className="field">
          Corrected
          <select value={corrected} onChange={(e) => setCorrected(e.target.value as typeof corrected)} aria-label="Corrected">
            <option value="">either</option>
            <option value="corrected">corrected only</option>
            <option value="uncorrected">unchanged only</option>
          </select>
        </label>
        <label className="field">
          Pre-roll s
          <input type="number" min={0} step={0.5} value={pre} onChange={(e) => setPre(Number(e.target.value))} aria-label="Pre-roll seconds" />
        </label>
        <label className="field">
          Post-roll s
          <input type="number" min={0} step={0.5} value={post} onChange={(e) => setPost(Number(e.target.value))} aria-label="Post-roll seconds" />
        </label>
      </div>
      <div className="reels-picked">
        <ul aria-label="Matching events">
          {picked.slice(0, 200).map((e) => (
            <li key={e.id}>
              <span className="mono">{matchClockText(e.current.period, e.current.t)}</span>
              <span>{kindWord(e.current.kind)}</span>
              <span className="muted">
                {e.current.team ?? ''} {e.current.player ?? ''}
              </span>
              {e.current.t !== e.logged.t && <span className="tag ok">corrected</span>}
              <button className="quiet small" title="Add this event as one clip" onClick={() => onAdd(spansFromEvents([e.current], roll, eventFit))}>
                Add
              </button>
            </li>
          ))}
        </ul>
        <div className="actions">
          <span className="muted">{picked.length} events match</span>
          <button className="primary" disabled={!picked.length} onClick={() => onAdd(spansFromEvents(picked.map((e) => e.current), roll, eventFit))}>
            Add {picked.length === 1 ? '1 clip' : `${picked.length} clips`}
          </button>
        </div>
      </div>
      <div className="panel-foot reels-mark">
        <span className="muted small">Or mark in and out (match clock):</span>
        <select value={mark.period} onChange={(e) => setMark({ ...mark, period: e.target.value })} aria-label="Marked clip period">
          <option value="1">1st</option>
          <option value="2">2nd</option>
        </select>
        <input value={mark.inT} onChange={(e) => setMark({ ...mark, inT: e.target.value })} placeholder="in mm:ss" size={7} aria-label="In point" />
        <input value={mark.outT} onChange={(e) => setMark({ ...mark, outT: e.target.value })} placeholder="out mm:ss" size={7} aria-label="Out point" />
        <button
          onClick={() => {
            setMarkError('');
            const p = Number(mark.period);
            const a = parseClock(mark.inT, p);
            const b = parseClock(mark.outT, p);
            if (a === undefined || b === undefined) return setMarkError('Give in and out as mm:ss, e.g. 12:04 and 12:20.');
            try {
              onAdd([spanFromPoints(p, eventToTracking(eventFit, p, a), eventToTracking(eventFit, p, b), `Marked ${mark.inT}–${mark.outT}`)]);
            } catch (e) {
              setMarkError((e as Error).message);
            }
          }}
        >
          Add marked clip
        </button>
        {markError && <span className="error-text small">{markError}</span>}
      </div>
    </section>
  );
}

interface ListProps {
  clips: StoredClip[];
  planned: Map<number, ClipPlan | string>;
  eventFit?: ClockFit;
  reelId: number;
  ctx: { projectId: number; user: string };
  safe: (f: () => Promise<unknown>) => Promise<void>;
}

function ClipList({ clips, planned, eventFit, reelId, ctx, safe }: ListProps) {
  const { db } = useServices();
  const [drag, setDrag] = useState<number | null>(null);
  const [over, setOver] = useState<number | null>(null);
  const rows = useRef<(HTMLLIElement | null)[]>([]);
  const clock = (p: number, t: number) => matchClockText(p, trackingToEventClock(eventFit, p, t));

  const onKey = (e: KeyboardEvent<HTMLLIElement>, i: number) => {
    if (e.target !== e.currentTarget) return; // keys typed into the title or note
    if (e.altKey && (e.key === 'ArrowUp' || e.key === 'ArrowDown')) {
      e.preventDefault();
      const to = e.key === 'ArrowUp' ? i - 1 : i + 1;
      if (to < 0 || to >= clips.length) return;
      void safe(() => moveClip(db, ctx, reelId, i, to)).then(() => setTimeout(() => rows.current[to]?.focus(), 50));
    } else if (e.key === 'ArrowUp' || e.key === 'ArrowDown') {
      e.preventDefault();
      rows.current[Math.max(0, Math.min(clips.length - 1, i + (e.key === 'ArrowUp' ? -1 : 1)))]?.focus();
    } else if (e.key === 'Delete') {
      e.preventDefault();
      void safe(() => deleteClips(db, ctx, [clips[i].id]));
    }
  };

  return (
    <ol className="clip-list" aria-label="Clips in order">
      {clips.map((c, i) => {
        const plan = planned.get(c.id);
        const flagged = typeof plan === 'object' && plan.nonLive.length > 0;
        return (
          <li
            key={c.id}
            ref={(el) => {
              rows.current[i] = el;
            }}
            tabIndex={0}
            className={`clip-row${over === i && drag !== null && drag !== i ? ' drop-here' : ''}${flagged ? ' flagged' : ''}`}
            draggable
            aria-keyshortcuts="Alt+ArrowUp Alt+ArrowDown Delete"
            title="Drag to reorder, or Alt+↑ / Alt+↓; Delete removes the clip"
            data-clip={c.id}
            onKeyDown={(e) => onKey(e, i)}
            onDragStart={(e) => {
              setDrag(i);
              e.dataTransfer.effectAllowed = 'move';
            }}
            onDragOver={(e) => {
              e.preventDefault();
              setOver(i);
            }}
            onDragEnd={() => {
              setDrag(null);
              setOver(null);
            }}
            onDrop={(e) => {
              e.preventDefault();
              const from = drag;
              setDrag(null);
              setOver(null);
              if (from !== null && from !== i) void safe(() => moveClip(db, ctx, reelId, from, i));
            }}
          >
            <span className="clip-grip" aria-hidden>
              ⋮⋮
            </span>
            <span className="clip-no num">{i + 1}</span>
            <div className="clip-main">
              <div className="clip-line">
                <input
                  className="clip-title"
                  key={`t${c.id}${c.title}`}
                  defaultValue={c.title ?? ''}
                  aria-label={`Title of clip ${i + 1}`}
                  onBlur={(e) => e.target.value !== (c.title ?? '') && void safe(() => updateClip(db, ctx, c.id, { title: e.target.value }, `retitle clip ${i + 1}`))}
                  onKeyDown={(e) => e.key === 'Enter' && (e.target as HTMLInputElement).blur()}
                />
                <span className="mono clip-times">
                  P{c.period} {clock(c.period, c.from)} – {clock(c.period, c.to)} · {(c.to - c.from).toFixed(1)} s
                </span>
                {typeof plan === 'object' && <span className="mono muted small">frames {plan.footage.inFrame}–{plan.footage.outFrame - 1}</span>}
                {flagged && typeof plan === 'object' && (
                  <span className="tag warn" title="This clip shows footage that is not live play; overlays are not drawn there">
                    touches {plan.nonLive.map((n) => n.kind.replace('_', '-')).join(', ')}
                  </span>
                )}
                {typeof plan === 'string' && <span className="tag error" title={plan}>cannot export</span>}
              </div>
              <textarea
                className="clip-note"
                key={`n${c.id}${c.note}`}
                defaultValue={c.note ?? ''}
                placeholder="Note for the meeting"
                rows={1}
                aria-label={`Note of clip ${i + 1}`}
                onBlur={(e) => e.target.value !== (c.note ?? '') && void safe(() => updateClip(db, ctx, c.id, { note: e.target.value }, `note on clip ${i + 1}`))}
              />
              <div className="clip-layers" role="group" aria-label={`Overlay layers of clip ${i + 1}`}>
                {/* The layers Watch lists (the same renderer draws them), in its reading order. */}
                {LAYER_MENU.map(({ id, title }) => {
                  const on = (c.layers ?? []).includes(id);
                  return (
                    <button
                      key={id}
                      className={on ? 'chip on' : 'chip'}
                      aria-pressed={on}
                      onClick={() => safe(() => updateClip(db, ctx, c.id, { layers: on ? (c.layers ?? []).filter((x) => x !== id) : [...(c.layers ?? []), id] }, `${on ? 'hide' : 'show'} ${title} on clip ${i + 1}`))}
                    >
                      {title}
                    </button>
                  );
                })}
              </div>
            </div>
            <div className="clip-side">
              <button className="quiet" aria-label={`Move clip ${i + 1} up`} title="Move up (Alt+↑)" disabled={i === 0} onClick={() => safe(() => moveClip(db, ctx, reelId, i, i - 1))}>
                ↑
              </button>
              <button className="quiet" aria-label={`Move clip ${i + 1} down`} title="Move down (Alt+↓)" disabled={i === clips.length - 1} onClick={() => safe(() => moveClip(db, ctx, reelId, i, i + 1))}>
                ↓
              </button>
              <button className="quiet danger-text" aria-label={`Remove clip ${i + 1}`} title="Remove (Delete)" onClick={() => safe(() => deleteClips(db, ctx, [c.id]))}>
                ✕
              </button>
            </div>
          </li>
        );
      })}
    </ol>
  );
}

interface ExportProps {
  reelId: number;
  reelTitle: string;
  projectId: number;
  clips: StoredClip[];
  exportCtx?: ExportContext;
  ctxProblem: string;
  planned: Map<number, ClipPlan | string>;
  onError: (m: string) => void;
}

interface ExportOptions {
  titleCard: boolean;
  /**
   * The analyst's choice; 'native' falls back to the built-in encoder when no ffmpeg is found.
   * Built-in is the default: on a 2-core machine with every layer on it measured faster
   * (bench/export.bench.ts), the renderer's drawing and read-back being the native path's limit.
   */
  encoder: 'native' | 'embedded';
}

function exportOptions(v: unknown): ExportOptions {
  const o = (v ?? {}) as Partial<ExportOptions>;
  return { titleCard: o.titleCard === true, encoder: o.encoder === 'native' ? 'native' : 'embedded' };
}

function ExportPanel({ reelId, reelTitle, projectId, clips, exportCtx, ctxProblem, planned, onError }: ExportProps) {
  const { db, host } = useServices();
  const folderSetting = useLive(() => db.settings.get(`exportFolder:${projectId}`).then((r) => (r?.value as string | undefined) ?? ''), [projectId]);
  const [folder, setFolder] = useState<string | undefined>();
  const jobs = useLive(() => db.exportJobs.where('projectId').equals(projectId).reverse().sortBy('createdAt'), [projectId]);
  const live = useLiveProgress();
  const [conflict, setConflict] = useState<{ names: string[]; dir: string } | null>(null);
  const dir = folder ?? folderSetting ?? '';
  const stored = useLive(() => db.settings.get(`exportOptions:${projectId}`).then((r) => exportOptions(r?.value)), [projectId]) ?? exportOptions(undefined);
  // The control shows the change at once; the stored copy catches up a moment later.
  const [changed, setChanged] = useState<Partial<ExportOptions>>({});
  // Another project has its own stored options: drop this one's unsaved echo.
  useEffect(() => setChanged({}), [projectId]);
  const options = { ...stored, ...changed };
  const setOptions = (patch: Partial<ExportOptions>) => {
    setChanged((c) => ({ ...c, ...patch }));
    void db.settings.put({ key: `exportOptions:${projectId}`, value: { ...options, ...patch } });
  };
  const [nativeAvailable, setNativeAvailable] = useState(false);
  useEffect(() => {
    host.info().then((i) => setNativeAvailable(!!i.nativeFfmpeg), () => setNativeAvailable(false));
  }, [host]);
  const encoder: 'native' | 'embedded' = nativeAvailable && options.encoder === 'native' ? 'native' : 'embedded';

  useEffect(() => {
    if (folderSetting === '' && folder === undefined) host.listDirectory().then((l) => setFolder((f) => f ?? l.path), () => {});
  }, [folderSetting, folder, host]);

  // Jobs a restart cut off are resumed by the app at start-up (App.tsx, reels/export-queue.ts),
  // not here: a panel mounted again while a job runs must leave it running.
  const flagged = clips.filter((c) => {
    const p = planned.get(c.id);
    return typeof p === 'object' && p.nonLive.length > 0;
  });
  const broken = clips.filter((c) => typeof planned.get(c.id) === 'string');

  const start = async (overwrite: boolean) => {
    onError('');
    const target = dir.trim();
    if (!target) return onError('Choose the folder to write into.');
    if (!exportCtx) return onError(ctxProblem || 'The export is not ready yet.');
    let listing;
    try {
      listing = await host.listDirectory(target);
    } catch (e) {
      return onError(`Cannot use the folder “${target}”: ${(e as Error).message}`);
    }
    const { plans, problems } = planClips(exportCtx, clips);
    if (problems.length) return onError(problems.join('\n'));
    const names = outputNames(reelTitle, plans);
    const all = [...names.clip.flatMap((n) => [n.mp4, n.vtt]), ...(plans.length > 1 ? [names.reel.mp4, names.reel.vtt] : []), names.csv, names.json];
    const taken = all.filter((n) => listing.entries.some((e) => e.name === n));
    if (taken.length && !overwrite) return setConflict({ names: taken, dir: listing.path });
    await db.settings.put({ key: `exportFolder:${projectId}`, value: listing.path });
    await queueExport(db, { projectId, reelId, clipIds: clips.map((c) => c.id), directory: listing.path, overwrite, path: encoder, ...(options.titleCard ? { titleCardS: DEFAULT_TITLE_CARD_S } : {}) });
    startQueue(db, host, projectId, onError);
  };

  return (
    <section className="panel" aria-label="Export">
      <div className="panel-head">
        <h2>Export</h2>
        <span className="muted small">H.264 MP4 per clip with the overlays burned in, WebVTT captions, and the reel's CSV and JSON sidecars</span>
      </div>
      {ctxProblem && <p className="error-text">{ctxProblem}</p>}
      {flagged.length > 0 && (
        <p className="warn-text" role="status">
          {flagged.length === 1 ? `Clip ${clips.indexOf(flagged[0]) + 1} touches` : `${flagged.length} clips (${flagged.map((c) => clips.indexOf(c) + 1).join(', ')}) touch`} footage that is not live play (a replay, half-time or a cut): no overlay is drawn there, and a clip end inside a replay is pulled in to live play.
        </p>
      )}
      {broken.length > 0 && <p className="error-text">{broken.length} clip(s) cannot be exported: {broken.map((c) => planned.get(c.id)).join(' ')}</p>}
      <div className="reels-export-row">
        <label className="field grow">
          Folder
          <input value={dir} onChange={(e) => setFolder(e.target.value)} aria-label="Export folder" className="mono" />
        </label>
        <button className="primary" disabled={!clips.length || !exportCtx} onClick={() => void start(false)}>
          Export reel ({clips.length === 1 ? '1 clip' : `${clips.length} clips`})
        </button>
      </div>
      <div className="reels-export-row reels-export-options">
        <label className="check">
          <input type="checkbox" checked={options.titleCard} onChange={(e) => setOptions({ titleCard: e.target.checked })} />
          Title card before each clip ({DEFAULT_TITLE_CARD_S} s: title, match clock, note)
        </label>
        <label className="field">
          Encoder
          <select value={encoder} onChange={(e) => setOptions({ encoder: e.target.value as ExportOptions['encoder'] })} aria-label="Encoder" disabled={!nativeAvailable}>
            <option value="embedded">built-in (nothing installed)</option>
            <option value="native">ffmpeg on this machine</option>
          </select>
        </label>
        {!nativeAvailable && <span className="muted small">No ffmpeg found on this machine: the built-in encoder is used.</span>}
      </div>
      {!!jobs?.length && (
        <ul className="job-list" aria-label="Export queue">
          {jobs.slice(0, 8).map((j) => {
            const l = live[j.id!];
            const pct = Math.round(100 * (j.state === 'running' && l ? l.fraction : j.progress));
            return (
              <li key={j.id} className={`job ${j.state}`} data-state={j.state}>
                <span className="job-state">{j.state}</span>
                <div className="job-bar" role="progressbar" aria-label={`Export ${j.id}`} aria-valuemin={0} aria-valuemax={100} aria-valuenow={pct}>
                  <div style={{ width: `${pct}%` }} />
                </div>
                <span className="mono small">{pct}%</span>
                {(j.state === 'running' || j.state === 'queued') ? (
                  <span className="muted small job-msg">{jobDoing(j, l)}</span>
                ) : (
                  j.message && <span className="muted small job-msg">{j.message}</span>
                )}
                {(j.state === 'running' || j.state === 'queued') && (
                  <button className="quiet" onClick={() => void cancelJob(db, j).catch((e: Error) => onError(e.message))}>
                    Cancel
                  </button>
                )}
                {j.state === 'done' && <span className="muted small">{j.outputs.length} files</span>}
              </li>
            );
          })}
        </ul>
      )}
      {conflict && (
        <ConfirmDialog
          title="Replace files?"
          message={`${conflict.names.length} file(s) of this reel already exist in ${conflict.dir} (${conflict.names.slice(0, 4).join(', ')}${conflict.names.length > 4 ? ', …' : ''}). Replace them?`}
          confirmLabel="Replace"
          onCancel={() => setConflict(null)}
          onConfirm={() => {
            setConflict(null);
            void start(true);
          }}
        />
      )}
    </section>
  );
}

/** What a queued or running job shows: resumed or not, clips left, time left, the file being written. */
function jobDoing(j: ExportJobRow, l: LiveProgress | undefined): string {
  const parts: string[] = [];
  const { left, total } = clipsLeft(j);
  if (j.message?.startsWith('resumed')) parts.push(`resumed after a restart: ${left} of ${total} clips left`);
  else if (j.state === 'queued') parts.push('waiting for the export before it');
  if (j.state === 'running' && l) {
    if (l.secondsLeft !== undefined) parts.push(`about ${Math.ceil(l.secondsLeft)} s left`);
    parts.push(l.doing);
  }
  return parts.join(' · ');
}
