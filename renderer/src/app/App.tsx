/** The app shell: project bar, screen rail, and the current screen. */
import { useCallback, useEffect, useState } from 'react';
import { ProgressBar } from './ProgressBar.tsx';
import { SourcesScreen } from '../sources/SourcesScreen.tsx';
import { SyncScreen } from '../sync/SyncScreen.tsx';
import { ReviewScreen } from '../review/ReviewScreen.tsx';
import { WatchScreen } from '../watch/WatchScreen.tsx';
import { ReelsScreen } from '../reels/ReelsScreen.tsx';
import { isTypingTarget } from './keys.ts';
import { useUndoKeys } from './useUndoKeys.ts';
import { AppContext, type AppServices } from './context.ts';
import { seedDemoOnFirstStart, type SeedStep } from './firstStart.ts';
import { NavRail, screenForKey, type ScreenId } from './NavRail.tsx';
import { ProjectBar } from './ProjectBar.tsx';
import { useLive } from './useLive.ts';
import { AnalysisAutoRun } from '../analysis/AnalysisBar.tsx';
import { resumeAfterRestart } from '../reels/export-queue.ts';

export function App({ services }: { services: AppServices }) {
  const { db } = services;
  const projects = useLive(() => db.projects.orderBy('updatedAt').reverse().toArray(), []);
  const chosen = useLive(() => db.settings.get('currentProject').then((r) => (r?.value as number | undefined) ?? null), []);
  const [seed, setSeed] = useState<SeedStep[] | null>(null);
  const [seedError, setSeedError] = useState('');

  useEffect(() => {
    seedDemoOnFirstStart(services, setSeed).catch((e) => setSeedError(`Setting up the demo match failed: ${(e as Error).message}`));
  }, [services]);

  const screen = useLive(() => db.settings.get('screen').then((r) => (r?.value as ScreenId | undefined) ?? 'sources'), []);
  const [status, setStatus] = useState('');
  const report = useCallback((m: string) => setStatus(m), []);
  const chooseScreen = useCallback((id: ScreenId) => void db.settings.put({ key: 'screen', value: id }), [db]);

  const ready = projects !== undefined && chosen !== undefined && screen !== undefined;
  const current = projects?.find((p) => p.id === chosen) ?? projects?.[0];
  const seeding = !!seed && seed.some((s) => s.state === 'waiting' || s.state === 'running');
  useUndoKeys(db, current?.id, services.info.userName, report);

  // An export a restart cut off carries on by itself, whatever screen the app opens on.
  const currentId = current?.id;
  useEffect(() => {
    if (!ready || seeding || currentId === undefined) return;
    resumeAfterRestart(db, services.host, currentId, report).catch((e: Error) => report(`Resuming the export queue failed: ${e.message}`));
  }, [ready, seeding, currentId, db, services.host, report]);

  useEffect(() => {
    const onKey = (e: KeyboardEvent) => {
      const id = screenForKey(e);
      if (!id || isTypingTarget(e.target)) return;
      e.preventDefault();
      chooseScreen(id);
    };
    window.addEventListener('keydown', onKey);
    return () => window.removeEventListener('keydown', onKey);
  }, [chooseScreen]);
  useEffect(() => {
    if (!status) return;
    const t = setTimeout(() => setStatus(''), 6000);
    return () => clearTimeout(t);
  }, [status]);

  return (
    <AppContext.Provider value={services}>
      <div className="shell">
        <ProjectBar projects={projects ?? []} currentId={current?.id} />
        <div className="shell-body">
          <NavRail current={screen ?? 'sources'} onChoose={chooseScreen} />
          <main className="main" aria-busy={!ready || seeding}>
            {seedError && <p className="error-text" role="alert">{seedError}</p>}
            {seed && (seeding || screen === 'sources') && <SeedBanner steps={seed} onDismiss={seeding ? undefined : () => setSeed(null)} />}
            {ready && current && screen === 'sources' && <SourcesScreen key={current.id} projectId={current.id!} busyElsewhere={seeding} />}
            {ready && current && !seeding && <AnalysisAutoRun key={`analysis-${current.id}`} projectId={current.id!} />}
            {ready && current && !seeding && screen === 'sync' && <SyncScreen key={current.id} projectId={current.id!} />}
            {ready && current && !seeding && screen === 'review' && <ReviewScreen key={current.id} projectId={current.id!} />}
            {ready && current && !seeding && screen === 'watch' && <WatchScreen key={current.id} projectId={current.id!} />}
            {ready && current && !seeding && screen === 'reels' && <ReelsScreen key={current.id} projectId={current.id!} />}
            {ready && current && seeding && screen !== 'sources' && <p className="muted">The demo match is still being imported…</p>}
            {ready && !current && (
              <div className="empty">
                <p>No match project yet.</p>
                <p className="muted">Make one with “New match project” in the top bar.</p>
              </div>
            )}
          </main>
        </div>
        <p className="status-line" role="status" aria-live="polite">
          {status}
        </p>
      </div>
    </AppContext.Provider>
  );
}

function SeedBanner({ steps, onDismiss }: { steps: SeedStep[]; onDismiss: (() => void) | undefined }) {
  const done = steps.every((s) => s.state === 'done');
  return (
    <section className="panel seed" aria-label="Demo match set-up">
      <header className="panel-head">
        <h2>{onDismiss ? (done ? 'The demo match is ready' : 'The demo match is partly set up') : 'Setting up the demo match…'}</h2>
        {onDismiss && (
          <button type="button" className="quiet" onClick={onDismiss}>
            Dismiss
          </button>
        )}
      </header>
      <p className="muted small">An invented match, so the app has something to show on first start. Delete it any time.</p>
      <ol className="seed-steps">
        {steps.map((s) => (
          <li key={s.fileName} data-state={s.state}>
            <span className="seed-state">{s.state === 'done' ? '✓' : s.state === 'failed' ? '!' : s.state === 'running' ? '…' : '·'}</span>
            <span className="mono">{s.fileName}</span>
            {s.state === 'running' && (
              <ProgressBar progress={s.progress ?? { bytesRead: 0, bytesTotal: s.bytesTotal, rows: 0, phase: 'reading' }} label={`Import of ${s.fileName}`} />
            )}
            {s.message && <span className="error-text">{s.message}</span>}
          </li>
        ))}
      </ol>
    </section>
  );
}
