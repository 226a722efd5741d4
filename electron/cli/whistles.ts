/**
 * `whistlemark whistles FOOTAGE [--native|--embedded] [--json]`: decodes the footage's
 * audio (16 kHz mono) and lists the referee-whistle candidates the detector finds, in
 * footage time. The same decoder and detector the app uses.
 */
import type { CliCommand } from '../cli.ts';
import type { WhistleCandidate } from '../../engine/audio/index.ts';
import type { DecodeEngine } from '../host/audio/decode.ts';
import { SCAN_SAMPLE_RATE as SAMPLE_RATE, scanFootageWhistles } from '../host/audio/scan-footage.ts';

const usage = `usage: whistlemark whistles FOOTAGE [--native | --embedded] [--json]

Scans the sound of FOOTAGE for referee-whistle candidates (a sustained narrow tone in
2–4.5 kHz with its harmonic) and prints each one's footage time, duration, single or
double blast, strength above the band's noise level and fundamental frequency.
  --native     decode with ffmpeg from PATH (the default when it is there; fastest)
  --embedded   decode with the built-in ffmpeg.wasm (the default otherwise)
  --json       print the candidates as JSON`;

export const command: CliCommand = {
  summary: 'list referee-whistle candidates in a footage file\'s sound',
  usage,
  async run(args) {
    const unknown = args.filter((a) => a.startsWith('--') && !['--native', '--embedded', '--json'].includes(a));
    const files = args.filter((a) => !a.startsWith('--'));
    if (unknown.length || files.length !== 1 || (args.includes('--native') && args.includes('--embedded'))) {
      if (unknown.length) console.error(`whistlemark whistles: unknown option ${unknown[0]}.`);
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
    try {
      const result = await scanFootageWhistles(file, {
        engine,
        signal: ctl.signal,
        onProgress: (s, n) => {
          const now = performance.now();
          if (process.stderr.isTTY && now - lastReport > 1000) {
            lastReport = now;
            process.stderr.write(`\rscanned ${clock(s)} of sound, ${n} candidates so far`);
          }
        },
      });
      const found = result.candidates;
      if (process.stderr.isTTY) process.stderr.write('\r\x1b[K');
      const wallS = (performance.now() - started) / 1000;
      if (json) {
        console.log(JSON.stringify({ file, engine: result.engine, sampleRate: SAMPLE_RATE, seconds: result.seconds, candidates: found }, null, 2));
      } else {
        printTable(file, result.engine, result.seconds, wallS, found);
      }
      return 0;
    } catch (err) {
      if (ctl.signal.aborted) {
        console.error('\nwhistlemark whistles: cancelled.');
        return 130;
      }
      throw err;
    } finally {
      process.off('SIGINT', onSigint);
    }
  },
};

function printTable(file: string, engine: DecodeEngine, seconds: number, wallS: number, found: WhistleCandidate[]): void {
  const how = engine === 'native' ? 'native ffmpeg' : 'embedded ffmpeg.wasm';
  console.log(`${file}: ${found.length} whistle candidate${found.length === 1 ? '' : 's'} in ${clock(seconds)} of sound`);
  console.log(`(decoded with ${how} at ${SAMPLE_RATE / 1000} kHz; scan took ${wallS.toFixed(1)} s, ${(seconds / Math.max(wallS, 1e-3)).toFixed(0)}× real time)`);
  if (!found.length) return;
  const rows = [['#', 'footage time', 'duration', 'blasts', 'strength', 'fundamental']];
  found.forEach((c, i) =>
    rows.push([
      String(i + 1),
      clock(c.onset),
      `${c.duration.toFixed(2)} s`,
      c.pattern === 'multiple' ? `multiple (${c.blasts.length})` : c.pattern,
      `${c.strengthDb.toFixed(1)} dB`,
      `${Math.round(c.fundamentalHz)} Hz`,
    ]),
  );
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
