let known: boolean | null = null;

/**
 * Whether Plotly can draw WebGL traces (scattergl) here. It needs a WebGL context with the two
 * extensions its renderer asks for, and code generation at run time: the renderer compiles its draw
 * calls with `new Function`, which a Content-Security-Policy without 'unsafe-eval' (ours) forbids.
 * Where either is missing Plotly draws a "WebGL is not supported" notice instead of the points, so
 * callers fall back to SVG traces with fewer points. Asked once per page.
 */
export function webglAvailable(): boolean {
  if (known === null) known = canGenerateCode() && hasWebgl();
  return known;
}

function canGenerateCode(): boolean {
  try {
    return new Function('return 1')() === 1;
  } catch {
    return false;
  }
}

function hasWebgl(): boolean {
  try {
    const gl = document.createElement('canvas').getContext('webgl');
    if (!gl) return false;
    const ok = gl.getExtension('ANGLE_instanced_arrays') !== null && gl.getExtension('OES_element_index_uint') !== null;
    gl.getExtension('WEBGL_lose_context')?.loseContext();
    return ok;
  } catch {
    return false;
  }
}
