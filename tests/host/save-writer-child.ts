// Child process for atomic-save.test.ts: starts an atomic save that never finishes, says
// "writing" once bytes are on disk, and waits to be killed mid-write.
import { saveAtomic } from '../../electron/host/atomic-save.ts';

const [directory, name] = process.argv.slice(2);
async function* endless() {
  const chunk = new Uint8Array(64 * 1024).fill(0x41);
  yield chunk;
  process.stdout.write('writing\n');
  for (;;) {
    await new Promise((r) => setTimeout(r, 50));
    yield chunk;
  }
}
await saveAtomic({ directory, name, bytes: endless(), overwrite: true });
