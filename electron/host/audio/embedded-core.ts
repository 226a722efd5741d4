/**
 * The embedded ffmpeg.wasm single-thread core (@ffmpeg/core 0.12.10), compiled once per
 * process: the 32 MB module takes seconds to compile, and each decode's worker
 * (pcm-worker.mjs) instantiates this same module instead of compiling its own.
 */
import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { dirname, join } from 'node:path';

let compiled: Promise<WebAssembly.Module> | null = null;

export function compiledCoreModule(): Promise<WebAssembly.Module> {
  if (!compiled) {
    const require = createRequire(import.meta.url);
    // The package exports only its entry points; its "require" entry lives in dist/umd.
    const wasm = join(dirname(require.resolve('@ffmpeg/core')), '..', 'esm', 'ffmpeg-core.wasm');
    compiled = WebAssembly.compile(readFileSync(wasm));
    compiled.catch(() => (compiled = null));
  }
  return compiled;
}
