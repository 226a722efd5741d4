/**
 * `whistlemark export --project FILE --reel NAME --out DIR [--replace]`: the Reels screen's
 * export without a window. Serves the built renderer on the loopback host (building it
 * first when dist/renderer is missing or older than its sources), drives it headless in
 * Debian's Chromium with a fresh temporary profile, opens the project file into that
 * page's database and runs the same export queue (renderer/src/export-clips/run-export.ts).
 * Ctrl+C cancels: the clip being encoded is never written (the host saves atomically).
 */
import { spawnSync } from 'node:child_process';
import { existsSync } from 'node:fs';
import { mkdir, mkdtemp, rm, stat } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import type { CliCommand } from '../cli.ts';
import { rendererBuildState } from '../../scripts/renderer-freshness.mjs';

const usage = `usage: whistlemark export --project FILE.wmatch --reel NAME --out DIR [--replace]

Exports one reel of a match project: an MP4 and WebVTT captions per clip (overlays as the
clip chose them), the whole reel as one MP4 when it has several clips, and the reel's CSV
and JSON sidecars, all into DIR (created if needed).
  --project FILE   the match project file (saved by the app or by "whistlemark sync --project")
  --reel NAME      the reel's title (case-insensitive when no exact match)
  --out DIR        where the files go
  --replace        replace files of the same names in DIR (otherwise nothing is overwritten)
Ctrl+C cancels; files already finished stay, the clip being encoded is not written.`;

class UserError extends Error {}

interface ExportArgs {
  project: string;
  reel: string;
  out: string;
  replace: boolean;
}

function parseArgs(args: string[]): ExportArgs {
  const out: Partial<ExportArgs> = { replace: false };
  for (let i = 0; i < args.length; i++) {
    const a = args[i];
    if (a === '--replace') out.replace = true;
    else if (a === '--project' || a === '--reel' || a === '--out') {
      const v = args[++i];
      if (v === undefined || v.startsWith('--')) throw new Error(`${a} needs a value`);
      out[a.slice(2) as 'project' | 'reel' | 'out'] = v;
    } else throw new Error(`unknown argument "${a}"`);
  }
  for (const k of ['project', 'reel', 'out'] as const) if (!out[k]) throw new Error(`--${k} is required`);
  return out as ExportArgs;
}

const root = fileURLToPath(new URL('../..', import.meta.url));

/** Same rule as `npm start` (scripts/renderer-freshness.mjs): rebuild when missing or older than any source. */
function buildRendererIfStale(say: (line: string) => void): void {
  const state = rendererBuildState(root);
  if (state === 'fresh') return;
  say(state === 'stale' ? 'renderer sources changed since the last build: building with vite…' : 'dist/renderer is missing: building with vite…');
  const r = spawnSync('npx', ['vite', 'build', '--config', 'build/vite.config.ts', '--logLevel', 'warn'], { cwd: root, stdio: ['ignore', 2, 2] });
  if (r.status !== 0) throw new UserError('the renderer build failed (see above); fix the error and run the export again.');
}

function clock(s: number): string {
  const m = Math.floor(s / 60);
  return `${m}:${String(Math.round(s - m * 60)).padStart(2, '0')}`;
}

export const command: CliCommand = {
  summary: 'export a reel of a match project (MP4 per clip, captions, sidecars) without a window',
  usage,
  async run(args) {
    let opts: ExportArgs;
    try {
      opts = parseArgs(args);
    } catch (e) {
      console.error(`whistlemark export: ${(e as Error).message}\n\n${usage}`);
      return 2;
    }
    try {
      return await exportReel(opts);
    } catch (e) {
      if (e instanceof UserError) {
        console.error(`whistlemark export: ${e.message}`);
        return 1;
      }
      throw e;
    }
  },
};

async function exportReel(opts: ExportArgs): Promise<number> {
  const say = (line: string) => process.stderr.write(`${line}\n`);
  const projectPath = resolve(opts.project);
  const info = await stat(projectPath).catch(() => null);
  if (!info?.isFile()) throw new UserError(`cannot read the project file ${opts.project}: no such file. Check the path.`);
  const outDir = resolve(opts.out);
  const outInfo = await stat(outDir).catch(() => null);
  if (outInfo && !outInfo.isDirectory()) throw new UserError(`--out ${opts.out} is a file, not a folder. Name a folder.`);

  buildRendererIfStale(say);
  // Loaded here so `whistlemark help` never pays for the browser driver.
  const [{ startBrowserHost }, { chromium }, { CHROMIUM_ARGS, CHROMIUM_PATH, chromiumEnv }] = await Promise.all([
    import('../serve.ts'),
    import('playwright-core'),
    import('../../build/local-chromium.ts'),
  ]);
  if (!existsSync(CHROMIUM_PATH)) throw new UserError(`the export runs in Chromium, and ${CHROMIUM_PATH} is not there. Install it (apt-get install chromium).`);
  const scratch = await mkdtemp(join(tmpdir(), 'wm-export-'));
  const host = await startBrowserHost({ rendererDir: join(root, 'dist', 'renderer'), openBrowser: false, log: () => {} });
  let context: Awaited<ReturnType<typeof chromium.launchPersistentContext>> | undefined;
  let cancelled = false;
  let cancelPage: (() => Promise<void>) | undefined;
  const onSigint = () => {
    if (cancelled) return;
    cancelled = true;
    say('\ncancelling… (the clip being encoded will not be written)');
    void cancelPage?.();
  };
  process.on('SIGINT', onSigint);
  try {
    context = await chromium.launchPersistentContext(join(scratch, 'profile'), {
      executablePath: CHROMIUM_PATH,
      headless: true,
      args: CHROMIUM_ARGS,
      env: chromiumEnv(join(scratch, 'home')),
    });
    const page = context.pages()[0] ?? (await context.newPage());
    const pageErrors: string[] = [];
    page.on('pageerror', (e) => pageErrors.push(e.message));
    const origin = new URL(host.url).origin;
    // Everything stays on this machine: refuse any request that is not to the local host.
    await page.route('**/*', (r) => (r.request().url().startsWith(origin) || /^(data|blob):/.test(r.request().url()) ? r.continue() : r.abort()));
    const u = new URL(host.url);
    u.hash = 'cli-export';
    await page.goto(u.href);
    await page.waitForFunction(() => document.body.dataset.cliExport === 'ready' || !!document.querySelector('.boot-error'), undefined, { timeout: 60_000 });
    const bootError = await page.locator('.boot-error').textContent().catch(() => null);
    if (bootError) throw new UserError(`the export page could not start: ${bootError}`);
    cancelPage = () => page.evaluate(() => (window as any).whistlemarkCli.cancel()).catch(() => {});

    type Api = import('../../renderer/src/export-clips/cli-page.ts').CliExportApi;
    const opened = await page.evaluate((p) => ((window as any).whistlemarkCli as Api).open(p), projectPath).catch((e: Error) => {
      throw new UserError(`${opts.project}: cannot open it as a match project (${e.message.replace(/^page\.evaluate: (Error: )?/, '').split('\n')[0]}).`);
    });
    const bad = opened.footage.filter((f) => f.state !== 'found');
    if (bad.length) {
      throw new UserError(
        bad.map((f) => (f.state === 'missing' ? `footage file ${f.path} is missing (${f.detail}).` : `footage file ${f.detail}.`)).join('\n') +
          '\nPut the recording back at that path, or open the project in Whistlemark, relink the footage and save the project, then export again.',
      );
    }
    const plan = await page.evaluate(([id, reel]) => ((window as any).whistlemarkCli as Api).plan(id, reel), [opened.projectId, opts.reel] as const).catch((e: Error) => {
      throw new UserError(e.message.replace(/^page\.evaluate: (Error: )?/, '').split('\n')[0]);
    });
    if (plan.problem) throw new UserError(`${opts.project}: ${plan.problem}`);
    const files = plan.files!;
    const clips = plan.clips!;
    if (!opts.replace) {
      const taken = files.filter((f) => existsSync(join(outDir, f)));
      if (taken.length) throw new UserError(`${outDir} already holds ${taken.join(', ')}. Choose another --out folder, move them away, or add --replace to overwrite them.`);
    }
    await mkdir(outDir, { recursive: true });
    const totalS = clips.reduce((s, c) => s + c.durationS, 0);
    say(`exporting reel "${opts.reel}" of "${opened.title}": ${clips.length} clip${clips.length === 1 ? '' : 's'}, ${clock(totalS)} of footage, to ${outDir}`);
    const mp4s = files.filter((f) => f.endsWith('.mp4'));
    let lastLine = 0;
    await page.exposeFunction('wmCliProgress', (f: number, left: number | null, doing: string) => {
      const now = Date.now();
      if (now - lastLine < 500 && f < 1) return;
      lastLine = now;
      const n = Math.min(clips.length, Math.max(1, mp4s.indexOf(doing) + 1));
      say(`clip ${n}/${clips.length}  ${(f * 100).toFixed(0).padStart(3)} %  ${left == null ? 'estimating time left' : `${clock(left)} left`}  ${doing}`);
    });
    if (cancelled) {
      say('cancelled before the export started; nothing was written.');
      return 130;
    }
    const result = await page.evaluate(([id, reel, dir, replace]) => ((window as any).whistlemarkCli as Api).run(id, reel, dir, replace), [opened.projectId, plan.reelId!, outDir, opts.replace] as const);
    if (result.state === 'cancelled' || cancelled) {
      say(`cancelled. Finished files kept in ${outDir}: ${result.outputs.length ? result.outputs.join(', ') : 'none'}.`);
      return 130;
    }
    if (result.state !== 'done') throw new UserError(`the export failed: ${result.message}${pageErrors.length ? `\n(page errors: ${pageErrors.join('; ')})` : ''}`);
    say(result.message);
    for (const f of result.outputs) console.log(join(outDir, f));
    return 0;
  } finally {
    process.off('SIGINT', onSigint);
    await context?.close().catch(() => {});
    await host.close().catch(() => {});
    await rm(scratch, { recursive: true, force: true }).catch(() => {});
  }
}
