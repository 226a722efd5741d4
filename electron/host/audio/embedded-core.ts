/**
 * Loads the embedded ffmpeg.wasm single-thread core (@ffmpeg/core 0.12.10) in Node.
 *
 * The core is built for a web worker: it reads `self.location.href` once, while starting,
 * to find its folder (../shared/MACHINE.md). We give it that for the duration of the start
 * only and put the globals back, so nothing else in the process sees a fake `self`.
 * The wasm bytes are read once and reused; each decode gets a fresh core instance, so an
 * aborted run can never leave state behind for the next.
 */
import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { dirname, join } from 'node:path';
import { pathToFileURL } from 'node:url';

/** The parts of the Emscripten module this project uses. */
export interface FfmpegCore {
  FS: EmscriptenFs;
  exec(...args: string[]): number;
  setLogger(logger: (entry: { type: string; message: string }) => void): void;
}

export interface EmscriptenFs {
  mkdir(path: string): void;
  mount(type: unknown, opts: Record<string, unknown>, mountpoint: string): void;
  unmount(mountpoint: string): void;
  makedev(major: number, minor: number): number;
  registerDevice(dev: number, ops: Record<string, unknown>): void;
  mkdev(path: string, dev: number): void;
  filesystems: Record<string, { reader?: unknown } & object>;
  ErrnoError: new (errno: number) => Error;
}

type CoreFactory = (opts: { wasmBinary: Uint8Array }) => Promise<FfmpegCore>;

let cached: { factory: CoreFactory; wasm: Uint8Array; folderUrl: string } | null = null;

function coreFolder(): string {
  const require = createRequire(import.meta.url);
  // The package exports only its entry points; its "require" entry lives in dist/umd.
  return join(dirname(require.resolve('@ffmpeg/core')), '..', 'esm');
}

export async function loadEmbeddedCore(): Promise<FfmpegCore> {
  if (!cached) {
    const folder = coreFolder();
    const mod = (await import(pathToFileURL(join(folder, 'ffmpeg-core.js')).href)) as { default: CoreFactory };
    cached = { factory: mod.default, wasm: readFileSync(join(folder, 'ffmpeg-core.wasm')), folderUrl: pathToFileURL(folder + '/').href };
  }
  const g = globalThis as Record<string, unknown>;
  const had = { self: Object.getOwnPropertyDescriptor(g, 'self'), location: Object.getOwnPropertyDescriptor(g, 'location') };
  Object.defineProperty(g, 'self', { value: { location: { href: cached.folderUrl } }, configurable: true, writable: true });
  try {
    return await cached.factory({ wasmBinary: cached.wasm });
  } finally {
    restore(g, 'self', had.self);
    restore(g, 'location', had.location);
  }
}

function restore(g: Record<string, unknown>, key: string, d: PropertyDescriptor | undefined): void {
  if (d) Object.defineProperty(g, key, d);
  else delete g[key];
}
