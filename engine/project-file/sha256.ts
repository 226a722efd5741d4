/**
 * SHA-256 (FIPS 180-4) through Web Crypto, which Node 20, Electron and Chromium all provide
 * as `crypto.subtle`: no DOM or Node import needed, and native speed.
 *
 *   await sha256Hex(new TextEncoder().encode('abc')) // 'ba7816bf…'
 */
export async function sha256Hex(bytes: Uint8Array): Promise<string> {
  const digest = await crypto.subtle.digest('SHA-256', bytes as Uint8Array<ArrayBuffer>);
  const b = new Uint8Array(digest);
  let s = '';
  for (let i = 0; i < b.length; i++) s += b[i].toString(16).padStart(2, '0');
  return s;
}

export const MIB = 1024 * 1024;

/** Fingerprint from the first and last MiB (the same slice twice when the file is smaller). */
export async function fingerprintFromEnds(size: number, head: Uint8Array, tail: Uint8Array) {
  return { size, headSha256: await sha256Hex(head), tailSha256: await sha256Hex(tail) };
}
