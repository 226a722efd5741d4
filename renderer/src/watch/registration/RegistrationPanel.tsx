/**
 * Pitch registration: choose a landmark, click it on the paused frame, four or more give a
 * homography with each point's reprojection error; save it as a keyframe. Keyframes for a
 * moving camera are listed with their fit; a new keyframe starts from the nearest one's
 * landmarks where the camera shows them now, so it only needs nudging.
 */
import type { DisplayedFrame } from '../../player/contract.ts';
import type { LandmarkPair, OverlayData, RegistrationData } from '../../overlay/contract.ts';
import { rms } from './edit.ts';
import { landmarksOf, type Solved } from './geometry.ts';

export interface RegistrationPanelProps {
  data: OverlayData | undefined;
  registration: RegistrationData | undefined;
  registering: boolean;
  pairs: LandmarkPair[];
  solved: Solved | undefined;
  landmarkId: string;
  selected: number[] | 'all';
  frame: DisplayedFrame | undefined;
  onLandmark(id: string): void;
  onSelect(s: number[] | 'all'): void;
  onStart(): void;
  onCancel(): void;
  onSave(): void;
  onClear(): void;
  onRemovePair(i: number): void;
  onNudge(du: number, dv: number): void;
  onGoTo(frame: number): void;
  onDelete(frame: number): void;
}

export function RegistrationPanel(p: RegistrationPanelProps) {
  const landmarks = p.data ? landmarksOf(p.data.pitch) : [];
  const errors = p.solved && 'errors' in p.solved ? p.solved.errors : undefined;
  const labelOf = (id: string) => landmarks.find((l) => l.id === id)?.label ?? id;
  return (
    <section className="watch-card" aria-label="Pitch registration">
      <h3>Pitch registration</h3>
      {!p.registering ? (
        <button type="button" onClick={p.onStart} disabled={!p.frame} title="Register the pitch on this frame (R)" aria-keyshortcuts="R">
          Register on this frame <kbd>R</kbd>
        </button>
      ) : (
        <>
          <p className="small muted">Choose a landmark, then click where it is on the frame. Four or more give the fit; Ctrl+arrows nudge the selected points by 1 px (Shift: ¼ px).</p>
          <label className="small watch-row">
            Landmark{' '}
            <select aria-label="Landmark to place" value={p.landmarkId} onChange={(e) => p.onLandmark(e.target.value)}>
              <option value="">choose…</option>
              {landmarks.map((l) => (
                <option key={l.id} value={l.id}>
                  {l.label}
                  {p.pairs.some((q) => q.landmarkId === l.id) ? ' ✓' : ''}
                </option>
              ))}
            </select>
          </label>
          <table className="watch-pairs-table" aria-label="Placed landmarks">
            <thead>
              <tr>
                <th scope="col">
                  <input type="checkbox" aria-label="Select all points" checked={p.selected === 'all'} onChange={(e) => p.onSelect(e.target.checked ? 'all' : [])} />
                </th>
                <th scope="col">Landmark</th>
                <th scope="col">u, v px</th>
                <th scope="col">Error px</th>
                <th scope="col" />
              </tr>
            </thead>
            <tbody>
              {p.pairs.map((q, i) => {
                const on = p.selected === 'all' || p.selected.includes(i);
                const e = errors?.[i];
                return (
                  <tr key={q.landmarkId} data-selected={on || undefined}>
                    <td>
                      <input type="checkbox" aria-label={`Select ${labelOf(q.landmarkId)}`} checked={on} onChange={(ev) => p.onSelect(ev.target.checked ? [...(p.selected === 'all' ? [] : p.selected), i] : p.selected === 'all' ? p.pairs.map((_, j) => j).filter((j) => j !== i) : p.selected.filter((j) => j !== i))} />
                    </td>
                    <td>{labelOf(q.landmarkId)}</td>
                    <td className="mono">
                      {q.u.toFixed(1)}, {q.v.toFixed(1)}
                    </td>
                    <td className={`mono ${e !== undefined && e > 3 ? 'error-text' : ''}`} data-testid="pair-error">
                      {e === undefined ? '—' : e.toFixed(2)}
                    </td>
                    <td>
                      <button type="button" className="quiet" aria-label={`Remove ${labelOf(q.landmarkId)}`} onClick={() => p.onRemovePair(i)}>
                        ✕
                      </button>
                    </td>
                  </tr>
                );
              })}
            </tbody>
          </table>
          <div className="watch-row">
            <span className="small">Nudge</span>
            <button type="button" className="quiet" aria-label="Nudge left" onClick={() => p.onNudge(-1, 0)} aria-keyshortcuts="Control+ArrowLeft">←</button>
            <button type="button" className="quiet" aria-label="Nudge up" onClick={() => p.onNudge(0, -1)} aria-keyshortcuts="Control+ArrowUp">↑</button>
            <button type="button" className="quiet" aria-label="Nudge down" onClick={() => p.onNudge(0, 1)} aria-keyshortcuts="Control+ArrowDown">↓</button>
            <button type="button" className="quiet" aria-label="Nudge right" onClick={() => p.onNudge(1, 0)} aria-keyshortcuts="Control+ArrowRight">→</button>
          </div>
          <p className="small" data-testid="fit-summary">
            {p.solved === undefined ? `${p.pairs.length} of 4 landmarks placed` : 'error' in p.solved ? <span className="error-text">{p.solved.error}</span> : `Fit: RMS ${rms(p.solved.errors).toFixed(2)} px over ${p.pairs.length} landmarks`}
          </p>
          <div className="watch-row">
            <button type="button" className="primary" onClick={p.onSave} disabled={!p.solved || 'error' in p.solved} title="Save as the keyframe of this frame (S)" aria-keyshortcuts="S">
              Save keyframe <kbd>S</kbd>
            </button>
            <button type="button" onClick={p.onClear}>
              Clear points
            </button>
            <button type="button" className="quiet" onClick={p.onCancel} title="Leave registration (Esc)" aria-keyshortcuts="Escape">
              Cancel
            </button>
          </div>
        </>
      )}
      <table className="watch-keyframes" aria-label="Keyframes">
        <thead>
          <tr>
            <th scope="col">Frame</th>
            <th scope="col">Time</th>
            <th scope="col">Points</th>
            <th scope="col">RMS px</th>
            <th scope="col" />
          </tr>
        </thead>
        <tbody>
          {(p.registration?.keyframes ?? []).map((k) => (
            <tr key={k.frame} data-current={p.frame?.index === k.frame || undefined}>
              <td className="mono">{k.frame}</td>
              <td className="mono">{k.t.toFixed(2)} s</td>
              <td>{k.pairs.length}</td>
              <td className="mono">{rms(k.errors).toFixed(2)}</td>
              <td>
                <button type="button" className="quiet" onClick={() => p.onGoTo(k.frame)}>
                  Go to
                </button>
                <button type="button" className="quiet" aria-label={`Delete keyframe ${k.frame}`} onClick={() => p.onDelete(k.frame)}>
                  Delete
                </button>
              </td>
            </tr>
          ))}
          {!p.registration?.keyframes.length && (
            <tr>
              <td colSpan={5} className="muted small">
                No keyframe yet.
              </td>
            </tr>
          )}
        </tbody>
      </table>
    </section>
  );
}
