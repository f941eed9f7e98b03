import { useMemo, useRef } from 'react';
import type { Annotations, Data, Layout, PlotMouseEvent, Shape } from 'plotly.js';
import {
  BRINE,
  LazyPlot,
  PLOT_COLORS,
  baseLayout,
  colorBar,
  densityAxis,
  plotConfig,
  sigmaLabel,
  toPlotly,
  valueAxis,
  type ColorScale,
} from '../../../components/plot';
import { xScale as makeXScale, type XScale, type YScale } from '../axes';
import { nearestStation, placeLineLabels } from '../frame';
import type { Section } from '../types';
import { FramePreview } from './FramePreview';

/** How a frame is drawn beyond its data: palette, contours, axes, colour-range extensions. */
export interface FrameLook {
  palette: ColorScale;
  /** Interval of the property's own contours; null draws none. */
  contourStep: number | null;
  /** The vertical scale of the pressure frame (depth, stretch); null is plain pressure. */
  yScale: YScale | null;
  /** The horizontal scale; null is distance along the track. */
  xScale: XScale | null;
  /** Cells below and above a fixed colour range (drawn in the end colours, marked on the bar). */
  extensions: { below: number; above: number };
}

export const PLAIN_LOOK: FrameLook = {
  palette: BRINE,
  contourStep: null,
  yScale: null,
  xScale: null,
  extensions: { below: 0, above: 0 },
};

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
  look?: FrameLook;
  /** The file name (without extension) the modebar's "save as image" writes. */
  fileName?: string;
}

/** One config for every frame: react-plotly redraws whenever the config object changes. */
const FRAME_CONFIG = plotConfig();
const configFor = (fileName: string | undefined) =>
  fileName ? plotConfig({ toImageButtonOptions: { format: 'png', scale: 2, filename: fileName } }) : FRAME_CONFIG;

/** Stretches of consecutive bottom points whose bottom is known (land is drawn only there). */
export function knownBottomRuns<T extends { known: boolean }>(b: T[]): T[][] {
  const runs: T[][] = [];
  let cur: T[] = [];
  for (const q of b) {
    if (q.known) cur.push(q);
    else if (cur.length) {
      runs.push(cur);
      cur = [];
    }
  }
  if (cur.length) runs.push(cur);
  return runs;
}

/** One frame of the section: the field, isopycnals (pressure frame), the bottom, stations and inversion marks. */
export function SectionFrame({
  section,
  coord,
  valueTitle,
  range,
  cursorStationId,
  height,
  caption,
  onHover,
  onPickStation,
  onPickInversion,
  onDrawn,
  look = PLAIN_LOOK,
  fileName,
}: SectionFrameProps) {
  // The traces depend on the data, the colour range and the look; the station cursor changes the
  // layout (a dotted line, a bold tick label), which Plotly redraws without recomputing the field.
  const data = useMemo(
    () => buildTraces(section, coord, valueTitle, range, look),
    [section, coord, valueTitle, range, look],
  );
  const layout = useMemo(
    () => buildLayout(section, coord, cursorStationId, look),
    [section, coord, cursorStationId, look],
  );
  const config = useMemo(() => configFor(fileName), [fileName]);
  const title =
    coord === 'pressure' ? 'Section by pressure' : `Section by density (${sigmaLabel(section.choices.ref)})`;

  // react-plotly binds event handlers only when it redraws; stable handlers that read the newest
  // props keep a click from acting on the props of an older render.
  const latest = useRef({ section, coord, onHover, onPickStation, onPickInversion, look });
  latest.current = { section, coord, onHover, onPickStation, onPickInversion, look };
  const handlers = useMemo(
    () => ({
      hover(event: PlotMouseEvent) {
        const point = event.points?.[0];
        const { coord: c, onHover: report, look: l } = latest.current;
        if (!point || !Number.isFinite(Number(point.x)) || !Number.isFinite(Number(point.y))) return;
        // The plotted y of a stretched axis is not a pressure: map it back.
        const y = c === 'pressure' && l.yScale ? l.yScale.fromAxis(Number(point.y)) : Number(point.y);
        report({ coord: c, x: Number(point.x), y });
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
      config={config}
      caption={caption}
      figureProps={{ 'data-frame': coord }}
      preview={(drawn) => <FramePreview figure={data} layout={layout} height={height} onDrawn={drawn} />}
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
  look: FrameLook = PLAIN_LOOK,
): { data: Data[]; layout: Partial<Layout> } {
  return {
    data: buildTraces(section, coord, valueTitle, range, look),
    layout: buildLayout(section, coord, cursorStationId, look),
  };
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
  look: FrameLook = PLAIN_LOOK,
): Data[] {
  const { grid, stations } = section;
  const data: Data[] = [];
  const yMax = frameYMax(section);
  const yMin = grid.y[0] ?? 0;
  // The plotted y: pressure through the frame's vertical scale (depth ticks, stretch), σ as it is.
  const Y = coord === 'pressure' && look.yScale ? look.yScale.toAxis : (v: number) => v;
  const Yn = (v: number | null) => (v === null ? null : Y(v));
  const gridY = grid.y.map(Y);

  data.push({
    type: 'heatmap',
    name: 'field',
    x: grid.x,
    y: gridY,
    z: grid.z as number[][],
    // Cells as they are: no smoothing pass over ~100 000 cells, and a bin reads as a bin.
    zsmooth: false,
    colorscale: toPlotly(look.palette),
    zmin: range?.min,
    zmax: range?.max,
    zauto: !range,
    hoverinfo: 'none',
    // Placed in the fixed right margin (see FRAME_MARGIN), so it pushes no margin and costs no redraw.
    // Its ends are fixed (y 0.1–0.9, no padding) so the extension marks can sit on them.
    colorbar: {
      ...colorBar(valueTitle),
      x: 1,
      xanchor: 'left',
      xpad: 10,
      y: 0.5,
      yanchor: 'middle',
      len: 0.8,
      ypad: 0,
    } as Data['colorbar' & keyof Data],
    hoverongaps: true,
  } as Data);

  // The property's own contours, labelled along the lines by the library.
  const step = look.contourStep;
  if (step && step > 0) {
    let lo = Infinity,
      hi = -Infinity;
    for (const row of grid.z)
      for (const v of row)
        if (v !== null && Number.isFinite(v)) {
          if (v < lo) lo = v;
          if (v > hi) hi = v;
        }
    if (Number.isFinite(lo) && (hi - lo) / step <= 200) {
      const digits = Math.max(
        0,
        Math.min(4, -Math.floor(Math.log10(step) + 1e-9) + (String(step).includes('5') && step < 1 ? 1 : 0)),
      );
      data.push({
        type: 'contour',
        name: 'contours',
        x: grid.x,
        y: gridY,
        z: grid.z as number[][],
        contours: {
          coloring: 'none',
          showlabels: true,
          start: Math.ceil(lo / step) * step,
          end: Math.floor(hi / step) * step,
          size: step,
          labelfont: { family: '"JetBrains Mono", monospace', size: 9, color: PLOT_COLORS.inkStrong },
          labelformat: `.${digits}f`,
        },
        line: { color: PLOT_COLORS.inkStrong, width: 0.6, dash: 'dot', smoothing: 0.6 },
        connectgaps: false,
        hoverinfo: 'skip',
        showscale: false,
      } as Data);
    }
  }

  if (coord === 'pressure') {
    // Isopycnals as the server traced them (σ level → pressure at each station): lines, not a
    // contour pass over the grid, and all of them one trace, broken by nulls — a trace each cost
    // Plotly a calc, a layer and a draw apiece, ~40 times.
    const xs: (number | null)[] = [],
      ys: (number | null)[] = [];
    for (const line of section.isopycnals) {
      if (xs.length) {
        xs.push(null);
        ys.push(null);
      }
      stations.forEach((s, i) => {
        xs.push(s.x);
        ys.push(Yn(line.p[i] ?? null));
      });
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
    if (section.bottom.length) {
      const b = [...section.bottom].sort((a, c) => a.x - c.x);
      // Land only where a bottom is known: one filled run per stretch of stations with a known bottom.
      const span = b.length > 1 ? b[b.length - 1].x - b[0].x : 1;
      for (const run of knownBottomRuns(b)) {
        const pts =
          run.length > 1
            ? run
            : [
                { ...run[0], x: run[0].x - span * 0.004 },
                { ...run[0], x: run[0].x + span * 0.004 },
              ];
        data.push({
          type: 'scatter',
          mode: 'lines',
          name: 'bottom',
          x: [...pts.map((q) => q.x), pts[pts.length - 1].x, pts[0].x],
          y: [...pts.map((q) => Y(q.p)), Y(yMax * 1.02), Y(yMax * 1.02)],
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
          y: open.flatMap((q) => [Y(q.p), Y(yMax * 1.02), null]),
          line: { color: BOTTOM_FILL, width: 1, dash: 'dot' },
          hovertemplate: 'no data below the cast (bottom depth not known)<extra></extra>',
        });
      }
    }
  }

  // Inversion warnings: a warm bar over the inverted interval at the cast, a marker on top.
  const marks = section.inversions
    .map((v) => ({
      v,
      top: coord === 'pressure' ? v.pTop : v.sigmaTop,
      bottom: coord === 'pressure' ? v.pBottom : v.sigmaBottom,
    }))
    .filter((m) => m.top !== null && m.bottom !== null);
  if (marks.length) {
    const xs: (number | null)[] = [],
      ys: (number | null)[] = [],
      ids: (string | null)[] = [];
    for (const m of marks) {
      // Spikes are a few decibars: give the bar a visible length without moving its top.
      const bottom = Math.max(
        m.bottom as number,
        (m.top as number) + (coord === 'pressure' ? (yMax - yMin) * 0.012 : 0.004),
      );
      xs.push(m.v.x, m.v.x, null);
      ys.push(coord === 'pressure' ? Y(m.top as number) : m.top, coord === 'pressure' ? Y(bottom) : bottom, null);
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
      y: marks.map((m) => (coord === 'pressure' ? Y(m.top as number) : (m.top as number))),
      customdata: marks.map((m) => m.v.castId) as unknown as Data['customdata' & keyof Data],
      marker: {
        symbol: 'triangle-down',
        size: 10,
        color: PLOT_COLORS.warn,
        line: { color: PLOT_COLORS.paper, width: 1 },
      },
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
    y: stations.map(() => Y(yMin)),
    xaxis: 'x2',
    marker: { size: 1, color: 'rgba(0,0,0,0)' },
    hoverinfo: 'skip',
  });
  return data;
}

export function buildLayout(
  section: Section,
  coord: 'pressure' | 'density',
  cursorStationId: string | null,
  look: FrameLook = PLAIN_LOOK,
): Partial<Layout> {
  const { grid, stations } = section;
  const yMax = frameYMax(section);
  const yMin = grid.y[0] ?? 0;
  const ys = coord === 'pressure' ? look.yScale : null;
  const Y = ys ? ys.toAxis : (v: number) => v;
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
  const firstWet = wet.indexOf(true),
    lastWet = wet.lastIndexOf(true);
  const sigmaSpan =
    firstWet >= 0 ? [grid.y[Math.max(0, firstWet - 1)], grid.y[Math.min(grid.y.length - 1, lastWet + 1)]] : null;
  const yTicks = ys?.ticks ? { tickmode: 'array' as const, tickvals: ys.ticks.vals, ticktext: ys.ticks.text } : {};
  const yAxis =
    coord === 'pressure'
      ? valueAxis(ys?.title ?? 'Pressure (dbar)', {
          autorange: false,
          range: [Y(yMax * 1.02), Y(yMin)],
          automargin: false,
          ...yTicks,
        })
      : densityAxis(
          section.choices.ref,
          sigmaSpan
            ? { autorange: false, range: [sigmaSpan[1], sigmaSpan[0]], automargin: false }
            : { autorange: 'reversed', automargin: false },
        );
  const xs = look.xScale ?? makeXScale('distance', stations);
  const xTicks = xs.ticks ? { tickmode: 'array' as const, tickvals: xs.ticks.vals, ticktext: xs.ticks.text } : {};
  shapes.push(...extensionMarks(look));
  const layout = baseLayout({
    margin: FRAME_MARGIN,
    annotations: coord === 'pressure' ? isopycnalLabels(section, Y, [Y(yMin), Y(yMax)]) : [],
    xaxis: valueAxis(xs.title, { range: [grid.x[0], grid.x[grid.x.length - 1]], automargin: false, ...xTicks }),
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

/** Isopycnal labels placed along their lines (see placeLineLabels), on a paper-coloured chip. */
function isopycnalLabels(section: Section, Y: (p: number) => number, ySpan: [number, number]): Partial<Annotations>[] {
  const xs = section.stations.map((s) => s.x);
  const lines = section.isopycnals.map((l) => ({
    xs,
    ys: l.p.map((p) => (p === null ? null : Y(p))),
    text: l.sigma.toFixed(2),
  }));
  const xSpan: [number, number] = [section.grid.x[0] ?? 0, section.grid.x[section.grid.x.length - 1] ?? 1];
  return placeLineLabels(lines, xSpan, ySpan).map((l) => ({
    x: l.x,
    y: l.y,
    text: l.text,
    showarrow: false,
    xref: 'x',
    yref: 'y',
    font: { family: '"JetBrains Mono", monospace', size: 9, color: PLOT_COLORS.inkStrong },
    bgcolor: 'rgba(252, 250, 245, 0.8)',
    borderpad: 1,
  }));
}

/**
 * Triangles on the colour bar's ends where a fixed range leaves values out: the cells beyond
 * are drawn in the end colour, and the triangle (in that colour) says the scale extends.
 * The bar spans y 0.1–0.9 of the plot (see the heatmap's colorbar) and x 10–22 px right of it.
 */
function extensionMarks(look: FrameLook): Partial<Shape>[] {
  const out: Partial<Shape>[] = [];
  const end = (t: 0 | 1) => look.palette[t === 0 ? 0 : look.palette.length - 1][1];
  const tri = (y: number, up: boolean, colour: string): Partial<Shape> =>
    ({
      type: 'path',
      xref: 'paper',
      yref: 'paper',
      xsizemode: 'pixel',
      ysizemode: 'pixel',
      xanchor: 1,
      yanchor: y,
      path: up ? 'M 10 1 L 22 1 L 16 13 Z' : 'M 10 -1 L 22 -1 L 16 -13 Z',
      fillcolor: colour,
      line: { color: PLOT_COLORS.inkSoft, width: 0.6 },
      name: up ? 'extension above' : 'extension below',
    }) as Partial<Shape>;
  if (look.extensions.above > 0) out.push(tri(0.9, true, end(1)));
  if (look.extensions.below > 0) out.push(tri(0.1, false, end(0)));
  return out;
}
