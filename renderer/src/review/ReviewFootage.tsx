/**
 * The footage cued at the moment under review, through the shared player contract and the
 * newest footage clock fit (tracking -> footage time by engine/fit/footage-map.ts).
 */
import { useEffect, useRef, useState } from 'react';
import type { ClockFit, FootageProbe, PeriodId } from '../../../shared-types/index.ts';
import { trackingToFootage } from '../../../engine/fit/footage-map.ts';
import { useServices } from '../app/context.ts';
import { useFootagePlayer } from '../watch/use-footage-player.ts';

export interface ReviewFootageProps {
  path: string;
  fileName: string;
  probe: FootageProbe;
  fit: ClockFit;
  period: PeriodId;
  /** Tracking seconds of the moment to show. */
  t: number;
}

export function ReviewFootage({ path, fileName, probe, fit, period, t }: ReviewFootageProps) {
  const { host } = useServices();
  const [url, setUrl] = useState<string>();
  const [error, setError] = useState('');
  const ref = useRef<HTMLVideoElement | null>(null);
  const player = useFootagePlayer(ref, url, probe);
  const [shown, setShown] = useState<number>();
  useEffect(() => {
    host
      .openPaths([path])
      .then((f) => setUrl(f[0]?.url))
      .catch((e) => setError(`The footage ${fileName} could not be opened: ${(e as Error).message}. Relink it on the Sources screen (Alt+1).`));
  }, [host, path, fileName]);
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
    <div className="review-footage">
      <video ref={ref} muted playsInline preload="auto" aria-label={`Footage ${fileName}`} data-testid="review-video" data-frame={shown ?? ''} />
      <p className="small muted">
        {error ? (
          <span className="error-text">{error}</span>
        ) : tf === undefined ? (
          'This moment is outside the footage clock fit (not in the recording, or in a gap).'
        ) : (
          <>
            Footage {tf.toFixed(2)} s{shown !== undefined ? ` · frame ${shown}` : ''}
          </>
        )}
      </p>
    </div>
  );
}
