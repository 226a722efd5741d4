/**
 * Whether this browser's WebGL is a software rasteriser (SwiftShader, llvmpipe): there, pixi's
 * canvas renderer draws the filled layers far faster than its WebGL one
 * (bench/overlay.bench.ts, 1080p, every layer on: WebGL 442 ms median, canvas 14 ms on
 * SwiftShader). With a real GPU WebGL stays the choice.
 */
let cached: boolean | undefined;

export function webglIsSoftware(): boolean {
  if (cached !== undefined) return cached;
  cached = false;
  try {
    const probe = typeof OffscreenCanvas !== 'undefined' ? new OffscreenCanvas(1, 1) : null;
    const gl = (probe?.getContext('webgl2') ?? probe?.getContext('webgl')) as WebGLRenderingContext | null;
    if (!gl) return cached;
    const info = gl.getExtension('WEBGL_debug_renderer_info');
    const name = String(info ? gl.getParameter(info.UNMASKED_RENDERER_WEBGL) : gl.getParameter(gl.RENDERER));
    cached = /swiftshader|llvmpipe|softpipe|software/i.test(name);
    gl.getExtension('WEBGL_lose_context')?.loseContext();
  } catch {
    cached = false;
  }
  return cached;
}
