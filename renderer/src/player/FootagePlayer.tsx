/**
 * <FootagePlayer src probe onControl /> — the footage player every screen uses: the
 * <video> with room for an overlay (children are drawn over the picture), the transport
 * (play/pause, frame steps, jumps, shuttle), the readouts of the frame on screen in every
 * clock, and a go-to field for any clock.
 *
 * The parent gets the FootagePlayerControl through `onControl` (null when the source
 * changes or the player unmounts) and must not seek the video element itself.
 */
import { useCallback, useEffect, useRef, useState, type ReactNode } from 'react';
import type { FootageProbe } from '../../../shared-types/index.ts';
import { isTypingTarget } from '../app/keys.ts';
import { dropFrameApplies, formatFootageTime, matchReadout, timecodeOfFrame, timecodeRateOf, type MatchClocks } from './clocks.ts';
import { GoToField } from './GoToField.tsx';
import { JUMPS, PLAYER_KEYS, playerActionOf, type PlayerAction } from './player-keys.ts';
import { createVideoPlayer, type FootagePlayerControl, type ShownFrame } from './video-player.ts';
import './player.css';

export interface FootagePlayerProps {
  /** URL the host serves the footage at (OpenedFile.url, or the playable copy's). */
  src: string;
  probe: FootageProbe;
  /** Media time minus footage time when the host knows it (a remuxed copy); learned from the element otherwise. */
  mediaOffset?: number;
  /** Footage clock fit and friends, for the match clock and tracking frame. */
  clocks?: MatchClocks;
  onControl?: (control: FootagePlayerControl | null) => void;
  /** Whether the player answers its keys (default true). Turn off when another player on the screen has them. */
  keyboard?: boolean;
  /** Drawn over the picture, sized to it (overlays). */
  children?: ReactNode;
  /** Accessible name of the player region. */
  label?: string;
  /** Extra class on the outer element. */
  className?: string;
  /** In/out marks (footage frames) drawn on the scrub bar. */
  marks?: { inFrame?: number; outFrame?: number };
}

export function FootagePlayer({ src, probe, mediaOffset, clocks, onControl, keyboard = true, children, label = 'Footage player', className, marks }: FootagePlayerProps) {
  const videoRef = useRef<HTMLVideoElement | null>(null);
  const [control, setControl] = useState<FootagePlayerControl | null>(null);
  const [frame, setFrame] = useState<ShownFrame | undefined>();
  const [, setStateTick] = useState(0);
  const [error, setError] = useState('');
  const [muted, setMuted] = useState(false);
  const ntsc = dropFrameApplies(probe.nominalFps);
  const [dropFrame, setDropFrame] = useState(true);
  const rate = timecodeRateOf(probe.nominalFps, ntsc && dropFrame);
  const gotoRef = useRef<HTMLInputElement | null>(null);
  const onControlRef = useRef(onControl);
  onControlRef.current = onControl;

  useEffect(() => {
    const video = videoRef.current;
    if (!video) return;
    setError('');
    setFrame(undefined);
    video.src = src;
    const c = createVideoPlayer(video, probe, { mediaOffset });
    const offFrame = c.onFrame((f) => setFrame(f as ShownFrame));
    const offState = c.onState(() => setStateTick((n) => n + 1));
    c.ready.catch((e: Error) => setError(`The footage could not be shown: ${e.message}. Check that the file is still where it was imported from.`));
    setControl(c);
    onControlRef.current?.(c);
    return () => {
      offFrame();
      offState();
      c.destroy();
      onControlRef.current?.(null);
      setControl(null);
      video.removeAttribute('src');
      video.load();
    };
  }, [src, probe, mediaOffset]);

  const run = useCallback(
    (a: PlayerAction) => {
      if (!control) return;
      switch (a.kind) {
        case 'toggle':
          return control.togglePlay();
        case 'step':
          return void control.step(a.frames);
        case 'jump':
          return void control.jump(a.seconds);
        case 'shuttle':
          return control.shuttle(a.direction);
        case 'stop':
          return control.pause();
        case 'first':
          return void control.seekToFrame(0);
        case 'last':
          return void control.seekToFrame(control.frameCount - 1);
        case 'goto':
          gotoRef.current?.focus();
          gotoRef.current?.select();
          return;
        case 'mute': {
          const v = control.video;
          if (v) {
            v.muted = !v.muted;
            setMuted(v.muted);
          }
          return;
        }
      }
    },
    [control],
  );

  useEffect(() => {
    if (!keyboard || !control) return;
    const onKey = (e: KeyboardEvent) => {
      if (e.defaultPrevented || isTypingTarget(e.target) || document.querySelector('dialog[open]')) return;
      // Buttons answer Space themselves; let them, except our own.
      const el = e.target as HTMLElement | null;
      if (e.key === ' ' && el?.tagName === 'BUTTON' && !el.closest('.fp-player')) return;
      const a = playerActionOf(e);
      if (!a) return;
      e.preventDefault();
      run(a);
    };
    window.addEventListener('keydown', onKey);
    return () => window.removeEventListener('keydown', onKey);
  }, [keyboard, control, run]);

  const match = frame && clocks ? matchReadout(clocks, frame.t) : undefined;
  const playing = control?.playing ?? false;
  const shuttle = control?.rate ?? 0;
  const problem = control?.problem;
  const last = probe.pts.length - 1;
  const btn = (a: PlayerAction, text: string, title: string, keys: string) => (
    <button type="button" className="fp-btn" onClick={() => run(a)} disabled={!control || !frame} title={`${title} (${keys.replace(/\+/g, ' + ')})`} aria-label={title} aria-keyshortcuts={keys}>
      {text}
    </button>
  );

  return (
    <section className={`fp-player${className ? ` ${className}` : ''}`} aria-label={label}>
      <div className="fp-stage" style={{ aspectRatio: `${probe.width} / ${probe.height}` }}>
        <video ref={videoRef} className="fp-video" playsInline preload="auto" muted={muted} aria-label="Footage" data-testid="footage-video" />
        <div className="fp-overlay">{children}</div>
        {!frame && !error && <div className="fp-wait" role="status">Loading footage…</div>}
      </div>
      {error && (
        <p className="error-text fp-error" role="alert">
          {error}
        </p>
      )}
      <div className="fp-scrub-wrap">
        <input
        className="fp-scrub"
        type="range"
        min={0}
        max={last}
        step={1}
        value={frame?.index ?? 0}
        disabled={!control || !frame}
        aria-label="Footage position (frame)"
        onChange={(e) => void control?.seekToFrame(Number(e.target.value))}
        />
        <ScrubMarks marks={marks} last={last} />
      </div>
      <div className="fp-bar">
        <div className="fp-transport" role="toolbar" aria-label="Transport">
          {btn({ kind: 'first' }, '⇤', 'First frame', PLAYER_KEYS.first)}
          {btn({ kind: 'jump', seconds: -JUMPS.shift }, '−5 s', 'Back 5 seconds', PLAYER_KEYS.jumpBack)}
          {btn({ kind: 'step', frames: -1 }, '◂|', 'Previous frame', PLAYER_KEYS.stepBack)}
          {btn({ kind: 'shuttle', direction: -1 }, '◂◂', 'Shuttle backwards (again: faster)', PLAYER_KEYS.shuttleBack)}
          <button
            type="button"
            className="fp-btn fp-play"
            onClick={() => run({ kind: 'toggle' })}
            disabled={!control || !frame}
            title={`${playing ? 'Pause' : 'Play'} (Space; K stops)`}
            aria-label={playing ? 'Pause' : 'Play'}
            aria-keyshortcuts="Space K"
          >
            {playing ? '❚❚' : '▶'}
          </button>
          {btn({ kind: 'shuttle', direction: 1 }, '▸▸', 'Shuttle forwards (again: faster)', PLAYER_KEYS.shuttleForward)}
          {btn({ kind: 'step', frames: 1 }, '|▸', 'Next frame', PLAYER_KEYS.stepForward)}
          {btn({ kind: 'jump', seconds: JUMPS.shift }, '+5 s', 'Forward 5 seconds', PLAYER_KEYS.jumpForward)}
          {btn({ kind: 'last' }, '⇥', 'Last frame', PLAYER_KEYS.last)}
          <span className="fp-rate mono" aria-label="Shuttle speed" title="J / L: shuttle backwards / forwards, K: stop">
            {shuttle === 0 ? 'paused' : `${shuttle > 0 ? '▸' : '◂'} ${Math.abs(shuttle)}×`}
          </span>
          <button type="button" className="fp-btn" onClick={() => run({ kind: 'mute' })} disabled={!control} title="Sound on/off (M)" aria-keyshortcuts="M" aria-pressed={muted}>
            {muted ? 'Sound off' : 'Sound on'}
          </button>
        </div>
        <dl className="fp-readouts" aria-label="Frame on screen">
          <div>
            <dt>Footage</dt>
            <dd className="mono" data-testid="readout-footage">
              {frame ? formatFootageTime(frame.t) : '–'}
            </dd>
          </div>
          <div>
            <dt>Frame</dt>
            <dd className="mono" data-testid="readout-frame">
              {frame ? `${frame.index} / ${last}` : '–'}
            </dd>
          </div>
          <div>
            <dt>
              Timecode
              {ntsc && (
                <button type="button" className="fp-df" onClick={() => setDropFrame((d) => !d)} title="Switch between drop-frame and non-drop counting" aria-pressed={dropFrame}>
                  {dropFrame ? 'DF' : 'NDF'}
                </button>
              )}
            </dt>
            <dd className="mono" data-testid="readout-timecode">
              {frame ? timecodeOfFrame(frame.index, rate) : '–'}
            </dd>
          </div>
          <div>
            <dt>Match clock</dt>
            <dd className="mono" data-testid="readout-match" title={clocks?.fit ? undefined : 'Needs a footage clock fit (Sync screen)'}>
              {match ? `${match.matchClock} · P${match.period}` : clocks?.fit ? 'not live' : 'no fit'}
            </dd>
          </div>
          <div>
            <dt>Tracking frame</dt>
            <dd className="mono" data-testid="readout-tracking">
              {match?.trackingFrame !== undefined ? match.trackingFrame : '–'}
            </dd>
          </div>
        </dl>
      </div>
      <GoToField
        inputRef={gotoRef}
        disabled={!control || !frame}
        hasFit={Boolean(clocks?.fit)}
        input={{ pts: probe.pts, nominalFps: probe.nominalFps, rate, clocks: clocks ?? {} }}
        onTarget={(t) => ('frame' in t ? control?.seekToFrame(t.frame) : control?.seekToTime(t.t))}
      />
      {problem && (
        <p className="fp-problem small" role="status">
          Frame check: {problem}.
        </p>
      )}
    </section>
  );
}

/**
 * The marked span over the scrub bar: a tick at the in and the out frame and a band
 * between. Positions follow the range input's track, which starts and ends half a thumb in.
 */
function ScrubMarks({ marks, last }: { marks: FootagePlayerProps['marks']; last: number }) {
  if (!marks || (marks.inFrame === undefined && marks.outFrame === undefined) || last <= 0) return null;
  const at = (f: number) => `calc(var(--fp-thumb) / 2 + (100% - var(--fp-thumb)) * ${Math.max(0, Math.min(1, f / last))})`;
  const { inFrame, outFrame } = marks;
  const band = inFrame !== undefined && outFrame !== undefined && outFrame >= inFrame;
  return (
    <div className="fp-marks" aria-hidden="true" data-testid="scrub-marks">
      {band && <span className="fp-mark-band" style={{ left: at(inFrame), width: `calc((100% - var(--fp-thumb)) * ${(outFrame - inFrame) / last})` }} />}
      {inFrame !== undefined && <span className="fp-mark in" style={{ left: at(inFrame) }} title={`in: frame ${inFrame}`} />}
      {outFrame !== undefined && <span className="fp-mark out" style={{ left: at(outFrame) }} title={`out: frame ${outFrame}`} />}
    </div>
  );
}
