/**
 * The footage cued at the moment under review: the shared player (renderer/src/player/)
 * on the project's footage, sought through the newest footage clock fit (tracking ->
 * footage time by engine/fit/footage-map.ts). The player keeps its own keys.
 */
import { useEffect, useState } from 'react';
import type { ClockFit, PeriodId } from '../../../shared-types/index.ts';
import { trackingToFootage } from '../../../engine/fit/footage-map.ts';
import { FootagePlayer, useFootageSource, type FootagePlayerControl } from '../player/index.ts';

export interface ReviewFootageProps {
  projectId: number;
  footageSourceId: number;
  fit: ClockFit;
  period: PeriodId;
  /** Tracking seconds of the moment to show. */
  t: number;
}

export function ReviewFootage({ projectId, footageSourceId, fit, period, t }: ReviewFootageProps) {
  const footage = useFootageSource(projectId, footageSourceId);
  const [player, setPlayer] = useState<FootagePlayerControl | null>(null);
  const [shown, setShown] = useState<number>();
  const tf = trackingToFootage(fit, period, t, 1);
  useEffect(() => {
    if (!player || tf === undefined) return;
    let stop = false;
    player.pause();
    void player.seekToTime(tf).then((f) => !stop && setShown(f.index));
    return () => {
      stop = true;
    };
  }, [player, tf]);
  return (
    <div className="review-footage" data-testid="review-footage" data-frame={shown ?? ''}>
      {footage.error ? (
        <p className="error-text small">{footage.error}</p>
      ) : footage.src && footage.probe ? (
        <FootagePlayer src={footage.src} probe={footage.probe} {...(footage.mediaOffset !== undefined ? { mediaOffset: footage.mediaOffset } : {})} clocks={footage.clocks} onControl={setPlayer} label="Footage at the moment under review" />
      ) : (
        <p className="muted small">Opening the footage…</p>
      )}
      <p className="small muted">
        {tf === undefined ? 'This moment is outside the footage clock fit (not in the recording, or in a gap).' : `Cued at footage ${tf.toFixed(2)} s${shown !== undefined ? ` (frame ${shown})` : ''}.`}
      </p>
    </div>
  );
}
