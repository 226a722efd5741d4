/**
 * <MarksBar /> — in/out marks at the frame on screen (Y / U, Shift+U clears, or the
 * buttons), their match clock and length, and "Add marked clip to reel…". Watch and Sync
 * both show it under their player; useMarks() gives the screen the marks for the scrub bar.
 */
import { useCallback, useEffect, useMemo, useRef, useState } from 'react';
import type { FootageProbe } from '../../../shared-types/index.ts';
import { useServices } from '../app/context.ts';
import { isTypingTarget } from '../app/keys.ts';
import { useLive } from '../app/useLive.ts';
import type { MatchClocks, PlayerControl } from '../player/index.ts';
import { addMarkedClip, type ReelChoice } from './add-marked-clip.ts';
import { MARK_KEYS, markActionOf, type MarkAction } from './mark-keys.ts';
import { durationText, frameClock, markedSpan, marksReadout, type FrameMarks, type MarkInputs } from './mark-span.ts';
import { loadLastReel, loadMarks, saveMarks } from './mark-store.ts';
import './marks.css';

/**
 * The stored marks of this footage (undefined while loading) and an updater that stores
 * them. Updates build on the last marks written, not the last read back, so Y then U
 * pressed faster than the database answers keeps both.
 */
export function useMarks(projectId: number, footageSourceId: number | undefined) {
  const { db } = useServices();
  const marks = useLive(() => (footageSourceId === undefined ? Promise.resolve<FrameMarks>({}) : loadMarks(db, projectId, footageSourceId)), [projectId, footageSourceId]);
  const latest = useRef<FrameMarks | undefined>(undefined);
  useEffect(() => {
    latest.current = marks;
  }, [marks]);
  const updateMarks = useCallback(
    (change: (m: FrameMarks) => FrameMarks) => {
      if (footageSourceId === undefined) return Promise.resolve();
      const next = change(latest.current ?? {});
      latest.current = next;
      return saveMarks(db, projectId, footageSourceId, next);
    },
    [db, projectId, footageSourceId],
  );
  return { marks, updateMarks };
}

interface Props {
  projectId: number;
  marks: FrameMarks | undefined;
  updateMarks: (change: (m: FrameMarks) => FrameMarks) => Promise<void>;
  probe: Pick<FootageProbe, 'pts' | 'nominalFps'> | undefined;
  clocks: MatchClocks;
  player: PlayerControl | null;
  /** Overlay layers a clip added from here shows (Watch: the ones on screen). */
  layers?: string[];
}

const NEW = 'new';

export function MarksBar({ projectId, marks, updateMarks, probe, clocks, player, layers }: Props) {
  const { db, info } = useServices();
  const [status, setStatus] = useState('');
  const [problem, setProblem] = useState('');
  const [adding, setAdding] = useState(false);
  const inputs: MarkInputs | undefined = useMemo(() => (probe ? { pts: probe.pts, nominalFps: probe.nominalFps, fit: clocks.fit, ...(clocks.eventFit ? { eventFit: clocks.eventFit } : {}) } : undefined), [probe, clocks.fit, clocks.eventFit]);
  const result = useMemo(() => (inputs && marks ? markedSpan(marks, inputs) : undefined), [inputs, marks]);
  const hasMarks = marks?.inFrame !== undefined || marks?.outFrame !== undefined;

  const act = useCallback(
    (a: MarkAction) => {
      setStatus('');
      setProblem('');
      const f = player?.current;
      if (a !== 'clear' && !f) return setProblem('No frame on screen yet: wait for the footage to show, then mark.');
      const change = (m: FrameMarks): FrameMarks => (a === 'clear' ? {} : { ...m, [a === 'in' ? 'inFrame' : 'outFrame']: f!.index });
      void updateMarks(change).catch((e: Error) => setProblem(`The marks were not kept: ${e.message}`));
    },
    [player, updateMarks],
  );

  useEffect(() => {
    const onKey = (e: KeyboardEvent) => {
      if (e.defaultPrevented || isTypingTarget(e.target) || document.querySelector('dialog[open]')) return;
      const a = markActionOf(e);
      if (!a) return;
      e.preventDefault();
      act(a);
    };
    window.addEventListener('keydown', onKey);
    return () => window.removeEventListener('keydown', onKey);
  }, [act]);

  const markText = (frame: number | undefined) => (frame === undefined ? 'not marked' : `${inputs ? frameClock(frame, inputs) : ''} · frame ${frame}`);

  return (
    <section className="mk-bar" aria-label="In and out marks">
      <div className="mk-row">
        <button type="button" onClick={() => act('in')} disabled={!player} title={`Mark the in point at the frame on screen (${MARK_KEYS.in})`} aria-keyshortcuts={MARK_KEYS.in}>
          <kbd>{MARK_KEYS.in}</kbd> Mark in
        </button>
        <button type="button" className="quiet mono mk-point" data-testid="mark-in" disabled={marks?.inFrame === undefined || !player} onClick={() => marks?.inFrame !== undefined && void player?.seekToFrame(marks.inFrame)} title="Go to the in point">
          {markText(marks?.inFrame)}
        </button>
        <button type="button" onClick={() => act('out')} disabled={!player} title={`Mark the out point (the clip's last frame) at the frame on screen (${MARK_KEYS.out})`} aria-keyshortcuts={MARK_KEYS.out}>
          <kbd>{MARK_KEYS.out}</kbd> Mark out
        </button>
        <button type="button" className="quiet mono mk-point" data-testid="mark-out" disabled={marks?.outFrame === undefined || !player} onClick={() => marks?.outFrame !== undefined && void player?.seekToFrame(marks.outFrame)} title="Go to the out point">
          {markText(marks?.outFrame)}
        </button>
        <button type="button" className="quiet" onClick={() => act('clear')} disabled={!hasMarks} title="Clear both marks (Shift+U)" aria-keyshortcuts={MARK_KEYS.clear}>
          <kbd>⇧U</kbd> Clear
        </button>
        <button type="button" className="primary" disabled={!result?.ok} onClick={() => setAdding((v) => !v)} aria-expanded={adding} title={result && !result.ok ? result.problem : 'Add the marked span as a clip to a reel'}>
          Add marked clip to reel…
        </button>
      </div>
      {hasMarks && result && (
        <p className={result.ok ? 'mono small mk-readout' : 'small mk-readout warn-text'} data-testid="marks-readout">
          {marksReadout(result)}
          {result.ok && result.span.unfittedS > 0 && ` · includes ${result.span.unfittedS.toFixed(1)} s of footage outside the fit (a replay or cut: no overlay there)`}
        </p>
      )}
      {adding && result?.ok && (
        <AddToReel
          projectId={projectId}
          defaultTitle={result.span.title}
          onCancel={() => setAdding(false)}
          onAdd={async (target, title) => {
            setProblem('');
            try {
              const added = await addMarkedClip(db, { projectId, user: info.userName }, result.span, target, title, layers);
              setAdding(false);
              setStatus(`Added to ${added.newReel ? 'new ' : ''}reel ‘${added.reelTitle}’ — ${durationText(added.durationS)} (Ctrl+Z takes it back)`);
            } catch (e) {
              setProblem(`Not added: ${(e as Error).message}`);
            }
          }}
        />
      )}
      {problem && (
        <p className="error-text small" role="alert">
          {problem}
        </p>
      )}
      <p className="small mk-status" role="status" aria-live="polite" data-testid="marks-status">
        {status}
      </p>
    </section>
  );
}

function AddToReel({ projectId, defaultTitle, onAdd, onCancel }: { projectId: number; defaultTitle: string; onAdd: (target: ReelChoice, title: string) => Promise<void>; onCancel: () => void }) {
  const { db } = useServices();
  const reels = useLive(() => db.reels.where('projectId').equals(projectId).sortBy('createdAt'), [projectId]);
  const lastReel = useLive(() => loadLastReel(db, projectId).then((id) => id ?? null), [projectId]);
  const [choice, setChoice] = useState<string | undefined>();
  const [newTitle, setNewTitle] = useState('Marked clips');
  const [title, setTitle] = useState('');
  const [busy, setBusy] = useState(false);
  if (!reels || lastReel === undefined) return null;
  // The reel last used on the Reels screen, else the newest, else a new one.
  const fallback = reels.find((r) => r.id === lastReel)?.id ?? reels[reels.length - 1]?.id;
  const picked = choice ?? (fallback !== undefined ? String(fallback) : NEW);
  const submit = async () => {
    if (busy) return;
    setBusy(true);
    try {
      await onAdd(picked === NEW ? { newReelTitle: newTitle } : { reelId: Number(picked) }, title);
    } finally {
      setBusy(false);
    }
  };
  return (
    <form
      className="mk-add"
      aria-label="Add marked clip to reel"
      onSubmit={(e) => {
        e.preventDefault();
        void submit();
      }}
      onKeyDown={(e) => e.key === 'Escape' && onCancel()}
    >
      <label className="field">
        Reel
        <select value={picked} onChange={(e) => setChoice(e.target.value)} aria-label="Reel to add to">
          {reels.map((r) => (
            <option key={r.id} value={String(r.id)}>
              {r.title}
              {r.id === lastReel ? ' (last used)' : ''}
            </option>
          ))}
          <option value={NEW}>New reel…</option>
        </select>
      </label>
      {picked === NEW && (
        <label className="field">
          New reel title
          <input value={newTitle} onChange={(e) => setNewTitle(e.target.value)} aria-label="New reel title" size={16} />
        </label>
      )}
      <label className="field grow">
        Clip title
        <input value={title} onChange={(e) => setTitle(e.target.value)} placeholder={defaultTitle} aria-label="Clip title" />
      </label>
      <button type="submit" className="primary" disabled={busy}>
        Add
      </button>
      <button type="button" className="quiet" onClick={onCancel}>
        Cancel
      </button>
    </form>
  );
}
