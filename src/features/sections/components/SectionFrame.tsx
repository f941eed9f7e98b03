import { useMemo, useRef } from 'react';
import type { Data, Layout, PlotMouseEvent, Shape } from 'plotly.js';
import {
  DEPTHS,
  LazyPlot,
  PLOT_COLORS,
  baseLayout,
  colorBar,
  densityAxis,
  plotConfig,
  pressureAxis,
  sigmaLabel,
  toPlotly,
  valueAxis,
} from '../../../components/plot';
import { nearestStation } from '../frame';
import type { Section } from '../types';

/** The bottom is drawn in a dark neutral, so it reads as "no water" and never as a value. */
export const BOTTOM_FILL = '#3d3b36';

export interface FrameHover {
  coord: 'pressure' | 'density';
  x: number;
  y: number;
}

export interface SectionFrameProps {
  section: Section;
  coord: 'pressure' | 'density';
  /** The value label of the colour bar, e.g. "CT (°C)". */
  valueTitle: string;
  range: { min: number; max: number } | null;
  cursorStationId: string | null;
  height: number;
  caption: React.ReactNode;
  onHover: (hover: FrameHover) => void;
  onPickStation: (stationId: string) => void;
  onPickInversion: (castId: string) => void;
  /** Called each time Plotly has drawn the frame. */
  onDrawn?: () => void;
}

/** One config for every frame: react-plotly redraws whenever the config object changes. */
const FRAME_CONFIG = plotConfig();

/** Stretches of consecutive bottom points whose bottom is known (land is drawn only there). */
export function knownBottomRuns<T extends { known: boolean }>(b: T[]): T[][] {
  const runs: T[][] = [];
  let cur: T[] = [];
  for (const q of b) {
    if (q.known) cur.push(q);
    else if (cur.length) { runs.push(cur); cur = []; }
  }
  if (cur.length) runs.push(cur);
  return runs;
}

/** One frame of the section: the field, isopycnals (pressure frame), the bottom, stations and inversion marks. */
export function SectionFrame({ section, coord, valueTitle, range, cursorStationId, height, caption, onHover, onPickStation, onPickInversion, onDrawn }: SectionFrameProps) {
  // The traces depend on the data and the colour range only; the station cursor changes the layout
  // (a dotted line, a bold tick label), which Plotly redraws without recomputing the field.
  const data = useMemo(() => buildTraces(section, coord, valueTitle, range), [section, coord, valueTitle, range]);
  const layout = useMemo(() => buildLayout(section, coord, cursorStationId), [section, coord, cursorStationId]);
  const title = coord === 'pressure' ? 'Section by pressure' : `Section by density (${sigmaLabel(section.choices.ref)})`;

  // react-plotly binds event handlers only when it redraws; stable handlers that read the newest
  // props keep a click from acting on the props of an older render.
  const latest = useRef({ section, coord, onHover, onPickStation, onPickInversion });
  latest.current = { section, coord, onHover, onPickStation, onPickInversion };
  const handlers = useMemo(
    () => ({
      hover(event: PlotMouseEvent) {
        const point = event.points?.[0];
        const { coord: c, onHover: report } = latest.current;
        if (point && Number.isFinite(Number(point.x)) && Number.isFinite(Number(point.y))) report({ coord: c, x: Number(point.x), y: Number(point.y) });
      },
      click(event: PlotMouseEvent) {
        const point = event.points?.[0];
        if (!point) return;
        const { section: s, onPickInversion: pickInversion, onPickStation: pickStation } = latest.current;
        const castId = (point.customdata as unknown as string | undefined) ?? undefined;
        if (point.data.name === 'inversions' && typeof castId === 'string') {
          pickInversion(castId);
          return;
        }
        const station = nearestStation(s.stations, Number(point.x));
        if (station) pickStation(station.id);
      },
    }),
    [],
  );

  return (
    <LazyPlot
      label={title}
      height={height}
      data={data}
      layout={layout}
      config={FRAME_CONFIG}
      caption={caption}
      onHover={handlers.hover}
      onClick={handlers.click}
      onAfterPlot={onDrawn}
    />
  );
}

/** The figure of a frame (traces and layout), for tests and for anything drawing a frame elsewhere. */
export function buildFigure(
  section: Section,
  coord: 'pressure' | 'density',
  valueTitle: string,
  range: { min: number; max: number } | null,
  cursorStationId: string | null,
): { data: Data[]; layout: Partial<Layout> } {
  return { data: buildTraces(section, coord, valueTitle, range), layout: buildLayout(section, coord, cursorStationId) };
}

/**
 * Margins fixed for what a frame holds — pressure ("5000") or σ ("27.60") ticks and title on the
 * left, the colour bar on the right, station names (tilted when many) on top. Automatic margins
 * made Plotly measure the drawn labels and draw the whole frame again, once or twice per draw.
 */
const FRAME_MARGIN = { l: 66, r: 84, t: 46, b: 42, autoexpand: false } as const;

/** The lowest pressure the frame shows: the grid's or the deepest bottom's. */
function frameYMax(section: Section): number {
  let yMax = section.grid.y[section.grid.y.length - 1] ?? 0;
  for (const b of section.bottom) if (b.p > yMax) yMax = b.p;
  return yMax;
}

export function buildTraces(
  section: Section,
  coord: 'pressure' | 'density',
  valueTitle: string,
  range: { min: number; max: number } | null,
): Data[] {
  const { grid, stations } = section;
  const data: Data[] = [];
  const yMax = frameYMax(section);
  const yMin = grid.y[0] ?? 0;

  data.push({
    type: 'heatmap',
    name: 'field',
    x: grid.x,
    y: grid.y,
    z: grid.z as number[][],
    // Cells as they are: no smoothing pass over ~100 000 cells, and a bin reads as a bin.
    zsmooth: false,
    colorscale: toPlotly(DEPTHS),
    zmin: range?.min,
    zmax: range?.max,
    zauto: !range,
    hoverinfo: 'none',
    // Placed in the fixed right margin (see FRAME_MARGIN), so it pushes no margin and costs no redraw.
    colorbar: { ...colorBar(valueTitle), x: 1, xanchor: 'left', xpad: 10 } as Data['colorbar' & keyof Data],
    hoverongaps: true,
  } as Data);

  if (coord === 'pressure') {
    // Isopycnals as the server traced them (σ level → pressure at each station): lines, not a
    // contour pass over the grid, and all of them one trace, broken by nulls — a trace each cost
    // Plotly a calc, a layer and a draw apiece, ~40 times.
    const xs: (number | null)[] = [], ys: (number | null)[] = [];
    for (const line of section.isopycnals) {
      if (xs.length) { xs.push(null); ys.push(null); }
      stations.forEach((s, i) => { xs.push(s.x); ys.push(line.p[i] ?? null); });
    }
    if (xs.length) {
      data.push({
        type: 'scatter',
        mode: 'lines',
        name: 'isopycnal',
        x: xs,
        y: ys,
        line: { color: PLOT_COLORS.inkStrong, width: 0.9 },
        opacity: 0.75,
        hoverinfo: 'none',
        connectgaps: false,
      });
    }
    // Labels at the right end of each isopycnal, where it still has water.
    const ends = section.isopycnals.flatMap((line) => {
      for (let i = line.p.length - 1; i >= 0; i--) {
        const p = line.p[i];
        if (p !== null && stations[i]) return [{ x: stations[i].x, y: p, text: line.sigma.toFixed(2) }];
      }
      return [];
    });
    // Near the surface the isopycnals crowd together: keep a label only where it has room.
    const room = (yMax - yMin) * 0.035;
    const labels: typeof ends = [];
    for (const l of [...ends].sort((a, b) => b.y - a.y)) {
      if (!labels.some((k) => Math.abs(k.y - l.y) < room && Math.abs(k.x - l.x) < 1e-6)) labels.push(l);
    }
    if (labels.length) {
      data.push({
        type: 'scatter',
        mode: 'text',
        name: 'isopycnal labels',
        x: labels.map((l) => l.x),
        y: labels.map((l) => l.y),
        text: labels.map((l) => l.text),
        textposition: 'middle left',
        textfont: { family: '"JetBrains Mono", monospace', size: 9.5, color: PLOT_COLORS.inkStrong },
        hoverinfo: 'none',
      });
    }
    if (section.bottom.length) {
      const b = [...section.bottom].sort((a, c) => a.x - c.x);
      // Land only where a bottom is known: one filled run per stretch of stations with a known bottom.
      const span = b.length > 1 ? b[b.length - 1].x - b[0].x : 1;
      for (const run of knownBottomRuns(b)) {
        const pts = run.length > 1 ? run : [{ ...run[0], x: run[0].x - span * 0.004 }, { ...run[0], x: run[0].x + span * 0.004 }];
        data.push({
          type: 'scatter',
          mode: 'lines',
          name: 'bottom',
          x: [...pts.map((q) => q.x), pts[pts.length - 1].x, pts[0].x],
          y: [...pts.map((q) => q.p), yMax * 1.02, yMax * 1.02],
          fill: 'toself',
          fillcolor: BOTTOM_FILL,
          line: { color: BOTTOM_FILL, width: 1 },
          hoverinfo: 'none',
        });
      }
      // Where the bottom is not known the cast only stopped: a dotted line down, "no data below the cast".
      const open = b.filter((q) => !q.known);
      if (open.length) {
        data.push({
          type: 'scatter',
          mode: 'lines',
          name: 'no data below the cast',
          x: open.flatMap((q) => [q.x, q.x, null]),
          y: open.flatMap((q) => [q.p, yMax * 1.02, null]),
          line: { color: BOTTOM_FILL, width: 1, dash: 'dot' },
          hovertemplate: 'no data below the cast (bottom depth not known)<extra></extra>',
        });
      }
    }
  }

  // Inversion warnings: a warm bar over the inverted interval at the cast, a marker on top.
  const marks = section.inversions
    .map((v) => ({ v, top: coord === 'pressure' ? v.pTop : v.sigmaTop, bottom: coord === 'pressure' ? v.pBottom : v.sigmaBottom }))
    .filter((m) => m.top !== null && m.bottom !== null);
  if (marks.length) {
    const xs: (number | null)[] = [], ys: (number | null)[] = [], ids: (string | null)[] = [];
    for (const m of marks) {
      // Spikes are a few decibars: give the bar a visible length without moving its top.
      const bottom = Math.max(m.bottom as number, (m.top as number) + (coord === 'pressure' ? (yMax - yMin) * 0.012 : 0.004));
      xs.push(m.v.x, m.v.x, null);
      ys.push(m.top, bottom, null);
      ids.push(m.v.castId, m.v.castId, null);
    }
    data.push({
      type: 'scatter',
      mode: 'lines',
      name: 'inversion bars',
      x: xs,
      y: ys,
      line: { color: PLOT_COLORS.warn, width: 5 },
      hoverinfo: 'none',
    });
    data.push({
      type: 'scatter',
      mode: 'markers',
      name: 'inversions',
      x: marks.map((m) => m.v.x),
      y: marks.map((m) => m.top as number),
      customdata: marks.map((m) => m.v.castId) as unknown as Data['customdata' & keyof Data],
      marker: { symbol: 'triangle-down', size: 10, color: PLOT_COLORS.warn, line: { color: PLOT_COLORS.paper, width: 1 } },
      hovertemplate: marks.map(
        (m) =>
          `Inversion at ${m.v.station}<br>${m.v.pTop.toFixed(0)}–${m.v.pBottom.toFixed(0)} dbar, ${m.v.class}<br>Δσ ${m.v.deficit.toFixed(3)} kg/m³<extra>click to open the cast</extra>`,
      ),
    } as Data);
  }

  // Station names along the top: a second x axis that follows the first.
  data.push({
    type: 'scatter',
    mode: 'markers',
    name: 'stations',
    x: stations.map((s) => s.x),
    y: stations.map(() => yMin),
    xaxis: 'x2',
    marker: { size: 1, color: 'rgba(0,0,0,0)' },
    hoverinfo: 'skip',
  });
  return data;
}

export function buildLayout(section: Section, coord: 'pressure' | 'density', cursorStationId: string | null): Partial<Layout> {
  const { grid, stations } = section;
  const yMax = frameYMax(section);
  const yMin = grid.y[0] ?? 0;
  const cursor = stations.find((s) => s.id === cursorStationId);
  const shapes: Partial<Shape>[] = [];
  if (cursor) {
    shapes.push({
      type: 'line',
      xref: 'x',
      yref: 'paper',
      x0: cursor.x,
      x1: cursor.x,
      y0: 0,
      y1: 1,
      line: { color: PLOT_COLORS.inkStrong, width: 1.5, dash: 'dot' },
    });
  }
  // The density frame spans the σ levels that have water somewhere, not the whole target list.
  const wet = grid.z.map((row) => row.some((v) => v !== null));
  const firstWet = wet.indexOf(true), lastWet = wet.lastIndexOf(true);
  const sigmaSpan = firstWet >= 0 ? [grid.y[Math.max(0, firstWet - 1)], grid.y[Math.min(grid.y.length - 1, lastWet + 1)]] : null;
  const yAxis = coord === 'pressure'
    ? pressureAxis({ autorange: false, range: [yMax * 1.02, yMin], automargin: false })
    : densityAxis(section.choices.ref, sigmaSpan ? { autorange: false, range: [sigmaSpan[1], sigmaSpan[0]], automargin: false } : { autorange: 'reversed', automargin: false });
  const layout = baseLayout({
    margin: FRAME_MARGIN,
    xaxis: valueAxis('Distance along the track (km)', { range: [grid.x[0], grid.x[grid.x.length - 1]], automargin: false }),
    xaxis2: {
      overlaying: 'x',
      side: 'top',
      matches: 'x',
      tickmode: 'array',
      tickvals: stations.map((s) => s.x),
      ticktext: stations.map((s) => (s.id === cursorStationId ? `<b>${s.station}</b>` : s.station)),
      tickangle: stations.length > 18 ? -60 : 0,
      tickfont: { family: '"JetBrains Mono", monospace', size: 9.5, color: PLOT_COLORS.inkSoft },
      ticks: 'outside',
      ticklen: 4,
      tickcolor: PLOT_COLORS.ink,
      showgrid: false,
      zeroline: false,
    } as Partial<Layout['xaxis']>,
    yaxis: yAxis,
    shapes,
  } as Partial<Layout>);
  return layout;
}
