// Child process for project-file.test.ts: saves a real match project file over the given
// path in small slices, says "writing" after the first slice is on disk, then slows down
// and waits to be killed in the middle of the save.
import { writeProjectFile } from '../../engine/project-file/index.ts';
import { saveProjectFile } from '../../electron/host/project-file.ts';
import { smallProject } from './project-fixture.ts';

const [path] = process.argv.slice(2);
const bytes = await writeProjectFile(smallProject('the new version'), { writtenBy: 'child', databaseVersion: 3, chunkLevel: 0 });
let first = true;
await saveProjectFile(path, bytes, {
  overwrite: true,
  sliceBytes: 4096,
  onProgress: async () => {
    if (first) process.stdout.write('writing\n');
    first = false;
    await new Promise((r) => setTimeout(r, 200));
  },
});
