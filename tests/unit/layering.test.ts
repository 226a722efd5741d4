import { readdirSync, readFileSync, statSync } from 'node:fs';
import { join, relative } from 'node:path';
import { describe, expect, it } from 'vitest';

// The import rule of ../shared/DESIGN.md: engine/ and shared-types/ are "common" code and
// may import nothing that ties them to the DOM, Node or Electron, nor any other room.
const root = new URL('../..', import.meta.url).pathname;

function tsFiles(dir: string): string[] {
  const out: string[] = [];
  for (const name of readdirSync(dir)) {
    const p = join(dir, name);
    if (statSync(p).isDirectory()) out.push(...tsFiles(p));
    else if (/\.tsx?$/.test(name)) out.push(p);
  }
  return out;
}

const importRe = /(?:import|export)\s[^'"]*?from\s+['"]([^'"]+)['"]|import\(\s*['"]([^'"]+)['"]\s*\)|require\(\s*['"]([^'"]+)['"]\s*\)/g;
const forbiddenModules = /^(node:|electron$|electron\/|fs$|path$|os$|child_process$|worker_threads$|http$|react|react-dom|dexie|pixi\.js)/;
const forbiddenGlobals = /\b(window|document|navigator|localStorage|indexedDB|process\.)\b/;

for (const room of ['engine', 'shared-types']) {
  describe(`${room}/ stays common code`, () => {
    const files = tsFiles(join(root, room));
    it('has files to check', () => expect(files.length).toBeGreaterThan(0));
    for (const file of files) {
      const rel = relative(root, file);
      it(`${rel} imports nothing platform-bound`, () => {
        const src = readFileSync(file, 'utf8');
        const bad: string[] = [];
        for (const m of src.matchAll(importRe)) {
          const spec = m[1] ?? m[2] ?? m[3];
          if (forbiddenModules.test(spec)) bad.push(spec);
          if (spec.startsWith('.')) {
            const target = relative(root, join(file, '..', spec));
            const allowed = target.startsWith(room + '/') || (room === 'engine' && target.startsWith('shared-types/'));
            if (!allowed) bad.push(`${spec} (outside ${room}/)`);
          }
        }
        const code = src.replace(/\/\*[\s\S]*?\*\//g, '').replace(/\/\/.*$/gm, '');
        const g = code.match(forbiddenGlobals);
        if (g) bad.push(`global ${g[0]}`);
        expect(bad).toEqual([]);
      });
    }
  });
}
