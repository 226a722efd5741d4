/**
 * React state for "Find candidates": start, cancel, progress and the outcome of one
 * footage source's scan, so a screen wires it in a few lines:
 *
 *   const scan = useFootageScan(db, projectId, footageSourceId, user);
 *   <button onClick={scan.start} disabled={scan.running}>Find candidates</button>
 *   {scan.progress && <progress value={scan.progress.fraction} />}   // or <FindCandidates …/>
 */
import { useCallback, useEffect, useRef, useState } from 'react';
import type { WhistlemarkDb } from '../db/database.ts';
import { scanFootage, type ScanFootageResult, type ScanProgress } from './scan-footage.ts';

export interface FootageScanState {
  running: boolean;
  progress?: ScanProgress;
  result?: ScanFootageResult;
  /** A message the analyst can act on; 'cancelled' after Cancel. */
  error?: string;
  start: () => void;
  cancel: () => void;
}

export function useFootageScan(db: WhistlemarkDb, projectId: number | undefined, footageSourceId: number | undefined, user?: string): FootageScanState {
  const [running, setRunning] = useState(false);
  const [progress, setProgress] = useState<ScanProgress>();
  const [result, setResult] = useState<ScanFootageResult>();
  const [error, setError] = useState<string>();
  const ctl = useRef<AbortController | null>(null);

  // Leaving the screen stops a scan still running (nothing is stored then).
  useEffect(() => () => ctl.current?.abort(), []);

  const start = useCallback(() => {
    if (ctl.current || projectId === undefined || footageSourceId === undefined) return;
    const c = new AbortController();
    ctl.current = c;
    setRunning(true);
    setError(undefined);
    setResult(undefined);
    setProgress({ phase: 'loading', fraction: 0, message: 'Starting…' });
    scanFootage(db, projectId, footageSourceId, { signal: c.signal, onProgress: setProgress, ...(user ? { user } : {}) })
      .then(setResult)
      .catch((e: unknown) => setError(c.signal.aborted ? 'cancelled' : e instanceof Error ? e.message : String(e)))
      .finally(() => {
        ctl.current = null;
        setRunning(false);
      });
  }, [db, projectId, footageSourceId, user]);

  const cancel = useCallback(() => ctl.current?.abort(), []);
  return { running, progress, result, error, start, cancel };
}
