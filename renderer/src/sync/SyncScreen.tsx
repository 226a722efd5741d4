/**
 * The Sync screen: ties the footage clock to tracking. The player on the left, the fit
 * figures and the proposed pairings on the right, the three clocks as lanes below with a
 * residual chart per fit. One key per anchor kind marks the frame on screen; a marked
 * kick-off pairs itself with that period's tracking kick-off; proposals are accepted one
 * at a time or all at once; every change re-fits at once and is one undoable step
 * (anchors and the replaced fit together).
 */
import { useCallback, useEffect, useMemo, useRef, useState } from 'react';
import type { AnchorKind, ClockFit } from '../../../shared-types/index.ts';
import { clockText, kindWord, pairResidual, isMarkedPair, type FootagePair } from '../../../engine/footage-sync/index.ts';
import { trackingToFootage } from '../../../engine/fit/footage-map.ts';
import { mapTime } from '../../../engine/fit/clock.ts';
import { useServices } from '../app/context.ts';
import { isTypingTarget } from '../app/keys.ts';
import { useLive } from '../app/useLive.ts';
import type { AnchorRow, NonLiveRow } from '../db/rows.ts';
import { commit, type ChangeInput } from '../history/history.ts';
import { FootagePlayer, frameShownAt, newestFit, useFootageSource, type FootagePlayerControl } from '../player/index.ts';
import { scanFootage, type ScanProgress } from '../candidates/index.ts';
import { Lanes, type LaneLink, type LaneMark } from './Lanes.tsx';
import { ResidualChart, type ResidualPoint } from './ResidualChart.tsx';
import { autoPair, changesWithFit, computeSync, pairedTracking, rowKey, type SyncInputs } from './sync-model.ts';
import { MarksBar, useMarks } from '../marks/MarksBar.tsx';
import { MARK_KEYS } from '../marks/mark-keys.ts';
import './sync.css';

/** Sync keys: none of the player's (Space, arrows, J/K/L, G, M, Home/End, PageUp/Down, , .), nor Alt+digits or Ctrl+Z/Y. */
export const SYNC_KEYS: { key: string; kind: AnchorKind; label: string }[] = [
  { key: '1', kind: 'kick_off', label: 'kick-off' },
  { key: '2', kind: 'goal_kick', label: 'goal kick' },
  { key: '3', kind: 'corner', label: 'corner' },
  { key: '4', kind: 'throw_in', label: 'throw-in' },
  { key: '5', kind: 'free_kick', label: 'free kick' },
  { key: '6', kind: 'penalty', label: 'penalty' },
  { key: '7', kind: 'period_end', label: 'period end' },
  { key: 'W', kind: 'whistle', label: 'whistle' },
];
const ACTION_KEYS = { accept: 'A', acceptAll: 'Shift+A', next: 'N', prev: 'Shift+N', exclude: 'X', remove: 'Delete', confirmNonLive: 'C', nonLiveStart: '[', nonLiveEnd: ']', find: 'F' } as const;

export function SyncScreen({ projectId }: { projectId: number }) {
  const { db, info } = useServices();
  const sources = useLive(() => db.sources.where('projectId').equals(projectId).toArray(), [projectId]);
  const footageSource = sources?.find((s) => s.kind === 'footage');
  const trackingSource = sources?.find((s) => s.kind === 'tracking');
  const footageId = footageSource?.id;
  const fs = useFootageSource(projectId, footageId);
  const anchors = useLive(() => db.anchors.where('projectId').equals(projectId).toArray(), [projectId]);
  const nonLive = useLive(() => (footageId === undefined ? Promise.resolve([] as NonLiveRow[]) : db.nonLive.where('footageSourceId').equals(footageId).toArray()), [footageId]);
  const meta = useLive(() => (trackingSource?.id === undefined ? Promise.resolve(undefined) : db.trackingMeta.get(trackingSource.id)), [trackingSource?.id]);
  const fitRows = useLive(() => db.clockFits.where('projectId').equals(projectId).toArray(), [projectId]);
  const eventsFit = useLive(() => newestFit(db, projectId, 'events'), [projectId]);
  const [control, setControl] = useState<FootagePlayerControl | null>(null);
  const { marks, updateMarks } = useMarks(projectId, footageId);
  const [frameT, setFrameT] = useState<number | undefined>();
  const [selected, setSelected] = useState<string | undefined>();
  const [current, setCurrent] = useState(0);
  const [nonLiveStart, setNonLiveStart] = useState<number | undefined>();
  const [message, setMessage] = useState('');
  const busy = useRef(false);
  const [scan, setScan] = useState<{ progress: ScanProgress; abort: AbortController } | null>(null);

  /** Find candidates: whistles and cuts from the footage (worker, progress, cancel); stored as one undoable step by scanFootage. */
  const find = useCallback(async () => {
    if (footageId === undefined || scan) return;
    const abort = new AbortController();
    setScan({ progress: { phase: 'loading', fraction: 0, message: 'Starting…' }, abort });
    try {
      const r = await scanFootage(db, projectId, footageId, { signal: abort.signal, user: info.userName, onProgress: (progress) => setScan({ progress, abort }) });
      setMessage(`Found ${r.whistles.length} whistles and ${r.cuts.length} cuts; proposals below.`);
    } catch (e) {
      setMessage(abort.signal.aborted ? 'Finding candidates was cancelled; nothing was stored.' : `Finding candidates failed: ${(e as Error).message}`);
    } finally {
      setScan(null);
    }
  }, [db, projectId, footageId, info.userName, scan]);

  useEffect(() => {
    if (!control) return;
    return control.onFrame((f) => setFrameT(f.t));
  }, [control]);

  const probe = fs.probe;
  const inputs: SyncInputs | undefined = useMemo(() => {
    if (!anchors || !probe || footageId === undefined || !meta || !nonLive) return undefined;
    return {
      projectId, footageSourceId: footageId,
      footageRows: anchors.filter((a) => a.sourceId === footageId && a.anchor.source === 'footage'),
      trackingRows: anchors.filter((a) => a.sourceId === trackingSource?.id && a.anchor.source === 'tracking'),
      nonLive, trackingRate: meta.rate, trackingPeriods: meta.periods, footageFps: probe.nominalFps || 25, footageDuration: probe.duration,
    };
  }, [anchors, probe, footageId, meta, nonLive, projectId, trackingSource?.id]);
  const state = useMemo(() => (inputs ? computeSync(inputs) : undefined), [inputs]);
  const fitRow = fitRows?.filter((r) => r.sourceId === footageId && r.fit.source === 'footage').sort((a, b) => (a.id ?? 0) - (b.id ?? 0)).pop();
  const proposals = state?.proposals ?? [];
  const cur = proposals.length ? Math.min(current, proposals.length - 1) : -1;

  /** One history step: the anchor changes and the re-fitted footage fit. */
  const save = useCallback(
    async (what: string, anchorChanges: ChangeInput[], nextRows: AnchorRow[]) => {
      if (!inputs || busy.current) return;
      busy.current = true;
      try {
        await commit(db, { projectId, user: info.userName, subject: 'anchor', what, changes: changesWithFit(inputs, fitRow, anchorChanges, nextRows) });
        setMessage(what);
      } catch (e) {
        setMessage(`Not saved: ${(e as Error).message}`);
      } finally {
        busy.current = false;
      }
    },
    [db, projectId, info.userName, inputs, fitRow],
  );

  const mark = useCallback(
    async (kind: AnchorKind) => {
      // The frame on screen now, from the player (React state may lag a key pressed right after a seek).
      const shownT = control?.current?.t ?? frameT;
      if (!inputs || !state || shownT === undefined || !probe) return;
      const frame = control?.current?.index ?? frameShownAt(probe.pts, shownT);
      const t = probe.pts[frame];
      const isRestart = kind !== 'whistle' && kind !== 'period_end';
      const { period, tracking } = isRestart ? autoPair(kind, t, state, inputs) : { period: autoPair('whistle', t, state, inputs).period, tracking: undefined };
      const row: AnchorRow = {
        projectId, sourceId: inputs.footageSourceId, origin: 'analyst',
        anchor: { id: `fm-${Date.now().toString(36)}`, source: 'footage', kind, period, t, confidence: 1, note: `marked at frame ${frame}` },
        ...(tracking ? { pairedWith: tracking.id, pairedAnchorId: tracking.anchor.id } : {}),
      };
      const paired = tracking ? ` ↔ ${kindWord(tracking.anchor.kind)} at tracking ${clockText(tracking.anchor.t)} (period ${tracking.anchor.period})` : '';
      await save(`mark ${kindWord(kind)} at footage ${clockText(t)} (frame ${frame})${paired}`, [{ table: 'anchors', after: row }], [...inputs.footageRows, row]);
    },
    [inputs, state, frameT, probe, projectId, save, control],
  );

  const accept = useCallback(
    async (which: 'current' | 'all') => {
      if (!inputs || !state || !proposals.length) return;
      const chosen = which === 'all' ? proposals : [proposals[cur]];
      const changes: ChangeInput[] = [];
      const next = [...inputs.footageRows];
      for (const p of chosen) {
        const f = inputs.footageRows.find((r) => rowKey(r) === p.footageAnchorId)!;
        const t = inputs.trackingRows.find((r) => rowKey(r) === p.trackingAnchorId)!;
        const after: AnchorRow = { ...f, origin: f.origin === 'analyst' ? 'analyst' : 'accepted', pairedWith: t.id, pairedAnchorId: t.anchor.id, anchor: { ...f.anchor, period: p.period } };
        changes.push({ table: 'anchors', key: f.id!, after });
        next[next.indexOf(f)] = after;
      }
      await save(which === 'all' ? `accept ${chosen.length} proposed pairings` : `accept pairing: ${chosen[0].label}`, changes, next);
    },
    [inputs, state, proposals, cur, save],
  );

  const selectedRow = inputs?.footageRows.find((r) => rowKey(r) === selected);
  const toggleExclude = useCallback(async () => {
    if (!inputs || !selectedRow) return;
    const after: AnchorRow = { ...selectedRow, excluded: !selectedRow.excluded };
    await save(`${after.excluded ? 'exclude' : 'include'} ${kindWord(selectedRow.anchor.kind)} at footage ${clockText(selectedRow.anchor.t)}`, [{ table: 'anchors', key: selectedRow.id!, after }], inputs.footageRows.map((r) => (r === selectedRow ? after : r)));
  }, [inputs, selectedRow, save]);
  const remove = useCallback(async () => {
    if (!inputs || !selectedRow) return;
    await save(`delete ${kindWord(selectedRow.anchor.kind)} at footage ${clockText(selectedRow.anchor.t)}`, [{ table: 'anchors', key: selectedRow.id! }], inputs.footageRows.filter((r) => r !== selectedRow));
    setSelected(undefined);
  }, [inputs, selectedRow, save]);
  const move = useCallback(
    async (key: string, t: number) => {
      const row = inputs?.footageRows.find((r) => rowKey(r) === key);
      if (!inputs || !row || !probe) return;
      const snapped = probe.pts[frameShownAt(probe.pts, t + 0.5 / (probe.nominalFps || 25))];
      if (Math.abs(snapped - row.anchor.t) < 1e-6) return;
      const after: AnchorRow = { ...row, anchor: { ...row.anchor, t: snapped } };
      await save(`move ${kindWord(row.anchor.kind)} from footage ${clockText(row.anchor.t)} to ${clockText(snapped)}`, [{ table: 'anchors', key: row.id!, after }], inputs.footageRows.map((r) => (r === row ? after : r)));
    },
    [inputs, probe, save],
  );

  const confirmNonLive = useCallback(async () => {
    if (!nonLive || frameT === undefined) return;
    const row = nonLive.find((n) => n.status === 'proposed' && frameT >= n.fromT && frameT < n.toT);
    if (!row) return setMessage('No proposed non-live interval under the playhead.');
    await commit(db, { projectId, user: info.userName, subject: 'nonLive', what: `confirm non-live ${row.kind} ${clockText(row.fromT)}–${clockText(row.toT)}`, changes: [{ table: 'nonLive', key: row.id!, after: { ...row, status: 'confirmed' } }] });
  }, [db, projectId, info.userName, nonLive, frameT]);
  const endNonLive = useCallback(async () => {
    if (nonLiveStart === undefined || frameT === undefined || footageId === undefined) return setMessage('Press [ at the first frame of the interval, then ] at its end.');
    const [fromT, toT] = nonLiveStart < frameT ? [nonLiveStart, frameT] : [frameT, nonLiveStart];
    setNonLiveStart(undefined);
    const row: NonLiveRow = { projectId, footageSourceId: footageId, fromT, toT, kind: 'other', status: 'confirmed', note: 'marked on the Sync screen' };
    await commit(db, { projectId, user: info.userName, subject: 'nonLive', what: `mark non-live ${clockText(fromT)}–${clockText(toT)}`, changes: [{ table: 'nonLive', after: row }] });
  }, [db, projectId, info.userName, nonLiveStart, frameT, footageId]);

  const goToProposal = useCallback(
    (i: number) => {
      if (!proposals.length) return;
      const n = (i + proposals.length) % proposals.length;
      setCurrent(n);
      void control?.seekToTime(proposals[n].tFootage);
    },
    [proposals, control],
  );

  useEffect(() => {
    const onKey = (e: KeyboardEvent) => {
      if (e.defaultPrevented || e.ctrlKey || e.altKey || e.metaKey || isTypingTarget(e.target) || document.querySelector('dialog[open]')) return;
      const k = e.key;
      const kind = SYNC_KEYS.find((s) => s.key.toLowerCase() === k.toLowerCase() && !e.shiftKey)?.kind;
      let act: (() => unknown) | undefined;
      if (kind) act = () => mark(kind);
      else if (k === 'a' && !e.shiftKey) act = () => accept('current');
      else if (k === 'A' || (k === 'a' && e.shiftKey)) act = () => accept('all');
      else if (k === 'n') act = () => goToProposal(cur + 1);
      else if (k === 'N') act = () => goToProposal(cur - 1);
      else if (k === 'x' || k === 'X') act = toggleExclude;
      else if (k === 'Delete' || k === 'Backspace') act = remove;
      else if (k === 'c' || k === 'C') act = confirmNonLive;
      else if (k === '[') act = () => { setNonLiveStart(frameT); setMessage(`Non-live interval starts at ${clockText(frameT ?? 0)}; press ] at its end.`); };
      else if (k === ']') act = endNonLive;
      else if (k === 'f' || k === 'F') act = find;
      else if (k === 'Escape' && scan) act = () => scan.abort.abort();
      if (!act) return;
      e.preventDefault();
      void act();
    };
    window.addEventListener('keydown', onKey);
    return () => window.removeEventListener('keydown', onKey);
  }, [mark, accept, goToProposal, cur, toggleExclude, remove, confirmNonLive, endNonLive, frameT, find, scan]);

  if (sources && !footageSource) return <section className="panel" aria-label="Sync"><h2>Sync</h2><p className="muted">This match has no footage yet. Add it on the Sources screen (Alt+1).</p></section>;
  if (sources && !trackingSource) return <section className="panel" aria-label="Sync"><h2>Sync</h2><p className="muted">This match has no tracking yet: the footage is tied to the tracking clock. Add tracking on the Sources screen (Alt+1).</p></section>;

  const fit = state?.fit;
  const lanes = inputs && state && fit ? laneData(inputs, state, eventsFit) : undefined;
  const residPoints: ResidualPoint[] = inputs && state && fit ? state.pairs.map((p) => ({ t: p.tFootage, r: pairResidual(fit, p, 1 / inputs.footageFps), used: !p.excluded, shape: isMarkedPair(p) ? 'disc' : 'diamond' })) : [];
  const eventPoints: ResidualPoint[] = (eventsFit?.segments ?? []).flatMap((s) => s.points.map((pt) => ({ t: trackingToFootage(fit ?? { source: 'footage', segments: [], method: 'huber' }, s.period, pt.tRef, 30) ?? NaN, r: pt.residual, used: pt.used, shape: 'disc' as const })));
  const trackingCount = inputs?.trackingRows.length ?? 0;

  return (
    <section className="sy-screen" aria-label="Sync">
      <div className="sy-top">
        <div className="sy-player">
          {fs.error && <p className="error-text" role="alert">{fs.error}</p>}
          {fs.src && probe ? <FootagePlayer src={fs.src} probe={probe} clocks={fs.clocks} onControl={setControl} label="Footage player (Sync)" {...(marks ? { marks } : {})} /> : <p className="muted">Opening the footage…</p>}
          <MarksBar projectId={projectId} marks={marks} updateMarks={updateMarks} probe={probe} clocks={fs.clocks} player={control} />
          <p className="muted small sy-keyhelp">
            Clip marks: {MARK_KEYS.in} in · {MARK_KEYS.out} out (the clip's last frame) · {MARK_KEYS.clear} clear; anchor keys are beside the footage.
          </p>
        </div>
        <aside className="sy-side">
          <section className="sy-box" aria-label="Mark an anchor">
            <h3>Mark the frame on screen</h3>
            <div className="sy-keys">
              {SYNC_KEYS.map((s) => (
                <button key={s.key} type="button" onClick={() => void mark(s.kind)} disabled={!inputs || frameT === undefined} title={`Mark a ${s.label} at the frame on screen (${s.key})`} aria-keyshortcuts={s.key}>
                  <kbd>{s.key}</kbd> {s.label}
                </button>
              ))}
            </div>
            <p className="small muted">
              Mark a restart on the first frame in which the ball has been played. A kick-off pairs itself with the tracking kick-off of its period.
              {trackingCount === 0 && ' No tracking restarts are stored yet: the analysis finds them (it runs by itself after import).'}
            </p>
            <div className="sy-keys">
              <button type="button" onClick={() => void toggleExclude()} disabled={!selectedRow} title={`Include or exclude the selected anchor from the fit (${ACTION_KEYS.exclude})`} aria-keyshortcuts="X"><kbd>X</kbd> {selectedRow?.excluded ? 'include' : 'exclude'}</button>
              <button type="button" onClick={() => void remove()} disabled={!selectedRow} title={`Delete the selected footage anchor (${ACTION_KEYS.remove})`} aria-keyshortcuts="Delete"><kbd>Del</kbd> delete</button>
              <button type="button" onClick={() => void confirmNonLive()} title="Confirm the proposed non-live interval under the playhead (C)" aria-keyshortcuts="C"><kbd>C</kbd> confirm non-live</button>
              <button type="button" onClick={() => { setNonLiveStart(frameT); }} title="Start a non-live interval here ([)" aria-keyshortcuts="["><kbd>[</kbd> non-live from</button>
              <button type="button" onClick={() => void endNonLive()} title="End the non-live interval here (])" aria-keyshortcuts="]"><kbd>]</kbd> …to</button>
              <button type="button" onClick={() => void find()} disabled={!!scan || footageId === undefined} title="Find whistle and cut candidates in the footage (F)" aria-keyshortcuts="F"><kbd>F</kbd> Find candidates</button>
            </div>
            {scan && (
              <div className="sy-scan" role="status" aria-label="Finding candidates">
                <progress max={1} value={scan.progress.fraction} />
                <span className="small">{scan.progress.message}</span>
                <button type="button" className="quiet" onClick={() => scan.abort.abort()} title="Cancel (Escape)" aria-keyshortcuts="Escape">Cancel</button>
              </div>
            )}
            {selectedRow && <p className="small">Selected: {describe(selectedRow, inputs!)}</p>}
            <p className="small muted" role="status" aria-live="polite" data-testid="sync-message">{message}</p>
          </section>
          <FitFigures fit={fit} rows={inputs?.footageRows.length ?? 0} pairs={state?.pairs ?? []} frameS={1 / (inputs?.footageFps ?? 25)} />
          <section className="sy-box" aria-label="Proposed pairings">
            <h3>
              Proposed pairings <span className="muted small">({proposals.length})</span>
            </h3>
            {proposals.length === 0 ? (
              <p className="small muted">{fit?.segments.length ? 'None: every whistle near a restart is paired, or there are no whistles yet (Find candidates, F, or mark one with W).' : 'Mark the kick-off of each period first (1).'}</p>
            ) : (
              <>
                <ol className="sy-props" data-testid="proposals">
                  {proposals.map((p, i) => (
                    <li key={p.footageAnchorId} className={i === cur ? 'current' : ''} onClick={() => goToProposal(i)}>
                      <span>{p.label}</span> <span className="muted small mono">{Math.round(p.score * 100)}%</span>
                    </li>
                  ))}
                </ol>
                <div className="sy-keys">
                  <button type="button" onClick={() => void accept('current')} title="Accept the current proposal (A)" aria-keyshortcuts="A"><kbd>A</kbd> accept</button>
                  <button type="button" onClick={() => void accept('all')} title="Accept all shown proposals (Shift+A)" aria-keyshortcuts="Shift+A"><kbd>⇧A</kbd> accept all shown</button>
                  <button type="button" onClick={() => goToProposal(cur + 1)} title="Next proposal, go to its whistle (N; Shift+N previous)" aria-keyshortcuts="N Shift+N"><kbd>N</kbd> next</button>
                </div>
              </>
            )}
          </section>
        </aside>
      </div>
      {lanes && probe && (
        <Lanes
          key={probe.duration}
          lanes={lanes.lanes}
          links={lanes.links}
          nonLive={(nonLive ?? []).map((n) => ({ fromT: n.fromT, toT: n.toT, confirmed: n.status === 'confirmed' }))}
          playhead={frameT}
          duration={probe.duration}
          selected={selected}
          onSelect={setSelected}
          onSeek={(t) => void control?.seekToTime(t)}
          onDrag={(k, t) => void move(k, t)}
        />
      )}
      <div className="sy-charts">
        <ResidualChart title="Footage fit residuals" points={residPoints} bandS={1 / (inputs?.footageFps ?? 25)} from={0} to={probe?.duration ?? 1} label="Footage fit residuals in milliseconds against footage time" />
        <ResidualChart title="Event log fit residuals" points={eventPoints} bandS={0.5} from={0} to={probe?.duration ?? 1} label="Event log fit residuals against footage time" />
      </div>
    </section>
  );
}


function describe(r: AnchorRow, inp: SyncInputs): string {
  const t = pairedTracking(r, inp.trackingRows);
  return `${kindWord(r.anchor.kind)} at footage ${clockText(r.anchor.t)}${t ? ` ↔ ${kindWord(t.anchor.kind)} at tracking ${clockText(t.anchor.t)} (period ${t.anchor.period})` : ', not paired'}${r.excluded ? ' — excluded from the fit' : ''}`;
}

function FitFigures({ fit, rows, pairs, frameS }: { fit: ReturnType<typeof computeSync>['fit'] | undefined; rows: number; pairs: FootagePair[]; frameS: number }) {
  return (
    <section className="sy-box" aria-label="Footage fit">
      <h3>Footage ↔ tracking fit</h3>
      {!fit?.segments.length ? (
        <p className="small muted">No fit yet ({rows} footage anchors). Mark the kick-off of each period (1).</p>
      ) : (
        <table className="sy-fit mono small" data-testid="footage-fit">
          <thead>
            <tr><th>period</th><th>footage</th><th>offset</th><th>drift ppm</th><th title="Root mean square residual of the marked frames (whistles, with their lags, are in the chart)">rms marks</th><th>points</th></tr>
          </thead>
          <tbody>
            {fit.segments.map((s, i) => (
              <tr key={i}>
                <td>{s.period}</td>
                <td>{clockText(s.fromT)}–{clockText(s.toT)}</td>
                <td>{s.offset.toFixed(3)} s</td>
                <td>{s.points.length > 1 ? `${s.driftPpm.toFixed(0)} ± ${Number.isFinite(s.rateSe) ? (s.rateSe * 1e6).toFixed(0) : '–'}` : '0 (held)'}</td>
                <td>{marksRms(fit, pairs, s.period, frameS)}</td>
                <td>{s.points.filter((p) => p.used).length}/{s.points.length}</td>
              </tr>
            ))}
          </tbody>
        </table>
      )}
      {fit?.model.lags.length ? (
        <p className="small muted">Whistle lags: {fit.model.lags.map((l) => `${kindWord(l.kind)} ${l.lagS.toFixed(2)} ± ${l.sdS.toFixed(2)} s (${l.n})`).join(' · ')}. Each whistle counts {Math.round(1 / Math.max(1e-9, fit.model.lags[0].weight))}× less than a marked frame.</p>
      ) : null}
    </section>
  );
}

/** RMS residual of the marked (frame-accurate, not excluded) pairings of a period, in ms. */
function marksRms(fit: ReturnType<typeof computeSync>['fit'], pairs: FootagePair[], period: number, frameS: number): string {
  const rs = pairs.filter((p) => p.period === period && !p.excluded && isMarkedPair(p)).map((p) => pairResidual(fit, p, frameS));
  if (!rs.length) return '–';
  return `${Math.round(Math.sqrt(rs.reduce((q, r) => q + r * r, 0) / rs.length) * 1000)} ms`;
}

/** Marks per lane and the lines between them. */
function laneData(inp: SyncInputs, st: ReturnType<typeof computeSync>, eventsFit: ClockFit | undefined) {
  const fit = st.fit;
  // Tracking periods without a footage fit yet are laid out after each other from 0, faint.
  const provisionalStart = new Map<number, number>();
  let acc = 0;
  for (const p of inp.trackingPeriods) {
    provisionalStart.set(p.period, acc);
    acc += p.frameCount / inp.trackingRate + 10;
  }
  const trkT = (period: number, t: number) => {
    const f = trackingToFootage(fit, period, t, 30);
    return f !== undefined ? { t: f, provisional: false } : { t: (provisionalStart.get(period) ?? 0) + t, provisional: true };
  };
  const footage: LaneMark[] = inp.footageRows.map((r) => ({ key: rowKey(r), t: r.anchor.t, kind: r.anchor.kind, excluded: r.excluded, title: describe(r, inp) }));
  const tracking: LaneMark[] = inp.trackingRows.filter((r) => r.anchor.kind !== 'period_start').map((r) => {
    const at = trkT(r.anchor.period, r.anchor.t);
    return { key: `t${r.id}`, t: at.t, kind: r.anchor.kind, provisional: at.provisional, title: `${kindWord(r.anchor.kind)} at tracking ${clockText(r.anchor.t)} (period ${r.anchor.period})${r.anchor.note ? ` — ${r.anchor.note}` : ''}` };
  });
  const links: LaneLink[] = [];
  for (const p of st.pairs) {
    const t = inp.trackingRows.find((r) => rowKey(r) === p.trackingAnchorId);
    if (t) links.push({ from: { lane: 0, t: p.tFootage }, to: { lane: 1, t: trkT(t.anchor.period, t.anchor.t).t }, kind: 'pair' });
  }
  for (const p of st.proposals) links.push({ from: { lane: 0, t: p.tFootage }, to: { lane: 1, t: trkT(p.period, p.tTracking).t }, kind: 'proposal' });
  const events: LaneMark[] = [];
  for (const s of eventsFit?.segments ?? [])
    for (const pt of s.points) {
      const mapped = mapTime(eventsFit!, s.period, pt.t);
      const at = trkT(s.period, mapped);
      events.push({ key: `e${s.period}-${pt.anchorId}`, t: at.t, kind: pt.kind, provisional: at.provisional, excluded: !pt.used, title: `${kindWord(pt.kind)} in the event log at ${clockText(pt.t)} (period ${s.period}), residual ${(pt.residual * 1000).toFixed(0)} ms` });
      const ref = pt.refAnchorId ? inp.trackingRows.find((r) => r.anchor.id === pt.refAnchorId) : undefined;
      const refT = ref ? trkT(ref.anchor.period, ref.anchor.t).t : trkT(s.period, pt.tRef).t;
      links.push({ from: { lane: 1, t: refT }, to: { lane: 2, t: at.t }, kind: 'events' });
    }
  return { lanes: [footage, tracking, events] as [LaneMark[], LaneMark[], LaneMark[]], links };
}
