export * from './cut-types.ts';
export * from './frame-difference.ts';
export * from './cut-detector.ts';
export * from './scan.ts';
export * from './anchors.ts';
export * from './non-live.ts';
export * from './decode-args.ts';
