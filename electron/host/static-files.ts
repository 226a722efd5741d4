/**
 * Resolves a request path to a file inside the built renderer folder, refusing anything
 * that could leave it (.., encoded slashes, backslashes, NUL, dot files). Both hosts use it.
 *
 * Example: resolveInside('/app/dist/renderer', '/assets/index.js') → '/app/dist/renderer/assets/index.js'
 *          resolveInside('/app/dist/renderer', '/..%2fsecret') → null
 */
import { extname, resolve, sep } from 'node:path';
import { contentTypeFor } from './byte-range.ts';

export function resolveInside(root: string, pathname: string): string | null {
  let rel: string;
  try {
    rel = decodeURIComponent(pathname);
  } catch {
    return null;
  }
  if (rel.includes('\0') || rel.includes('\\')) return null;
  if (rel.split('/').some((seg) => seg.startsWith('.'))) return null;
  if (rel === '/' || rel === '') rel = '/index.html';
  const base = resolve(root);
  const file = resolve(base, '.' + (rel.startsWith('/') ? rel : '/' + rel));
  return file.startsWith(base + sep) ? file : null;
}

/** Content type of a built renderer file (scripts, styles, wasm, maps, fonts). */
export function rendererContentType(file: string): string {
  const types: Record<string, string> = {
    '.html': 'text/html; charset=utf-8', '.js': 'text/javascript; charset=utf-8', '.mjs': 'text/javascript; charset=utf-8',
    '.css': 'text/css; charset=utf-8', '.wasm': 'application/wasm', '.map': 'application/json', '.svg': 'image/svg+xml',
    '.ico': 'image/x-icon', '.woff2': 'font/woff2', '.woff': 'font/woff', '.ttf': 'font/ttf',
  };
  return types[extname(file).toLowerCase()] ?? contentTypeFor(file);
}
