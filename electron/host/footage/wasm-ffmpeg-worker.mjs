// Runs one ffmpeg command in the single-thread ffmpeg.wasm core, inside a worker thread.
//
// Why a worker and why plain JavaScript: the core expects a Web Worker, so it needs a few
// globals (self, importScripts, location, FileReaderSync) that must not leak into the
// host's own process; a worker thread keeps them to itself. It is .mjs because Node 20
// cannot load TypeScript in a worker without a loader, and this file only moves bytes;
// all parsing is in TypeScript (ffmpeg-log.ts).
//
// The input file is never copied into wasm memory: it is mounted through WORKERFS with a
// file-backed stand-in for a Blob whose slices are read with fs.readSync on demand.
import { parentPort, workerData } from 'node:worker_threads';
import { openSync, readSync, closeSync, fstatSync, readFileSync } from 'node:fs';
import { pathToFileURL } from 'node:url';
import { createRequire } from 'node:module';

const require = createRequire(import.meta.url);

/** A Blob look-alike over a byte range of an open file descriptor. */
class FileSlice {
  constructor(fd, start, end) {
    this.fd = fd;
    this.start = start;
    this.size = Math.max(0, end - start);
  }
  slice(start = 0, end = this.size) {
    const s = this.start + Math.min(start, this.size);
    const e = this.start + Math.min(end, this.size);
    return new FileSlice(this.fd, s, e);
  }
}

/** What WORKERFS calls to read a slice; here a plain synchronous positional read. */
class NodeFileReaderSync {
  readAsArrayBuffer(slice) {
    const buf = Buffer.alloc(slice.size);
    let done = 0;
    while (done < slice.size) {
      const n = readSync(slice.fd, buf, done, slice.size - done, slice.start + done);
      if (n === 0) break;
      done += n;
    }
    return buf.buffer.slice(buf.byteOffset, buf.byteOffset + done);
  }
}

async function run({ inputPath, args, outputName, outputBinary, wasmModule }) {
  const corePath = require.resolve('@ffmpeg/core');
  const wasmPath = corePath.replace(/ffmpeg-core\.js$/, 'ffmpeg-core.wasm');
  globalThis.self = globalThis;
  globalThis.importScripts = () => {};
  globalThis.location = { href: pathToFileURL(corePath).href };
  globalThis.FileReaderSync = NodeFileReaderSync;

  const { default: createCore } = await import(pathToFileURL(corePath).href);
  // A module compiled once by the parent saves compiling 32 MB of wasm on every probe.
  const core = await createCore(
    wasmModule
      ? {
          instantiateWasm(imports, receive) {
            WebAssembly.instantiate(wasmModule, imports).then((instance) => receive(instance, wasmModule));
            return {};
          },
        }
      : { wasmBinary: readFileSync(wasmPath) },
  );
  const log = [];
  core.setLogger(({ type, message }) => log.push(`${type === 'stdout' ? 'O' : 'E'} ${message}`));

  const fd = openSync(inputPath, 'r');
  try {
    const size = fstatSync(fd).size;
    core.FS.mkdir('/in');
    core.FS.mount(core.FS.filesystems.WORKERFS, { blobs: [{ name: 'input', data: new FileSlice(fd, 0, size) }] }, '/in');
    const code = core.exec(...args.map((a) => (a === '{input}' ? '/in/input' : a)));
    let output = null;
    if (outputName) {
      try {
        // A binary output (a remuxed MP4) comes back as bytes, a text one (framecrc) as text.
        output = outputBinary ? null : core.FS.readFile(outputName, { encoding: 'utf8' });
        if (outputBinary) return { code, log, output: null, binary: core.FS.readFile(outputName) };
      } catch {
        output = null;
      }
    }
    return { code, log, output };
  } finally {
    closeSync(fd);
  }
}

run(workerData).then(
  (result) => parentPort.postMessage({ ok: true, result }),
  (error) => parentPort.postMessage({ ok: false, error: String(error && error.stack ? error.stack : error) }),
);
