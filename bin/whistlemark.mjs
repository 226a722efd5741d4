#!/usr/bin/env node
// Command-line entry: runs electron/cli.ts through tsx, so the CLI uses the same
// TypeScript sources as the app without a separate build.
import { register } from 'tsx/esm/api';

register();
const { main } = await import('../electron/cli.ts');
process.exitCode = await main(process.argv.slice(2));
