/**
 * `whistlemark cuts FOOTAGE [--native|--embedded] [--json]`: finds the cuts (hard scene
 * changes) in the footage's picture and the non-live stretches they suggest (replays
 * between two close cuts; half-time from the end-of-period whistle over a cut to the
 * next whistle), in footage time. The same decoder arguments and detectors the app uses.
 */
import type { CliCommand } from '../cli.ts';
import { proposeNonLive, type CutCandidate, type NonLiveProposal } from '../../engine/cuts/index.ts';
import type { DecodeEngine } from '../host/audio/decode.ts';
import { clock, parseFootageArgs, printRows, runCancellable } from './footage-command.ts';
import { scanFootageWhistles } from '../host/audio/scan-footage.ts';
import { scanFootageCuts } from '../host/footage/frames-scan.ts';
import { probeFootageFile } from '../host/footage/probe.ts';

const usage = `usage: whistlemark cuts FOOTAGE [--native | --embedded] [--json]

Scans the picture of FOOTAGE (every frame, scaled to 64×36 grey) for cuts and prints
each cut's footage time, frame number and strength, then the non-live stretches the
cuts suggest: a replay between two cuts 2–20 s apart, and half-time from a period-end
(double) whistle over a cut to the next whistle. Proposals only: confirm them in the app.
  --native     decode with ffmpeg from PATH (the default when it is there; fastest)
  --embedded   decode with the built-in ffmpeg.wasm (the default otherwise)
  --json       print cuts and proposals as JSON`;

export const command: CliCommand = {
  summary: 'list cuts in a footage file\'s picture and the non-live stretches they suggest',
  usage,
  async run(args) {
    const parsed = parseFootageArgs('cuts', args, usage);
    if (typeof parsed === 'number') return parsed;
    const { file, engine, json } = parsed;
    return runCancellable('cuts', async ({ signal, tell, elapsedS }) => {
      const probe = await probeFootageFile(file);
      const whistles = probe.hasAudio
        ? (await scanFootageWhistles(file, { engine, signal, onProgress: (s) => tell(`sound: ${s.toFixed(0)} s scanned`) })).candidates
        : [];
      const scan = await scanFootageCuts(file, {
        engine,
        probe,
        signal,
        onProgress: (n, total, found) => tell(`picture: frame ${n} of ${total}, ${found} cuts so far`),
      });
      const proposals = proposeNonLive(scan.cuts, whistles);
      const wallS = elapsedS();
      return () =>
        json
          ? console.log(JSON.stringify({ file, engine: scan.engine, frames: scan.frames, whistles: whistles.length, cuts: scan.cuts, nonLive: proposals }, null, 2))
          : printTable(file, scan.engine, scan.frames, wallS, scan.cuts, proposals, whistles.length, probe.hasAudio);
    });
  },
};

function printTable(file: string, engine: DecodeEngine, frames: number, wallS: number, cuts: CutCandidate[], proposals: NonLiveProposal[], whistles: number, hasAudio: boolean): void {
  const how = engine === 'native' ? 'native ffmpeg' : 'embedded ffmpeg.wasm';
  console.log(`${file}: ${cuts.length} cut${cuts.length === 1 ? '' : 's'} in ${frames} frames`);
  console.log(`(decoded with ${how}; took ${wallS.toFixed(1)} s, ${(frames / Math.max(wallS, 1e-3)).toFixed(0)} frames/s; ${hasAudio ? `${whistles} whistle candidates used as cues` : 'no sound, so no whistle cues'})`);
  if (cuts.length) {
    const rows = [['#', 'footage time', 'frame', 'strength', 'above neighbours']];
    cuts.forEach((c, i) => rows.push([String(i + 1), clock(c.t), String(c.frame), c.strength.toFixed(2), c.ratio >= 100 ? '≥100×' : `${c.ratio.toFixed(1)}×`]));
    printRows(rows);
  }
  console.log(`proposed non-live stretches: ${proposals.length}`);
  if (proposals.length) {
    const rows = [['#', 'from', 'to', 'length', 'kind', 'why']];
    proposals.forEach((p, i) => rows.push([String(i + 1), clock(p.fromT), clock(p.toT), `${(p.toT - p.fromT).toFixed(1)} s`, p.kind.replace('_', '-'), p.reason]));
    printRows(rows);
  }
}
