import { defineConfig } from 'vitest/config';

// End-to-end tests: the built renderer in Debian Chromium against the browser host.
export default defineConfig({
  test: {
    root: new URL('..', import.meta.url).pathname,
    include: ['tests/e2e/**/*.e2e.test.ts'],
    testTimeout: 180_000,
    hookTimeout: 300_000,
    fileParallelism: false,
    pool: 'forks',
  },
});
