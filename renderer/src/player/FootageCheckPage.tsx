/**
 * A page of its own for checking footage against its frame table: any file by path, or a
 * project's stored footage source, in the player, with the raw facts beside it (media
 * offset, frame table agreement). Opened as `#footage-check?path=/abs/file.mp4` or
 * `#footage-check?project=1&source=3`; the end-to-end tests and the seek benchmark use it.
 */
import { useEffect, useState } from 'react';
import type { FootageProbe } from '../../../shared-types/index.ts';
import { useServices } from '../app/context.ts';
import { FootagePlayer } from './FootagePlayer.tsx';
import { useFootageSource } from './use-footage-source.ts';
import type { FootagePlayerControl } from './video-player.ts';

export const FOOTAGE_CHECK_HASH = '#footage-check';

export function isFootageCheck(hash: string): boolean {
  return hash.startsWith(FOOTAGE_CHECK_HASH);
}

function params(hash: string): URLSearchParams {
  const q = hash.indexOf('?');
  return new URLSearchParams(q < 0 ? '' : hash.slice(q + 1));
}

/** Exposes the control to the page (tests and benchmarks drive it from outside). */
function expose(c: FootagePlayerControl | null) {
  (globalThis as { footageCheck?: FootagePlayerControl | null }).footageCheck = c;
}

export function FootageCheckPage({ hash }: { hash: string }) {
  const p = params(hash);
  const path = p.get('path');
  const project = Number(p.get('project'));
  const source = Number(p.get('source'));
  return (
    <main className="fp-check">
      <h1>Footage check</h1>
      {path ? <ByPath path={path} /> : Number.isInteger(project) && Number.isInteger(source) && project > 0 ? <BySource projectId={project} sourceId={source} /> : <p role="alert">Give a file: #footage-check?path=/absolute/file.mp4, or a source: #footage-check?project=1&source=3</p>}
    </main>
  );
}

function Facts({ control, probe, name }: { control: FootagePlayerControl | null; probe: FootageProbe; name: string }) {
  const [offset, setOffset] = useState<number>();
  useEffect(() => {
    if (!control) return;
    void control.ready.then(() => setOffset(control.mediaOffset)).catch(() => undefined);
  }, [control]);
  return (
    <p className="muted mono small" data-testid="footage-facts">
      {name} · {probe.container} {probe.videoCodec} {probe.width}×{probe.height} · {probe.frameCount} frames · nominal {+probe.nominalFps.toFixed(3)} fps{probe.variableRate ? ` · variable rate (measured ${probe.measuredFps.toFixed(3)})` : ''} · first PTS {probe.startTime.toFixed(6)} s
      {offset !== undefined && ` · media offset ${offset.toFixed(6)} s`}
    </p>
  );
}

function ByPath({ path }: { path: string }) {
  const { host } = useServices();
  const [state, setState] = useState<{ src: string; mediaOffset?: number; probe: FootageProbe; name: string } | { error: string }>();
  const [control, setControl] = useState<FootagePlayerControl | null>(null);
  useEffect(() => {
    let stop = false;
    (async () => {
      const [file] = await host.openPaths([path]);
      const probe = await host.probeFootage(file.fileId);
      const played = await host.playableFootage(file.fileId);
      if (!stop) setState({ src: played.url, mediaOffset: played.mediaOffset, probe, name: played.remuxed ? `${file.name} (played from an MP4 copy)` : file.name });
    })().catch((e: Error) => !stop && setState({ error: `${path}: ${e.message}` }));
    return () => {
      stop = true;
    };
  }, [host, path]);
  if (!state) return <p role="status">Reading the frame table…</p>;
  if ('error' in state) return <p role="alert" className="error-text">{state.error}</p>;
  return (
    <>
      <Facts control={control} probe={state.probe} name={state.name} />
      <FootagePlayer
        src={state.src}
        mediaOffset={state.mediaOffset}
        probe={state.probe}
        onControl={(c) => {
          setControl(c);
          expose(c);
        }}
      />
    </>
  );
}

function BySource({ projectId, sourceId }: { projectId: number; sourceId: number }) {
  const f = useFootageSource(projectId, sourceId);
  const [control, setControl] = useState<FootagePlayerControl | null>(null);
  if (f.error) return <p role="alert" className="error-text">{f.error}</p>;
  if (!f.src || !f.probe) return <p role="status">Opening the footage…</p>;
  return (
    <>
      <Facts control={control} probe={f.probe} name={f.fileName ?? ''} />
      <FootagePlayer
        src={f.src}
        mediaOffset={f.mediaOffset}
        probe={f.probe}
        clocks={f.clocks}
        onControl={(c) => {
          setControl(c);
          expose(c);
        }}
      />
    </>
  );
}
