import { useMemo } from 'react';
import type { Data } from 'plotly.js';
import {
  LazyPlot,
  DEPTHS,
  CLEFT,
  toPlotly,
  baseLayout,
  plotConfig,
  colorBar,
  valueAxis,
  pressureAxis,
  densityAxis,
  sigmaLabel,
  PLOT_COLORS,
  SERIES,
} from '../../components/plot';
import type { Comparison } from './types';

type Grid = (number | null)[][];

/** Multiply every value by k (per-decade rates); k = 1 returns the grid itself. */
export function scaled(g: Grid, k: number): Grid {
  return k === 1 ? g : g.map((row) => row.map((v) => (v === null ? null : v * k)));
}

/** The value below which a share q of the magnitudes of the grids lie (a robust colour range). */
export function magnitudeQuantile(grids: Grid[], q = 0.98): number {
  const v: number[] = [];
  for (const g of grids) for (const row of g) for (const x of row) if (x !== null) v.push(Math.abs(x));
  if (!v.length) return 1;
  v.sort((a, b) => a - b);
  return v[Math.min(v.length - 1, Math.floor(q * (v.length - 1)))] || 1;
}

export function valueRange(grids: Grid[]): [number, number] {
  let lo = Infinity;
  let hi = -Infinity;
  for (const g of grids)
    for (const row of g)
      for (const x of row)
        if (x !== null) {
          if (x < lo) lo = x;
          if (x > hi) hi = x;
        }
  return Number.isFinite(lo) ? [lo, hi] : [0, 1];
}

export interface GridFrameProps {
  label: string;
  x: (number | null)[];
  y: number[];
  z: Grid;
  coord: 'pressure' | 'density';
  refDbar: number;
  palette: 'sequential' | 'diverging';
  /** Colour-bar title (the quantity and its unit). */
  bar: string;
  /** Sequential: [min, max]; diverging: the half-range about zero. */
  range: [number, number] | number;
  stations?: { x: number; name: string }[];
  height?: number;
  caption?: string;
  /** Title of the distance axis (default: along line A). */
  xTitle?: string;
}

/** One frame of a comparison: a grid on pressure or σ against distance along line A. */
export function GridFrame({
  label,
  x,
  y,
  z,
  coord,
  refDbar,
  palette,
  bar,
  range,
  stations = [],
  height = 300,
  caption,
  xTitle = 'Distance along line A (km)',
}: GridFrameProps) {
  const data = useMemo<Data[]>(() => {
    const diverging = palette === 'diverging';
    const half = typeof range === 'number' ? range : 1;
    const heat = {
      type: 'heatmap',
      x,
      y,
      z,
      colorscale: toPlotly(diverging ? CLEFT : DEPTHS),
      zsmooth: false,
      hoverongaps: false,
      ...(diverging
        ? { zmid: 0, zmin: -half, zmax: half }
        : { zmin: (range as [number, number])[0], zmax: (range as [number, number])[1] }),
      colorbar: colorBar(bar),
      hovertemplate: `%{x:.1f} km · ${coord === 'pressure' ? '%{y:.0f} dbar' : `${sigmaLabel(refDbar)} %{y:.3f}`}<br>%{z:.4g}<extra></extra>`,
    } as unknown as Data;
    const ticks = {
      type: 'scatter',
      mode: 'markers',
      x: stations.map((s) => s.x),
      y: stations.map(() => y[0]),
      text: stations.map((s) => s.name),
      marker: { symbol: 'triangle-down', size: 6, color: PLOT_COLORS.ink },
      hovertemplate: 'station %{text}<extra></extra>',
      cliponaxis: false,
    } as unknown as Data;
    return [heat, ticks];
  }, [x, y, z, palette, range, bar, coord, refDbar, stations]);
  const layout = useMemo(
    () =>
      baseLayout({
        margin: { l: 60, r: 8, t: 12, b: 40 },
        xaxis: valueAxis(xTitle),
        yaxis: coord === 'pressure' ? pressureAxis() : densityAxis(refDbar),
      }),
    [coord, refDbar, xTitle],
  );
  return <LazyPlot label={label} data={data} layout={layout} config={plotConfig()} height={height} caption={caption} />;
}

/** Along-line mean profiles of each term, against pressure and against σ. */
export function MeanProfiles({ c, k, unit }: { c: Comparison; k: number; unit: string }) {
  const m = c.means;
  const s = (v: (number | null)[]) => v.map((x) => (x === null ? null : x * k));
  const onP = useMemo<Data[]>(
    () =>
      [
        {
          type: 'scatter',
          mode: 'lines',
          name: 'ΔC on pressure',
          x: s(m.onPressure.diff),
          y: c.pressure,
          line: { color: SERIES[0], width: 2 },
        },
        {
          type: 'scatter',
          mode: 'lines',
          name: 'water-mass term',
          x: s(m.onPressure.waterMassTerm),
          y: c.pressure,
          line: { color: SERIES[2], width: 1.6 },
        },
        {
          type: 'scatter',
          mode: 'lines',
          name: 'heave term',
          x: s(m.onPressure.heaveTerm),
          y: c.pressure,
          line: { color: SERIES[4], width: 1.6, dash: 'dash' },
        },
        {
          type: 'scatter',
          mode: 'lines',
          name: 'residual',
          x: s(m.onPressure.residual),
          y: c.pressure,
          line: { color: PLOT_COLORS.inkMuted, width: 1, dash: 'dot' },
        },
      ] as Data[],
    // eslint-disable-next-line react-hooks/exhaustive-deps
    [c, k],
  );
  const onS = useMemo<Data[]>(
    () =>
      [
        {
          type: 'scatter',
          mode: 'lines',
          name: 'ΔC on the isopycnal',
          x: s(m.onDensity.diff),
          y: c.sigma,
          line: { color: SERIES[2], width: 2 },
        },
        {
          type: 'scatter',
          mode: 'lines',
          name: 'heave (dbar, top axis)',
          x: s(m.onDensity.heave),
          y: c.sigma,
          xaxis: 'x2',
          line: { color: SERIES[4], width: 2 },
        },
      ] as Data[],
    // eslint-disable-next-line react-hooks/exhaustive-deps
    [c, k],
  );
  const legend = { orientation: 'h', x: 0, y: -0.22, font: { size: 11 } } as const;
  const zero = [
    { type: 'line', xref: 'x', yref: 'paper', x0: 0, x1: 0, y0: 0, y1: 1, line: { color: PLOT_COLORS.rule, width: 1 } },
  ] as const;
  return (
    <div className="grid grid-cols-1 gap-3 md:grid-cols-2">
      <LazyPlot
        label="Along-line mean of each term against pressure"
        data={onP}
        height={340}
        config={plotConfig()}
        layout={baseLayout({
          showlegend: true,
          legend,
          margin: { l: 60, r: 12, t: 12, b: 84 },
          xaxis: valueAxis(`Change (${unit})`),
          yaxis: pressureAxis(),
          shapes: [...zero],
        })}
      />
      <LazyPlot
        label="Along-line mean change and heave against density"
        data={onS}
        height={340}
        config={plotConfig()}
        layout={baseLayout({
          showlegend: true,
          legend,
          margin: { l: 60, r: 12, t: 36, b: 84 },
          xaxis: valueAxis(`Change on the isopycnal (${unit})`),
          // its own round ticks (not synchronised to the change axis below)
          xaxis2: valueAxis('Heave (dbar)', {
            overlaying: 'x',
            side: 'top',
            tickmode: 'auto',
            nticks: 7,
            showgrid: false,
          }),
          yaxis: densityAxis(c.choices.ref),
          shapes: [...zero],
        })}
      />
    </div>
  );
}

/** Both occupations in one T–S diagram. */
export function TsBoth({ c }: { c: Comparison }) {
  const data = useMemo<Data[]>(
    () =>
      [
        {
          type: 'scatter',
          mode: 'markers',
          name: `A · ${c.occupations.A.cruise}`,
          x: c.ts.A.SA,
          y: c.ts.A.CT,
          marker: { size: 3, color: SERIES[1], opacity: 0.55 },
        },
        {
          type: 'scatter',
          mode: 'markers',
          name: `B · ${c.occupations.B.cruise}`,
          x: c.ts.B.SA,
          y: c.ts.B.CT,
          marker: { size: 3, color: SERIES[5], opacity: 0.55 },
        },
      ] as Data[],
    [c],
  );
  return (
    <LazyPlot
      label="T–S diagram of both occupations"
      data={data}
      height={340}
      config={plotConfig()}
      layout={baseLayout({
        showlegend: true,
        legend: { orientation: 'h', x: 0, y: -0.2 },
        margin: { l: 60, r: 12, t: 12, b: 70 },
        xaxis: valueAxis('Absolute Salinity (g/kg)'),
        yaxis: valueAxis('Conservative Temperature (°C)'),
      })}
    />
  );
}
