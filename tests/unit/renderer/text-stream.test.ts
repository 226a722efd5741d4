import { describe, expect, it } from 'vitest';
import { openTextStream, readHead } from '../../../renderer/src/import/text-stream.ts';

// Range semantics per RFC 9110 §14 (bytes=first-last, inclusive); UTF-8 per RFC 3629.
describe('reading opened files', () => {
  const text = 'a,b\n1,2\n3,4\n5,6\n';

  it('asks for a byte range and cuts the head at the last whole line', async () => {
    let asked = '';
    const head = await readHead(async (_u, init) => {
      asked = new Headers(init?.headers).get('Range') ?? '';
      return new Response(text.slice(0, 10), { status: 206 });
    }, 'http://127.0.0.1/f', 10);
    expect(asked).toBe('bytes=0-9');
    expect(head).toBe('a,b\n1,2\n');
  });

  it('keeps only the head when the server ignores Range and sends everything', async () => {
    const head = await readHead(async () => new Response(text, { status: 200 }), 'http://127.0.0.1/f', 10);
    expect(head).toBe('a,b\n1,2\n');
  });

  it('returns a short file whole', async () => {
    expect(await readHead(async () => new Response('x,y\n1,2', { status: 200 }), 'http://127.0.0.1/f', 1024)).toBe('x,y\n1,2');
  });

  it('decodes UTF-8 split across chunks (a 2-byte character cut in half)', async () => {
    const bytes = new TextEncoder().encode('team\nFernhöhe Ost\n');
    const cut = 11; // inside "ö" (0xC3 0xB6): "team" and its newline are 5 bytes, "Fernh" 5 more
    const body = new ReadableStream<Uint8Array>({
      start(c) {
        c.enqueue(bytes.slice(0, cut));
        c.enqueue(bytes.slice(cut));
        c.close();
      },
    });
    let out = '';
    for await (const chunk of await openTextStream(async () => new Response(body), 'http://127.0.0.1/f')) out += chunk;
    expect(out).toBe('team\nFernhöhe Ost\n');
  });

  it('says what to do when the file service refuses', async () => {
    await expect(openTextStream(async () => new Response('', { status: 403, statusText: 'Forbidden' }), 'http://127.0.0.1/f')).rejects.toThrow(/403 Forbidden\. Open the file again/);
  });
});
