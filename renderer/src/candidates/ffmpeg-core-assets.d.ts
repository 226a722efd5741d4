// Vite turns these imports into the URLs of the copied files (the embedded ffmpeg core).
declare module '@ffmpeg/core?url' {
  const url: string;
  export default url;
}
declare module '@ffmpeg/core/wasm?url' {
  const url: string;
  export default url;
}
