/** Overlay frames handed from the renderer to the native encoder: run encoding and I420 blending. */
export * from './runs.ts';
export * from './i420-blend.ts';
