// Decodes one file's audio to mono float32 PCM with the single-thread ffmpeg.wasm core,
// inside a worker thread, posting the PCM bytes to the parent as ffmpeg writes them.
//
// Why a worker: core.exec() blocks its thread for the whole decode (a minute or more for
// a match), and the core wants Web Worker globals (self, location) that must not leak into
// the host process. Why plain JavaScript: Node 20 cannot load TypeScript in a worker
// without a loader; this file only moves bytes, the parent (decode-embedded.ts) does the rest.
//
// No whole-file copies: the footage is mounted with WORKERFS over a file-backed stand-in
// for a Blob (slices read with fs.readSync), and ffmpeg writes into a character device
// whose write() hands each block on.
import { parentPort, workerData } from 'node:worker_threads';
import { closeSync, fstatSync, openSync, readFileSync, readSync } from 'node:fs';
import { createRequire } from 'node:module';
import { basename, dirname, join } from 'node:path';
import { pathToFileURL } from 'node:url';

const require = createRequire(import.meta.url);

/** A Blob look-alike over a byte range of an open file: WORKERFS asks only size and slice. */
class FileSlice {
  constructor(fd, start, size) {
    this.fd = fd;
    this.start = start;
    this.size = size;
  }
  slice(from, to) {
    return new FileSlice(this.fd, this.start + from, Math.max(0, Math.min(this.size, to) - from));
  }
}

/** Serves WORKERFS reads from the file on disk. */
const diskReader = {
  readAsArrayBuffer(s) {
    const buf = new Uint8Array(s.size);
    let done = 0;
    while (done < s.size) {
      const n = readSync(s.fd, buf, done, s.size - done, s.start + done);
      if (n === 0) break;
      done += n;
    }
    return buf.buffer;
  },
};

async function run({ file, args, input, wasmModule }) {
  // The core's "require" entry lives in dist/umd; the ES module build sits beside it in dist/esm.
  const folder = join(dirname(require.resolve('@ffmpeg/core')), '..', 'esm');
  globalThis.self = { location: { href: pathToFileURL(folder + '/').href } };
  const { default: createCore } = await import(pathToFileURL(join(folder, 'ffmpeg-core.js')).href);
  const core = await createCore({
    // Emscripten's hook for bringing our own instance of the module the parent compiled.
    instantiateWasm(imports, receive) {
      WebAssembly.instantiate(wasmModule, imports).then((instance) => receive(instance, wasmModule));
      return {};
    },
  });
  const log = [];
  core.setLogger((e) => log.push(e.message));
  const FS = core.FS;
  const name = basename(file).replace(/[^\w.-]/g, '_') || 'input';
  const fd = openSync(file, 'r');
  try {
    FS.mkdir('/footage');
    if (input === 'copy') {
      FS.writeFile(`/footage/${name}`, readFileSync(file));
    } else {
      FS.filesystems.WORKERFS.reader = diskReader;
      FS.mount(FS.filesystems.WORKERFS, { blobs: [{ name, data: new FileSlice(fd, 0, fstatSync(fd).size) }] }, '/footage');
    }
    const dev = FS.makedev(64, 0);
    FS.registerDevice(dev, {
      open() {},
      close() {},
      write(_stream, buffer, offset, length) {
        const bytes = buffer.slice(offset, offset + length).buffer;
        parentPort.postMessage({ type: 'pcm', bytes }, [bytes]);
        return length;
      },
    });
    FS.mkdev('/pcm-out', dev);
    const code = core.exec('-hide_banner', '-v', 'error', ...args.map((a) => (a === '{input}' ? `/footage/${name}` : a === '{output}' ? '/pcm-out' : a)));
    parentPort.postMessage({ type: 'done', code, log: log.slice(-20) });
  } finally {
    closeSync(fd);
  }
}

run(workerData).catch((err) => parentPort.postMessage({ type: 'failed', message: String(err?.stack ?? err) }));
