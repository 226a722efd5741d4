import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { readHead, readTextChunks } from '../../../electron/host/text-stream.ts';

const dir = mkdtempSync(join(tmpdir(), 'wm-text-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

async function collect(path: string, chunkBytes: number): Promise<string[]> {
  const out: string[] = [];
  for await (const c of readTextChunks(path, { chunkBytes })) out.push(c);
  return out;
}

describe('readTextChunks: UTF-8 across chunk borders (RFC 3629 multi-byte sequences)', () => {
  // 2-, 3- and 4-byte UTF-8 characters (RFC 3629): é, €, 𝄞 (a surrogate pair in UTF-16).
  const text = 'name,note\nAmélie,5€\nKłos,𝄞 clef\n'.repeat(20);
  const path = join(dir, 'utf8.csv');
  writeFileSync(path, text, 'utf8');

  for (const size of [1, 2, 3, 5, 7, 64]) {
    it(`decodes the same text with ${size}-byte reads`, async () => {
      const chunks = await collect(path, size);
      expect(chunks.join('')).toBe(text);
      // No replacement characters: no sequence was cut in two.
      expect(chunks.some((c) => c.includes('\ufffd'))).toBe(false);
    });
  }

  it('strips a byte-order mark (the UTF-8 BOM EF BB BF, Unicode standard)', async () => {
    const p = join(dir, 'bom.csv');
    writeFileSync(p, Buffer.concat([Buffer.from([0xef, 0xbb, 0xbf]), Buffer.from('a,b\n1,2\n')]));
    expect((await collect(p, 2)).join('')).toBe('a,b\n1,2\n');
    expect(await readHead(p)).toBe('a,b\n1,2\n');
  });

  it('reports bytes read', async () => {
    let bytes = 0;
    for await (const _ of readTextChunks(path, { chunkBytes: 100, onBytes: (n) => (bytes += n) })) void _;
    expect(bytes).toBe(Buffer.byteLength(text, 'utf8'));
  });

  it('stops with an AbortError when aborted', async () => {
    const ctl = new AbortController();
    const err = await (async () => {
      for await (const _ of readTextChunks(path, { chunkBytes: 16, signal: ctl.signal })) ctl.abort();
    })().catch((e) => e);
    expect(err?.name).toBe('AbortError');
  });

  it('readHead returns at most the first bytes and drops a character cut at the end', async () => {
    const head = await readHead(path, 13); // "name,note\nAm" is 12 bytes; byte 13 is the first half of é
    expect(head).toBe('name,note\nAm');
    expect(await readHead(path)).toBe(text);
  });

  it('a missing file rejects with ENOENT', async () => {
    await expect(readHead(join(dir, 'nope.csv'))).rejects.toMatchObject({ code: 'ENOENT' });
    await expect(collect(join(dir, 'nope.csv'), 10)).rejects.toMatchObject({ code: 'ENOENT' });
  });
});
