let known: boolean | null = null;

/**
 * Whether this browser can draw WebGL traces (scattergl). Without it (no GPU and no software
 * rasteriser, e.g. Chromium run with --disable-gpu) Plotly draws a notice instead of the points,
 * so callers fall back to SVG traces with fewer points. Asked once per page.
 */
export function webglAvailable(): boolean {
  if (known === null) {
    try {
      const canvas = document.createElement('canvas');
      const gl = canvas.getContext('webgl') ?? canvas.getContext('experimental-webgl');
      known = gl !== null;
      (gl as WebGLRenderingContext | null)?.getExtension('WEBGL_lose_context')?.loseContext();
    } catch {
      known = false;
    }
  }
  return known;
}
