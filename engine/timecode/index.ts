export * from './rate.ts';
export * from './timecode.ts';
export * from './parse.ts';
export * from './pts.ts';
