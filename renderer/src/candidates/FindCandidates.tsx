/**
 * "Find candidates" for one footage source: the button, a progress bar with the phase in
 * words, Cancel (Esc), and what was stored. With `keys`, F starts and Esc cancels (ignored
 * while typing in a field). The Sync screen may use this or only useFootageScan().
 */
import { useEffect } from 'react';
import { isTypingTarget } from '../app/keys.ts';
import type { WhistlemarkDb } from '../db/database.ts';
import './candidates.css';
import { useFootageScan } from './useFootageScan.ts';

function clock(s: number): string {
  const m = Math.floor(s / 60);
  return `${m}:${(s - m * 60).toFixed(1).padStart(4, '0')}`;
}

export function FindCandidates(props: { db: WhistlemarkDb; projectId: number; footageSourceId: number; user?: string; keys?: boolean }) {
  const scan = useFootageScan(props.db, props.projectId, props.footageSourceId, props.user);
  const { running, start, cancel } = scan;

  useEffect(() => {
    if (!props.keys) return;
    const onKey = (e: KeyboardEvent) => {
      if (isTypingTarget(e.target) || e.ctrlKey || e.metaKey || e.altKey) return;
      if ((e.key === 'f' || e.key === 'F') && !running) {
        e.preventDefault();
        start();
      } else if (e.key === 'Escape' && running) {
        e.preventDefault();
        cancel();
      }
    };
    window.addEventListener('keydown', onKey);
    return () => window.removeEventListener('keydown', onKey);
  }, [props.keys, running, start, cancel]);

  const pct = Math.round(100 * (scan.progress?.fraction ?? 0));
  const r = scan.result;
  return (
    <section className="fc" aria-label="Find candidates">
      <div className="fc-row">
        <button type="button" onClick={start} disabled={running} title="Scan the footage's sound for whistles and its picture for cuts (F)" aria-keyshortcuts="F">
          <kbd>F</kbd> Find candidates
        </button>
        {running && (
          <button type="button" onClick={cancel} title="Stop the scan; nothing is stored (Esc)" aria-keyshortcuts="Escape">
            Cancel <kbd>Esc</kbd>
          </button>
        )}
      </div>
      {running && scan.progress && (
        <div className="progress">
          <div className="progress-track" role="progressbar" aria-label="Finding candidates" aria-valuemin={0} aria-valuemax={100} aria-valuenow={pct}>
            <div className="progress-fill" style={{ width: `${pct}%` }} />
          </div>
          <div className="progress-text">
            <span>{scan.progress.message}</span>
            <span>{pct}%</span>
          </div>
        </div>
      )}
      {scan.error && (
        <p className={scan.error === 'cancelled' ? 'small muted' : 'fc-error'} role={scan.error === 'cancelled' ? 'status' : 'alert'}>
          {scan.error === 'cancelled' ? 'Scan cancelled; nothing was changed.' : scan.error}
        </p>
      )}
      {r && (
        <div role="status">
          <p className="small">
            Stored {r.stored.whistles} whistle{r.stored.whistles === 1 ? '' : 's'}, {r.stored.cuts} cut{r.stored.cuts === 1 ? '' : 's'} and {r.stored.proposals} proposed non-live stretch{r.stored.proposals === 1 ? '' : 'es'}
            {r.stored.keptTouched ? ` (kept ${r.stored.keptTouched} anchors you had paired or excluded)` : ''}. Undo with Ctrl+Z.
          </p>
          {r.cuts.length > 0 && (
            <ul className="fc-list" aria-label="Cuts found">
              {r.cuts.map((c) => (
                <li key={c.frame}>
                  cut at {clock(c.t)} (frame {c.frame}, strength {c.strength.toFixed(2)})
                </li>
              ))}
            </ul>
          )}
        </div>
      )}
    </section>
  );
}
