/**
 * `whistlemark cuts FOOTAGE [--native|--embedded] [--json]`: finds the cuts (hard scene
 * changes) in the footage's picture and the non-live stretches they suggest (replays
 * between two close cuts; half-time from the end-of-period whistle over a cut to the
 * next whistle), in footage time. The same decoder arguments and detectors the app uses.
 */
import type { CliCommand } from '../cli.ts';
import { proposeNonLive, type CutCandidate, type NonLiveProposal } from '../../engine/cuts/index.ts';
import type { DecodeEngine } from '../host/audio/decode.ts';
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
    const unknown = args.filter((a) => a.startsWith('--') && !['--native', '--embedded', '--json'].includes(a));
    const files = args.filter((a) => !a.startsWith('--'));
    if (unknown.length || files.length !== 1 || (args.includes('--native') && args.includes('--embedded'))) {
      if (unknown.length) console.error(`whistlemark cuts: unknown option ${unknown[0]}.`);
      console.error(usage);
      return 2;
    }
    const file = files[0];
    const engine: DecodeEngine | 'auto' = args.includes('--native') ? 'native' : args.includes('--embedded') ? 'embedded' : 'auto';
    const json = args.includes('--json');
    const ctl = new AbortController();
    const onSigint = () => ctl.abort(Object.assign(new Error('cancelled (Ctrl-C)'), { name: 'AbortError' }));
    process.once('SIGINT', onSigint);
    const started = performance.now();
    let lastReport = started;
    const tell = (text: string) => {
      const now = performance.now();
      if (process.stderr.isTTY && now - lastReport > 1000) {
        lastReport = now;
        process.stderr.write(`\r${text}\x1b[K`);
      }
    };
    try {
      const probe = await probeFootageFile(file);
      const whistles = probe.hasAudio
        ? (await scanFootageWhistles(file, { engine, signal: ctl.signal, onProgress: (s) => tell(`sound: ${s.toFixed(0)} s scanned`) })).candidates
        : [];
      const scan = await scanFootageCuts(file, {
        engine,
        probe,
        signal: ctl.signal,
        onProgress: (n, total, found) => tell(`picture: frame ${n} of ${total}, ${found} cuts so far`),
      });
      const proposals = proposeNonLive(scan.cuts, whistles);
      if (process.stderr.isTTY) process.stderr.write('\r\x1b[K');
      const wallS = (performance.now() - started) / 1000;
      if (json) {
        console.log(JSON.stringify({ file, engine: scan.engine, frames: scan.frames, whistles: whistles.length, cuts: scan.cuts, nonLive: proposals }, null, 2));
      } else {
        printTable(file, scan.engine, scan.frames, wallS, scan.cuts, proposals, whistles.length, probe.hasAudio);
      }
      return 0;
    } catch (err) {
      if (ctl.signal.aborted) {
        console.error('\nwhistlemark cuts: cancelled.');
        return 130;
      }
      throw err;
    } finally {
      process.off('SIGINT', onSigint);
    }
  },
};

function printTable(file: string, engine: DecodeEngine, frames: number, wallS: number, cuts: CutCandidate[], proposals: NonLiveProposal[], whistles: number, hasAudio: boolean): void {
  const how = engine === 'native' ? 'native ffmpeg' : 'embedded ffmpeg.wasm';
  console.log(`${file}: ${cuts.length} cut${cuts.length === 1 ? '' : 's'} in ${frames} frames`);
  console.log(`(decoded with ${how}; took ${wallS.toFixed(1)} s, ${(frames / Math.max(wallS, 1e-3)).toFixed(0)} frames/s; ${hasAudio ? `${whistles} whistle candidates used as cues` : 'no sound, so no whistle cues'})`);
  if (cuts.length) {
    const rows = [['#', 'footage time', 'frame', 'strength', 'above neighbours']];
    cuts.forEach((c, i) => rows.push([String(i + 1), clock(c.t), String(c.frame), c.strength.toFixed(2), c.ratio >= 100 ? '≥100×' : `${c.ratio.toFixed(1)}×`]));
    table(rows);
  }
  console.log(`proposed non-live stretches: ${proposals.length}`);
  if (proposals.length) {
    const rows = [['#', 'from', 'to', 'length', 'kind', 'why']];
    proposals.forEach((p, i) => rows.push([String(i + 1), clock(p.fromT), clock(p.toT), `${(p.toT - p.fromT).toFixed(1)} s`, p.kind.replace('_', '-'), p.reason]));
    table(rows);
  }
}

function table(rows: string[][]): void {
  const widths = rows[0].map((_, k) => Math.max(...rows.map((r) => r[k].length)));
  for (const r of rows) console.log('  ' + r.map((v, k) => (k === 0 ? v.padStart(widths[k]) : v.padEnd(widths[k]))).join('  ').trimEnd());
}

/** Footage seconds as H:MM:SS.mmm (M:SS.mmm under an hour). */
function clock(s: number): string {
  const ms = Math.round(s * 1000);
  const h = Math.floor(ms / 3_600_000);
  const m = Math.floor(ms / 60_000) % 60;
  const sec = (ms % 60_000) / 1000;
  const tail = `${String(m).padStart(h ? 2 : 1, '0')}:${sec.toFixed(3).padStart(6, '0')}`;
  return h ? `${h}:${tail}` : tail;
}
