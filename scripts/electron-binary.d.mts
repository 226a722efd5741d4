export type ElectronBinary = { found: true; binary: string; version: string } | { found: false; reason: string };
export function findElectronBinary(projectRoot: string): ElectronBinary;
export function buildElectronBundle(projectRoot: string, outDir: string, opts?: { bundlePackages?: boolean }): Promise<string>;
