/**
 * The Review screen: the engine's proposed corrections as a queue (restarts first, then by
 * size × confidence), the one under review with its logged and proposed moment and place,
 * the footage cued there (when a footage clock fit exists) and a pitch view of that
 * instant; accept, reject and edit by single keys, every decision one undoable commit.
 */
import { useCallback, useEffect, useMemo, useRef, useState } from 'react';
import { EVENT_KINDS, type ClockFit, type EventKind, type TrackingPeriod } from '../../../shared-types/index.ts';
import { AnalysisBar } from '../analysis/AnalysisBar.tsx';
import { analysisSources } from '../analysis/inputs.ts';
import { runKey, type AnalysisRun } from '../analysis/store-analysis.ts';
import { useServices } from '../app/context.ts';
import { isTypingTarget } from '../app/keys.ts';
import { useLive } from '../app/useLive.ts';
import { loadTrackingPeriod } from '../db/store.ts';
import { commit } from '../history/history.ts';
import { decisionChanges, decisionWhat, frameOf, type Decision } from './decisions.ts';
import { PitchView, type PitchDot } from './PitchView.tsx';
import { buildQueue, countQueue, filterQueue, nextOpen, NO_FILTER, openAbove, orderQueue, proposedPlace, type QueueFilter, type QueueItem } from './queue.ts';
import { ReviewFootage } from './ReviewFootage.tsx';
import { keyOf, REVIEW_KEYS, reviewActionFor, type ReviewAction } from './review-keys.ts';
import './review.css';

const kindName = (k: string) => k.replace(/_/g, ' ');

/** Tracking seconds as m:ss.ss (period clock). */
function clock(t: number): string {
  if (!Number.isFinite(t)) return '—';
  const sign = t < 0 ? '−' : '';
  const a = Math.abs(t);
  const m = Math.floor(a / 60);
  return `${sign}${m}:${(a - m * 60).toFixed(2).padStart(5, '0')}`;
}

const signed = (v: number, digits = 2) => `${v > 0 ? '+' : v < 0 ? '−' : '±'}${Math.abs(v).toFixed(digits)}`;

function newestFit(rows: { fit: ClockFit; createdAt: number; id?: number }[], source: ClockFit['source']): ClockFit | undefined {
  return rows.filter((r) => r.fit.source === source).sort((a, b) => b.createdAt - a.createdAt || (b.id ?? 0) - (a.id ?? 0))[0]?.fit;
}

export function ReviewScreen({ projectId }: { projectId: number }) {
  const { db, info } = useServices();
  const sources = useLive(() => analysisSources(db, projectId), [db, projectId]);
  const corrections = useLive(() => db.corrections.where('projectId').equals(projectId).toArray(), [db, projectId]);
  const events = useLive(() => db.events.where('projectId').equals(projectId).toArray(), [db, projectId]);
  const fits = useLive(() => db.clockFits.where('projectId').equals(projectId).toArray(), [db, projectId]);
  const meta = useLive(() => (sources ? db.trackingMeta.get(sources.trackingSourceId) : Promise.resolve(undefined)), [db, sources?.trackingSourceId]);
  const log = useLive(() => (sources ? db.eventLogs.get(sources.eventSourceId) : Promise.resolve(undefined)), [db, sources?.eventSourceId]);
  const lastRun = useLive(() => db.settings.get(runKey(projectId)).then((r) => r?.value as AnalysisRun | undefined), [db, projectId]);
  const footageSource = useLive(
    () => db.sources.where('projectId').equals(projectId).filter((s) => s.kind === 'footage').toArray().then((l) => l.sort((a, b) => b.importedAt - a.importedAt)[0]),
    [db, projectId],
  );
  const probe = useLive(() => (footageSource?.id !== undefined ? db.footage.get(footageSource.id).then((r) => r?.probe) : Promise.resolve(undefined)), [db, footageSource?.id]);

  const eventFit = useMemo(() => fits && newestFit(fits.filter((f) => f.sourceId === sources?.eventSourceId), 'events'), [fits, sources?.eventSourceId]);
  const footageFit = useMemo(() => fits && newestFit(fits.filter((f) => f.sourceId === footageSource?.id), 'footage'), [fits, footageSource?.id]);
  const rate = meta?.rate ?? lastRun?.rate ?? 25;

  const [filter, setFilter] = useState<QueueFilter>(NO_FILTER);
  const [threshold, setThreshold] = useState(0.8);
  const [selectedId, setSelectedId] = useState<number>();
  const [moment, setMoment] = useState<'proposed' | 'logged'>('proposed');
  const [help, setHelp] = useState(false);
  const [message, setMessage] = useState('');
  const queueRef = useRef<HTMLUListElement | null>(null);

  const all = useMemo(() => orderQueue(buildQueue((corrections ?? []).filter((c) => c.sourceId === sources?.eventSourceId), events ?? [])), [corrections, events, sources?.eventSourceId]);
  const shownItems = useMemo(() => filterQueue(all, filter), [all, filter]);
  const counts = useMemo(() => countQueue(all), [all]);
  const shownCounts = useMemo(() => countQueue(shownItems), [shownItems]);
  const kindsPresent = useMemo(() => EVENT_KINDS.filter((k) => all.some((i) => i.kind === k)), [all]);
  const periodsPresent = useMemo(() => [...new Set(all.map((i) => i.period))].sort((a, b) => a - b), [all]);
  const changedUnder = useMemo(() => new Map((lastRun?.changedUnderDecided ?? []).map((c) => [c.eventId, c])), [lastRun]);

  let index = shownItems.findIndex((i) => i.correction.id === selectedId);
  if (index < 0 && shownItems.length) index = Math.max(0, nextOpen(shownItems, -1));
  const item: QueueItem | undefined = shownItems[index];

  // Key presses can come faster than the database answers: decisions run one after another
  // on the rows as they are then, on the item selected then.
  const chain = useRef<Promise<void>>(Promise.resolve());
  const selectedRef = useRef<number | undefined>(undefined);
  const itemsRef = useRef<QueueItem[]>(shownItems);
  itemsRef.current = shownItems;
  if (item) selectedRef.current ??= item.correction.id;
  const select = useCallback((id: number | undefined) => {
    selectedRef.current = id;
    setSelectedId(id);
  }, []);
  const enqueue = useCallback((job: () => Promise<void>) => {
    chain.current = chain.current.then(job).catch((e) => setMessage(`Not changed: ${(e as Error).message}`));
    return chain.current;
  }, []);


  // Keep the selection on an item of the list, and the queue focused on arrival.
  useEffect(() => {
    if (item && item.correction.id !== selectedId) select(item.correction.id);
  }, [item, selectedId, select]);
  useEffect(() => {
    queueRef.current?.focus();
  }, [corrections === undefined]);
  useEffect(() => {
    document.getElementById(`rq-${selectedId}`)?.scrollIntoView({ block: 'nearest' });
  }, [selectedId]);
  useEffect(() => {
    if (!message) return;
    const t = setTimeout(() => setMessage(''), 5000);
    return () => clearTimeout(t);
  }, [message]);

  const apply = useCallback(
    (d: Decision) =>
      enqueue(async () => {
        const items = itemsRef.current;
        const target = items.find((i) => i.correction.id === selectedRef.current) ?? items[0];
        if (!target) return;
        const c = await db.corrections.get(target.correction.id!);
        const e = await db.events.get(target.event.id!);
        if (!c || !e) throw new Error('this correction is no longer in the project (deleted or re-analysed meanwhile).');
        await commit(db, { projectId, user: info.userName, subject: 'correction', what: decisionWhat(d, e), changes: decisionChanges(d, c, e, eventFit, rate) });
        if (d.type === 'accept' || d.type === 'reject') {
          // On to the next open one (in the list as it will be after this decision).
          const after = items.map((i) => (i === target ? { ...i, open: false } : i));
          const n = nextOpen(after, items.indexOf(target));
          if (n >= 0) select(after[n].correction.id);
          setMoment('proposed');
        }
      }),
    [db, projectId, info.userName, eventFit, rate, enqueue, select],
  );

  const acceptAbove = useCallback(
    () =>
      enqueue(async () => {
        const items = itemsRef.current;
        const take = openAbove(items, threshold);
        if (!take.length) return setMessage(`No open proposal in the list has a confidence of ${Math.round(threshold * 100)} % or more.`);
        const changes = [];
        for (const i of take) {
          const c = await db.corrections.get(i.correction.id!);
          const e = await db.events.get(i.event.id!);
          if (c && e && c.status === 'proposed') changes.push(...decisionChanges({ type: 'accept' }, c, e, eventFit, rate));
        }
        await commit(db, { projectId, user: info.userName, subject: 'correction', what: `accept ${take.length} corrections with confidence ≥ ${Math.round(threshold * 100)} %`, changes });
        setMessage(`Accepted ${take.length} proposals with confidence ≥ ${Math.round(threshold * 100)} % (Ctrl+Z takes them all back).`);
        // On to the first one still open.
        const taken = new Set(take);
        const after = items.map((i) => (taken.has(i) ? { ...i, open: false } : i));
        const n = nextOpen(after, -1);
        if (n >= 0) select(after[n].correction.id);
      }),
    [db, projectId, info.userName, threshold, eventFit, rate, enqueue, select],
  );

  const act = useCallback(
    (a: ReviewAction) => {
      switch (a) {
        case 'accept':
          return void apply({ type: 'accept' });
        case 'reject':
          return void apply({ type: 'reject' });
        case 'reopen':
          return void apply({ type: 'reopen' });
        case 'minus1':
          return void apply({ type: 'nudge', frames: -1 });
        case 'plus1':
          return void apply({ type: 'nudge', frames: 1 });
        case 'minus5':
          return void apply({ type: 'nudge', frames: -5 });
        case 'plus5':
          return void apply({ type: 'nudge', frames: 5 });
        case 'flip':
          return setMoment((m) => (m === 'proposed' ? 'logged' : 'proposed'));
        case 'acceptAbove':
          return void acceptAbove();
        case 'nextOpen': {
          const n = nextOpen(shownItems, index);
          if (n >= 0) select(shownItems[n].correction.id);
          else setMessage('No open proposal left in this list.');
          return;
        }
        case 'prev':
        case 'next': {
          const n = Math.max(0, Math.min(shownItems.length - 1, index + (a === 'next' ? 1 : -1)));
          if (shownItems[n]) select(shownItems[n].correction.id);
          return;
        }
        case 'help':
          return setHelp((h) => !h);
        case 'close':
          return setHelp(false);
      }
    },
    [apply, acceptAbove, shownItems, index, select],
  );

  useEffect(() => {
    const onKey = (e: KeyboardEvent) => {
      if (e.defaultPrevented || isTypingTarget(e.target)) return;
      const a = reviewActionFor(e, document.activeElement === queueRef.current);
      if (!a) return;
      e.preventDefault();
      act(a);
    };
    // Capture phase: ahead of the player's own keys (↑/↓ are the queue's while it has focus).
    window.addEventListener('keydown', onKey, true);
    return () => window.removeEventListener('keydown', onKey, true);
  }, [act]);

  const teams = log?.teams ?? {};
  const ready = corrections !== undefined && events !== undefined;

  return (
    <section className="panel review" aria-label="Review" data-project={projectId}>
      <header className="review-head">
        <h2>Review</h2>
        <p className="review-counts" data-testid="review-counts" aria-live="polite">
          <strong>{counts.done}</strong> done · <strong>{counts.left}</strong> left
          <span className="muted small">
            {' '}
            ({counts.accepted} accepted, {counts.rejected} rejected, {counts.edited} edited
            {shownItems.length !== all.length ? `; this list: ${shownCounts.done} done, ${shownCounts.left} left` : ''})
          </span>
        </p>
        <button type="button" className="quiet" onClick={() => setHelp((h) => !h)} aria-keyshortcuts="?" title="Keys (?)" aria-expanded={help}>
          Keys <kbd>?</kbd>
        </button>
      </header>
      <AnalysisBar projectId={projectId} />

      <div className="review-tools" role="group" aria-label="Filters and bulk accept">
        <label>
          Kind
          <select value={filter.kinds[0] ?? ''} onChange={(e) => setFilter({ ...filter, kinds: e.target.value ? [e.target.value as EventKind] : [] })}>
            <option value="">all kinds</option>
            {kindsPresent.map((k) => (
              <option key={k} value={k}>
                {kindName(k)}
              </option>
            ))}
          </select>
        </label>
        <label>
          Team
          <select value={filter.team} onChange={(e) => setFilter({ ...filter, team: e.target.value as QueueFilter['team'] })}>
            <option value="all">both</option>
            <option value="home">{teams.home ?? 'home'}</option>
            <option value="away">{teams.away ?? 'away'}</option>
            <option value="none">no team</option>
          </select>
        </label>
        <label>
          Period
          <select value={String(filter.period)} onChange={(e) => setFilter({ ...filter, period: e.target.value === 'all' ? 'all' : Number(e.target.value) })}>
            <option value="all">all</option>
            {periodsPresent.map((p) => (
              <option key={p} value={p}>
                {p}
              </option>
            ))}
          </select>
        </label>
        <label title="Time shift in seconds plus place shift at 5 m per second">
          Change ≥
          <input type="number" min={0} step={0.1} value={filter.minSize} onChange={(e) => setFilter({ ...filter, minSize: Math.max(0, Number(e.target.value) || 0) })} />
          s
        </label>
        <label>
          Show
          <select value={filter.status} onChange={(e) => setFilter({ ...filter, status: e.target.value as QueueFilter['status'] })}>
            <option value="all">open and decided</option>
            <option value="open">open only</option>
            <option value="decided">decided only</option>
          </select>
        </label>
        <span className="grow" />
        <label>
          Confidence ≥
          <input type="number" min={0} max={100} step={5} value={Math.round(threshold * 100)} onChange={(e) => setThreshold(Math.max(0, Math.min(100, Number(e.target.value) || 0)) / 100)} />%
        </label>
        <button type="button" onClick={() => void acceptAbove()} aria-keyshortcuts="Shift+A" title="Accept every open proposal in this list at or above the confidence (Shift+A)">
          Accept {openAbove(shownItems, threshold).length} open ≥ {Math.round(threshold * 100)} % <kbd>⇧A</kbd>
        </button>
      </div>

      {message && (
        <p className="review-message" role="status">
          {message}
        </p>
      )}
      {help && <KeysHelp onClose={() => setHelp(false)} />}

      {!ready ? (
        <p className="muted">Loading…</p>
      ) : !all.length ? (
        <div className="empty">
          <p>No proposed corrections {sources ? 'yet' : ''}.</p>
          <p className="muted">
            {sources ? 'The analysis proposes them once it has run (see above), or it found nothing to correct.' : 'Add tracking and an event log on the Sources screen (Alt+1); the analysis then runs by itself.'}
          </p>
        </div>
      ) : (
        <div className="review-body">
          <ul
            ref={queueRef}
            className="review-queue"
            role="listbox"
            aria-label={`Correction queue, ${shownItems.length} shown (↑/↓ to move)`}
            tabIndex={0}
            aria-activedescendant={item ? `rq-${item.correction.id}` : undefined}
          >
            {shownItems.map((i) => (
              <li
                key={i.correction.id}
                id={`rq-${i.correction.id}`}
                role="option"
                aria-selected={i === item}
                data-status={i.correction.status}
                className="rq-item"
                onClick={() => {
                  select(i.correction.id);
                  queueRef.current?.focus();
                }}
              >
                <span className={`rq-status rq-${i.correction.status}`} aria-label={i.correction.status}>
                  {i.correction.status === 'proposed' ? '○' : i.correction.status === 'accepted' ? '✓' : i.correction.status === 'rejected' ? '✕' : '✎'}
                </span>
                <span className="rq-kind">
                  {i.restart && <span className="rq-restart" title="restart">●</span>}
                  {kindName(i.kind)}
                </span>
                <span className="rq-who small muted">
                  {i.team ? (teams[i.team] ?? i.team) : ''}
                  {i.event.logged.player ? ` ${i.event.logged.player}` : ''}
                </span>
                <span className="rq-when small mono">
                  P{i.period} {clock(i.loggedT)}
                </span>
                <span className="rq-shift num mono">{signed(i.shiftS, 1)} s</span>
                <span className="rq-place num mono small">{i.placeShiftM >= 0.5 ? `${i.placeShiftM.toFixed(0)} m` : ''}</span>
                <span className="rq-conf num small">{Math.round(i.confidence * 100)} %</span>
              </li>
            ))}
            {!shownItems.length && <li className="muted small rq-none">Nothing matches the filters.</li>}
          </ul>
          {item && (
            <Detail
              item={item}
              moment={moment}
              rate={rate}
              teams={teams}
              changed={changedUnder.get(item.event.eventId)}
              trackingSourceId={sources?.trackingSourceId}
              meta={meta}
              footage={footageSource?.id !== undefined && probe ? { projectId, sourceId: footageSource.id } : undefined}
              footageFit={footageFit}
              onAct={act}
              onPlace={(x, y) => void apply({ type: 'place', x, y })}
            />
          )}
        </div>
      )}
    </section>
  );
}

function Kbd({ a }: { a: ReviewAction }) {
  return <kbd>{keyOf(a).keys}</kbd>;
}

function ActionButton({ a, label, onAct, disabled }: { a: ReviewAction; label: string; onAct: (a: ReviewAction) => void; disabled?: boolean }) {
  const k = keyOf(a);
  return (
    <button type="button" onClick={() => onAct(a)} aria-keyshortcuts={k.aria} title={`${k.does} (${k.keys})`} disabled={disabled} className={`ra-${a}`}>
      {label} <Kbd a={a} />
    </button>
  );
}

interface DetailProps {
  item: QueueItem;
  moment: 'proposed' | 'logged';
  rate: number;
  teams: Partial<Record<string, string>>;
  changed?: AnalysisRun['changedUnderDecided'][number];
  trackingSourceId?: number;
  meta?: { pitch: { length: number; width: number }; objects: { team?: string; shirt?: number; role: string; id: string }[]; ballIndex: number; periods: { period: number }[] };
  footage?: { projectId: number; sourceId: number };
  footageFit?: ClockFit;
  onAct: (a: ReviewAction) => void;
  onPlace: (x: number, y: number) => void;
}

function Detail({ item, moment, rate, teams, changed, trackingSourceId, meta, footage, footageFit, onAct, onPlace }: DetailProps) {
  const { db } = useServices();
  const c = item.correction;
  const e = item.event;
  const p = proposedPlace(c);
  const tShown = moment === 'proposed' ? item.proposedT : item.loggedT;
  const [period, setPeriod] = useState<TrackingPeriod>();
  const [loadError, setLoadError] = useState('');
  useEffect(() => {
    if (trackingSourceId === undefined || period?.period === item.period) return;
    let stop = false;
    loadTrackingPeriod(db, trackingSourceId, item.period)
      .then((tp) => !stop && setPeriod(tp))
      .catch((err) => !stop && setLoadError((err as Error).message));
    return () => {
      stop = true;
    };
  }, [db, trackingSourceId, item.period, period?.period]);

  const dots: PitchDot[] = useMemo(() => {
    if (!period || !meta || period.period !== item.period) return [];
    const n = meta.objects.length;
    const f = Math.max(0, Math.min(period.frameCount - 1, Math.round(tShown * rate)));
    const out: PitchDot[] = [];
    meta.objects.forEach((o, k) => {
      const x = period.x[f * n + k], y = period.y[f * n + k];
      if (!Number.isFinite(x) || !Number.isFinite(y)) return;
      if (k === meta.ballIndex) return void out.push({ x, y, ball: true });
      if (o.role !== 'player') return;
      out.push({ x, y, ...(o.team === 'home' || o.team === 'away' ? { team: o.team } : {}), ...(o.shirt !== undefined ? { label: String(o.shirt) } : {}), tagged: o.team === e.logged.team && String(o.shirt) === e.logged.player });
    });
    // The ball last, on top.
    return out.sort((a, b) => Number(!!a.ball) - Number(!!b.ball));
  }, [period, meta, item.period, tShown, rate, e.logged.team, e.logged.player]);

  const loggedPlace = e.logged.x !== undefined && e.logged.y !== undefined ? { x: e.logged.x, y: e.logged.y } : undefined;
  const proposedPlaceXY = p.x !== undefined && p.y !== undefined ? { x: p.x, y: p.y } : loggedPlace;
  const frameShown = frameOf(c, tShown, rate);
  const statusText = { proposed: 'open', accepted: 'accepted', rejected: 'rejected', edited: 'edited' }[c.status];

  return (
    <article className="review-detail" aria-label={`Correction of ${kindName(e.kind)} ${e.eventId}`} data-testid="review-detail" data-status={c.status}>
      <header className="rd-head">
        <h3 className="rd-title">
          {kindName(e.kind)} · {e.logged.team ? (teams[e.logged.team] ?? e.logged.team) : 'no team'}
          {e.logged.player ? ` ${e.logged.player}` : ''} · period {e.period} · log row {e.row}
        </h3>
        <span className={`rd-status rq-${c.status}`}>{statusText}</span>
      </header>
      <table className="rd-compare">
        <thead>
          <tr>
            <th />
            <th scope="col">Logged</th>
            <th scope="col">{c.status === 'edited' ? 'Edited' : 'Proposed'}</th>
            <th scope="col">Change</th>
          </tr>
        </thead>
        <tbody>
          <tr>
            <th scope="row">Time (tracking clock)</th>
            <td className="mono" data-testid="rd-logged-time">
              {clock(item.loggedT)} <span className="muted small">({e.logged.raw?.clock ?? `${e.logged.t.toFixed(2)} s`} in the log)</span>
            </td>
            <td className="mono" data-testid="rd-proposed-time">
              {clock(item.proposedT)} <span className="muted small">frame {frameOf(c, item.proposedT, rate)}</span>
            </td>
            <td className="mono">{signed(item.shiftS)} s</td>
          </tr>
          <tr>
            <th scope="row">Place (m from centre)</th>
            <td className="mono">{loggedPlace ? `${loggedPlace.x.toFixed(1)}, ${loggedPlace.y.toFixed(1)}` : '—'}</td>
            <td className="mono" data-testid="rd-proposed-place">{proposedPlaceXY ? `${proposedPlaceXY.x.toFixed(1)}, ${proposedPlaceXY.y.toFixed(1)}` : '—'}</td>
            <td className="mono">{item.placeShiftM >= 0.05 ? `${item.placeShiftM.toFixed(1)} m` : '—'}</td>
          </tr>
        </tbody>
      </table>
      <p className="rd-reason">
        <span className="muted small">Why: </span>
        {c.proposal.reason}
      </p>
      <div className="rd-confidence" title="How sure the engine is of this moment among the candidates it weighed">
        <span className="small muted">Confidence</span>
        <span className="rd-meter" role="meter" aria-label="Confidence" aria-valuemin={0} aria-valuemax={100} aria-valuenow={Math.round(item.confidence * 100)}>
          <span style={{ width: `${Math.round(item.confidence * 100)}%` }} />
        </span>
        <span className="num small">{Math.round(item.confidence * 100)} %</span>
      </div>
      {changed && (
        <p className="rd-changed" role="note">
          The last re-run {changed.after ? `now proposes ${clock(changed.after.trackingTime)}${changed.after.x !== undefined ? ` at (${changed.after.x.toFixed(1)}, ${(changed.after.y ?? 0).toFixed(1)})` : ''}` : 'no longer proposes a change'} for this event, where your decision was made on{' '}
          {clock(changed.before.trackingTime)}. Your decision stands; reopen (O) to review it again.
        </p>
      )}

      <div className="rd-actions" role="toolbar" aria-label="Decide">
        <ActionButton a="accept" label="Accept" onAct={onAct} />
        <ActionButton a="reject" label="Reject" onAct={onAct} />
        <span className="rd-sep" />
        <ActionButton a="minus5" label="−5 fr" onAct={onAct} />
        <ActionButton a="minus1" label="−1 fr" onAct={onAct} />
        <ActionButton a="plus1" label="+1 fr" onAct={onAct} />
        <ActionButton a="plus5" label="+5 fr" onAct={onAct} />
        <span className="rd-sep" />
        <ActionButton a="reopen" label="Reopen" onAct={onAct} disabled={c.status === 'proposed'} />
        <ActionButton a="nextOpen" label="Next open" onAct={onAct} />
      </div>

      <div className="rd-moment" role="group" aria-label="Moment shown">
        <span className="small muted">Showing</span>
        <button type="button" className={moment === 'logged' ? 'on' : ''} aria-pressed={moment === 'logged'} onClick={() => moment !== 'logged' && onAct('flip')} aria-keyshortcuts="F" title="Flip between the logged and the proposed moment (F)">
          logged moment
        </button>
        <button type="button" className={moment === 'proposed' ? 'on' : ''} aria-pressed={moment === 'proposed'} onClick={() => moment !== 'proposed' && onAct('flip')} aria-keyshortcuts="F" title="Flip between the logged and the proposed moment (F)">
          {c.status === 'edited' ? 'edited' : 'proposed'} moment
        </button>
        <Kbd a="flip" />
        <span className="mono small" data-testid="rd-moment">
          {moment === 'proposed' && c.status === 'edited' ? 'edited' : moment} · P{item.period} {clock(tShown)} · frame {frameShown}
        </span>
      </div>

      <div className={`rd-views${footage && footageFit ? '' : ' pitch-only'}`}>
        {footage && footageFit ? (
          <ReviewFootage projectId={footage.projectId} footageSourceId={footage.sourceId} fit={footageFit} period={item.period} t={tShown} />
        ) : (
          <p className="rd-nofootage small muted" data-testid="rd-nofootage">
            {footage ? 'No footage clock fit yet, so the footage cannot be cued: make one on the Sync screen (Alt+2). Showing the pitch view only.' : 'No footage in this project: showing the pitch view only.'}
          </p>
        )}
        {meta ? (
          <PitchView
            pitch={meta.pitch}
            dots={dots}
            {...(loggedPlace ? { logged: loggedPlace } : {})}
            {...(proposedPlaceXY ? { proposed: proposedPlaceXY } : {})}
            caption={`positions at the ${moment} moment (frame ${frameShown})`}
            onPlace={onPlace}
          />
        ) : (
          <p className="muted small">{loadError || 'Loading tracking…'}</p>
        )}
      </div>
    </article>
  );
}

function KeysHelp({ onClose }: { onClose: () => void }) {
  return (
    <aside className="review-help" aria-label="Review keys">
      <header className="panel-head">
        <h3>Review keys</h3>
        <button type="button" className="quiet" onClick={onClose} aria-keyshortcuts="Escape">
          Close <kbd>Esc</kbd>
        </button>
      </header>
      <dl>
        {REVIEW_KEYS.filter((k) => k.action !== 'close').map((k) => (
          <div key={k.action}>
            <dt>
              <kbd>{k.keys}</kbd>
            </dt>
            <dd>{k.does}</dd>
          </div>
        ))}
        <div>
          <dt>
            <kbd>Ctrl+Z</kbd> / <kbd>Ctrl+Shift+Z</kbd>
          </dt>
          <dd>undo / redo (any screen, also after a reload)</dd>
        </div>
        <div>
          <dt>
            <kbd>Alt+1…5</kbd>
          </dt>
          <dd>switch screens</dd>
        </div>
      </dl>
      <p className="small muted">Space, ←/→, Shift+←/→, J, K, L and G are the player’s.</p>
    </aside>
  );
}
