/**
 * Loads the embedded ffmpeg.wasm single-thread core (@ffmpeg/core 0.12.10) in Node.
 *
 * The core is built for a web worker: it reads `self.location.href` once, while starting,
 * to find its folder (../shared/MACHINE.md). We give it that for the duration of the start
 * only and put the globals back, so nothing else in the process sees a fake `self`.
 * The wasm is read and compiled once per process (the 32 MB module takes seconds to
 * compile); each decode gets a fresh instance of it, so an aborted run can never leave
 * state behind for the next.
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
  writeFile(path: string, data: Uint8Array): void;
  mount(type: unknown, opts: Record<string, unknown>, mountpoint: string): void;
  unmount(mountpoint: string): void;
  makedev(major: number, minor: number): number;
  registerDevice(dev: number, ops: Record<string, unknown>): void;
  mkdev(path: string, dev: number): void;
  filesystems: Record<string, { reader?: unknown } & object>;
  ErrnoError: new (errno: number) => Error;
}

type ReceiveInstance = (instance: WebAssembly.Instance, module: WebAssembly.Module) => unknown;
type CoreFactory = (opts: {
  instantiateWasm: (imports: WebAssembly.Imports, receive: ReceiveInstance) => object;
}) => Promise<FfmpegCore>;

let cached: { factory: CoreFactory; module: Promise<WebAssembly.Module>; folderUrl: string } | null = null;

function coreFolder(): string {
  const require = createRequire(import.meta.url);
  // The package exports only its entry points; its "require" entry lives in dist/umd.
  return join(dirname(require.resolve('@ffmpeg/core')), '..', 'esm');
}

export async function loadEmbeddedCore(): Promise<FfmpegCore> {
  if (!cached) {
    const folder = coreFolder();
    const mod = (await import(pathToFileURL(join(folder, 'ffmpeg-core.js')).href)) as { default: CoreFactory };
    const module = WebAssembly.compile(readFileSync(join(folder, 'ffmpeg-core.wasm')));
    cached = { factory: mod.default, module, folderUrl: pathToFileURL(folder + '/').href };
  }
  const module = await cached.module;
  const g = globalThis as Record<string, unknown>;
  const had = { self: Object.getOwnPropertyDescriptor(g, 'self'), location: Object.getOwnPropertyDescriptor(g, 'location') };
  Object.defineProperty(g, 'self', { value: { location: { href: cached.folderUrl } }, configurable: true, writable: true });
  try {
    return await cached.factory({
      // Emscripten's hook for bringing our own instance: return {} now, call back when ready.
      instantiateWasm: (imports, receive) => {
        void WebAssembly.instantiate(module, imports).then((instance) => receive(instance, module));
        return {};
      },
    });
  } finally {
    restore(g, 'self', had.self);
    restore(g, 'location', had.location);
  }
}

function restore(g: Record<string, unknown>, key: string, d: PropertyDescriptor | undefined): void {
  if (d) Object.defineProperty(g, key, d);
  else delete g[key];
}
