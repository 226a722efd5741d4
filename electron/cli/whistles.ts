/**
 * `whistlemark whistles FOOTAGE [--native|--embedded] [--json]`: decodes the footage's
 * audio (16 kHz mono) and lists the referee-whistle candidates the detector finds, in
 * footage time. The same decoder and detector the app uses.
 */
import type { CliCommand } from '../cli.ts';
import type { WhistleCandidate } from '../../engine/audio/index.ts';
import type { DecodeEngine } from '../host/audio/decode.ts';
import { clock, parseFootageArgs, printRows, runCancellable } from './footage-command.ts';
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
    const parsed = parseFootageArgs('whistles', args, usage);
    if (typeof parsed === 'number') return parsed;
    const { file, engine, json } = parsed;
    return runCancellable('whistles', async ({ signal, tell, elapsedS }) => {
      const result = await scanFootageWhistles(file, { engine, signal, onProgress: (s, n) => tell(`scanned ${clock(s)} of sound, ${n} candidates so far`) });
      const found = result.candidates;
      const wallS = elapsedS();
      return () =>
        json
          ? console.log(JSON.stringify({ file, engine: result.engine, sampleRate: SAMPLE_RATE, seconds: result.seconds, candidates: found }, null, 2))
          : printTable(file, result.engine, result.seconds, wallS, found);
    });
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
  printRows(rows);
}
