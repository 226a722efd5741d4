/**
 * Debian's Chromium for browser benchmarks: headless, no outside lookups, caches and
 * crash dumps under a folder of the run's own (see ../shared/MACHINE.md).
 */
import { join } from 'node:path';
import { chromium, type Browser } from 'playwright-core';

export const CHROMIUM_ARGS = [
  '--no-sandbox',
  '--disable-quic',
  '--no-first-run',
  '--disable-background-networking',
  '--disable-component-update',
  '--disable-sync',
  '--host-resolver-rules=MAP * ~NOTFOUND , EXCLUDE 127.0.0.1',
];

/** `await launchLocalChromium('/tmp/run/home')` -> a headless Browser whose HOME is that folder. */
export function launchLocalChromium(home: string): Promise<Browser> {
  return chromium.launch({
    executablePath: '/usr/bin/chromium',
    headless: true,
    args: CHROMIUM_ARGS,
    env: { ...process.env, HOME: home, XDG_CONFIG_HOME: join(home, '.config'), XDG_CACHE_HOME: join(home, '.cache') },
  });
}
