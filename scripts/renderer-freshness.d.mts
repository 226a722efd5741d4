export function rendererBuildState(root: string): 'fresh' | 'stale' | 'missing';
