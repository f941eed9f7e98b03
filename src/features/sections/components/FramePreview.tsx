import { useEffect, useRef } from 'react';
import type { Data, Layout } from 'plotly.js';
import { PLOT_COLORS, colorAt, type ColorScale } from '../../../components/plot';

/**
 * The frame's first picture, drawn on a canvas from the same traces the plotting library will
 * draw: the field in its palette and range, the lines (isopycnals, the bottom), the frame and axis
 * titles, in the same margins — so the section is on screen as soon as its data arrive, and the
 * interactive figure replaces it without a jump once the library has loaded (a few seconds on a
 * busy ship's laptop). It is a picture only: no hover, no toolbar; it says so.
 */
export function FramePreview({
  figure,
  layout,
  height,
  onDrawn,
}: {
  figure: Data[];
  layout: Partial<Layout>;
  height: number;
  onDrawn: () => void;
}) {
  const canvas = useRef<HTMLCanvasElement>(null);
  useEffect(() => {
    const el = canvas.current;
    if (!el) return;
    const frame = requestAnimationFrame(() => {
      draw(el, figure, layout, height);
      onDrawn();
    });
    return () => cancelAnimationFrame(frame);
  }, [figure, layout, height, onDrawn]);
  return (
    <div className="absolute inset-0" data-preview>
      <canvas ref={canvas} className="block h-full w-full" aria-hidden />
      <span className="absolute bottom-1 left-2 text-2xs text-ink-muted">
        Preview — the interactive figure is loading…
      </span>
    </div>
  );
}

type Heat = {
  x: number[];
  y: number[];
  z: (number | null)[][];
  zmin?: number;
  zmax?: number;
  colorscale: [number, string][];
};
type Line = {
  x: (number | null)[];
  y: (number | null)[];
  fill?: string;
  fillcolor?: string;
  line?: { color?: string; width?: number };
  mode?: string;
  xaxis?: string;
};

function draw(el: HTMLCanvasElement, figure: Data[], layout: Partial<Layout>, height: number) {
  const width = el.clientWidth || 600;
  const dpr = Math.min(2, window.devicePixelRatio || 1);
  el.width = Math.round(width * dpr);
  el.height = Math.round(height * dpr);
  const ctx = el.getContext('2d');
  if (!ctx) return;
  ctx.scale(dpr, dpr);
  ctx.fillStyle = PLOT_COLORS.paper;
  ctx.fillRect(0, 0, width, height);
  const m = { l: 66, r: 84, t: 46, b: 42, ...(layout.margin as object) } as {
    l: number;
    r: number;
    t: number;
    b: number;
  };
  const pw = width - m.l - m.r,
    ph = height - m.t - m.b;
  const heat = figure.find((d) => d.type === 'heatmap') as unknown as Heat | undefined;
  if (!heat || pw <= 10 || ph <= 10) return;
  const xr = (layout.xaxis?.range as number[] | undefined) ?? [heat.x[0], heat.x[heat.x.length - 1]];
  const yr = (layout.yaxis?.range as number[] | undefined) ?? [heat.y[heat.y.length - 1], heat.y[0]];
  // y ranges are [bottom, top] (axes increase downward)
  const X = (x: number) => m.l + ((x - xr[0]) / (xr[1] - xr[0] || 1)) * pw;
  const Y = (y: number) => m.t + ((y - yr[1]) / (yr[0] - yr[1] || 1)) * ph;
  let lo = heat.zmin,
    hi = heat.zmax;
  if (lo === undefined || hi === undefined) {
    lo = Infinity;
    hi = -Infinity;
    for (const row of heat.z)
      for (const v of row)
        if (v !== null && Number.isFinite(v)) {
          if (v < lo) lo = v;
          if (v > hi) hi = v;
        }
  }
  const scale = heat.colorscale as unknown as ColorScale;
  const edges = (a: number[]) =>
    a.map((v, i) => [
      i === 0 ? v - (a[1] - v) / 2 : (a[i - 1] + v) / 2,
      i === a.length - 1 ? v + (v - a[i - 1]) / 2 : (v + a[i + 1]) / 2,
    ]);
  const xe = edges(heat.x),
    ye = edges(heat.y);
  ctx.save();
  ctx.beginPath();
  ctx.rect(m.l, m.t, pw, ph);
  ctx.clip();
  heat.z.forEach((row, j) => {
    const y0 = Y(ye[j][0]),
      y1 = Y(ye[j][1]);
    row.forEach((v, i) => {
      if (v === null || !Number.isFinite(v)) return;
      ctx.fillStyle = colorAt(scale, (v - (lo as number)) / ((hi as number) - (lo as number) || 1));
      const x0 = X(xe[i][0]),
        x1 = X(xe[i][1]);
      ctx.fillRect(
        Math.floor(x0),
        Math.floor(Math.min(y0, y1)),
        Math.ceil(x1 - x0) + 1,
        Math.ceil(Math.abs(y1 - y0)) + 1,
      );
    });
  });
  for (const d of figure as unknown as Line[]) {
    if ((d as { type?: string }).type !== 'scatter' || d.mode !== 'lines' || d.xaxis === 'x2') continue;
    ctx.beginPath();
    let pen = false;
    d.x.forEach((x, i) => {
      const y = d.y[i];
      if (x === null || y === null) {
        pen = false;
        return;
      }
      if (pen) ctx.lineTo(X(x), Y(y));
      else ctx.moveTo(X(x), Y(y));
      pen = true;
    });
    if (d.fill === 'toself') {
      ctx.fillStyle = d.fillcolor ?? '#333';
      ctx.fill();
    }
    ctx.strokeStyle = d.line?.color ?? PLOT_COLORS.ink;
    ctx.lineWidth = d.line?.width ?? 1;
    ctx.stroke();
  }
  ctx.restore();
  ctx.strokeStyle = PLOT_COLORS.rule;
  ctx.strokeRect(m.l + 0.5, m.t + 0.5, pw, ph);
  // the colour bar, plain
  const barX = m.l + pw + 10,
    barTop = m.t + ph * 0.1,
    barH = ph * 0.8;
  for (let k = 0; k < barH; k++) {
    ctx.fillStyle = colorAt(scale, 1 - k / barH);
    ctx.fillRect(barX, barTop + k, 12, 1.5);
  }
  ctx.fillStyle = PLOT_COLORS.inkSoft;
  ctx.font = '10px "JetBrains Mono", monospace';
  const fmt = (v: number) => String(Number(v.toPrecision(4)));
  ctx.fillText(fmt(hi as number), barX + 15, barTop + 8);
  ctx.fillText(fmt(lo as number), barX + 15, barTop + barH);
  ctx.font = '12px "Source Sans 3", sans-serif';
  const title = (a: Partial<Layout>['xaxis']) => (a?.title as { text?: string } | undefined)?.text ?? '';
  ctx.fillText(title(layout.xaxis), m.l + pw / 2 - 60, height - 10);
  ctx.save();
  ctx.translate(16, m.t + ph / 2 + 40);
  ctx.rotate(-Math.PI / 2);
  ctx.fillText(title(layout.yaxis), 0, 0);
  ctx.restore();
}
