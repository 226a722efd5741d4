export * from './whistle-types.ts';
export * from './whistle-detector.ts';
export * from './scan.ts';
export { RealFft } from './fft.ts';
export * from './anchors.ts';
