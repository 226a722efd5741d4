/**
 * What the footage scanning commands (`whistles`, `cuts`) share: their arguments
 * (FOOTAGE [--native | --embedded] [--json]), Ctrl-C as cancel, a throttled progress line
 * on a terminal, and the plain-text table and clock they print.
 */
import type { DecodeEngine } from '../host/audio/decode.ts';

export interface FootageArgs {
  file: string;
  engine: DecodeEngine | 'auto';
  json: boolean;
}

/** The parsed arguments, or the exit code after printing what was wrong and the usage. */
export function parseFootageArgs(command: string, args: string[], usage: string): FootageArgs | number {
  const unknown = args.filter((a) => a.startsWith('--') && !['--native', '--embedded', '--json'].includes(a));
  const files = args.filter((a) => !a.startsWith('--'));
  if (unknown.length || files.length !== 1 || (args.includes('--native') && args.includes('--embedded'))) {
    if (unknown.length) console.error(`whistlemark ${command}: unknown option ${unknown[0]}.`);
    console.error(usage);
    return 2;
  }
  const engine = args.includes('--native') ? 'native' : args.includes('--embedded') ? 'embedded' : 'auto';
  return { file: files[0], engine, json: args.includes('--json') };
}

export interface ScanRun {
  signal: AbortSignal;
  /** Shows a progress line on a terminal, at most once a second. */
  tell(text: string): void;
  /** Seconds since the run started. */
  elapsedS(): number;
}

/** Runs a scan that Ctrl-C cancels (exit 130); clears the progress line before printing. */
export async function runCancellable(command: string, body: (run: ScanRun) => Promise<() => void>): Promise<number> {
  const ctl = new AbortController();
  const onSigint = () => ctl.abort(Object.assign(new Error('cancelled (Ctrl-C)'), { name: 'AbortError' }));
  process.once('SIGINT', onSigint);
  const started = performance.now();
  let lastReport = started;
  const run: ScanRun = {
    signal: ctl.signal,
    tell(text) {
      const now = performance.now();
      if (process.stderr.isTTY && now - lastReport > 1000) {
        lastReport = now;
        process.stderr.write(`\r${text}\x1b[K`);
      }
    },
    elapsedS: () => (performance.now() - started) / 1000,
  };
  try {
    const print = await body(run);
    if (process.stderr.isTTY) process.stderr.write('\r\x1b[K');
    print();
    return 0;
  } catch (err) {
    if (ctl.signal.aborted) {
      console.error(`\nwhistlemark ${command}: cancelled.`);
      return 130;
    }
    throw err;
  } finally {
    process.off('SIGINT', onSigint);
  }
}

/** Prints rows as aligned columns (first column right-aligned). */
export function printRows(rows: string[][]): void {
  const widths = rows[0].map((_, k) => Math.max(...rows.map((r) => r[k].length)));
  for (const r of rows) console.log('  ' + r.map((v, k) => (k === 0 ? v.padStart(widths[k]) : v.padEnd(widths[k]))).join('  ').trimEnd());
}

/** Footage seconds as H:MM:SS.mmm (M:SS.mmm under an hour). */
export function clock(s: number): string {
  const ms = Math.round(s * 1000);
  const h = Math.floor(ms / 3_600_000);
  const m = Math.floor(ms / 60_000) % 60;
  const sec = (ms % 60_000) / 1000;
  const tail = `${String(m).padStart(h ? 2 : 1, '0')}:${sec.toFixed(3).padStart(6, '0')}`;
  return h ? `${h}:${tail}` : tail;
}
