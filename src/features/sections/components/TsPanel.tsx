import { useMemo } from 'react';
import type { Data, PlotMouseEvent } from 'plotly.js';
import {
  DEPTHS,
  LazyPlot,
  PLOT_COLORS,
  baseLayout,
  colorAt,
  colorBar,
  plotConfig,
  sigmaLabel,
  toPlotly,
  valueAxis,
} from '../../../components/plot';
import { ErrorNotice, Progress } from '../../../components/Notice';
import { Panel } from '../../../components/Panel';
import { useTsPoints } from '../api';
import { contourStep, sigmaGrid, tsExtent } from '../tsGrid';
import type { TsCast } from '../types';

export interface TsPanelProps {
  cruiseId: string;
  refPressure: number;
  colourBy: 'pressure' | 'station';
  selectedCastId: string | null;
  onColourBy: (by: 'pressure' | 'station') => void;
  onSelectCast: (castId: string) => void;
  height?: number;
  /** The line drawn (null: the default line). */
  line?: string | null;
}

/** CT against SA for every cast, over σ contours at the view's reference pressure computed here. */
export function TsPanel({
  cruiseId,
  refPressure,
  colourBy,
  selectedCastId,
  onColourBy,
  onSelectCast,
  height = 420,
  line = null,
}: TsPanelProps) {
  // SVG points, not WebGL (a headless or GPU-less browser has no WebGL, and SVG exports as a
  // vector figure): every 16th level keeps it quick.
  const every = 16;
  const ts = useTsPoints(cruiseId, every, line);
  const figure = useMemo(
    () => (ts.data ? buildTsFigure(ts.data, refPressure, colourBy, selectedCastId, 'scatter') : null),
    [ts.data, refPressure, colourBy, selectedCastId],
  );

  return (
    <Panel
      title="T–S"
      titleId="ts-panel"
      actions={
        <fieldset className="flex items-center gap-2 text-xs text-ink-soft">
          <legend className="sr-only">Colour the points by</legend>
          <span aria-hidden>Colour by</span>
          {(['pressure', 'station'] as const).map((by) => (
            <label key={by} className="flex items-center gap-1">
              <input
                type="radio"
                name="ts-colour"
                value={by}
                checked={colourBy === by}
                onChange={() => onColourBy(by)}
              />
              {by}
            </label>
          ))}
        </fieldset>
      }
    >
      {ts.isPending && <Progress label="Loading the T–S points…" />}
      {ts.isError && (
        <div className="p-3">
          <ErrorNotice error={ts.error} title="The T–S points could not be loaded" />
        </div>
      )}
      {figure && (
        <LazyPlot
          label={`T–S diagram with ${sigmaLabel(refPressure)} contours`}
          height={height}
          data={figure.data}
          layout={figure.layout}
          config={TS_CONFIG}
          onClick={(event: PlotMouseEvent) => {
            const castId = event.points?.[0]?.customdata as unknown;
            if (typeof castId === 'string') onSelectCast(castId);
          }}
          caption={
            <>
              Every {every}th level of every cast. Contours: {sigmaLabel(refPressure)} (kg/m³) at {refPressure} dbar
              from the 75-term TEOS-10 density, computed in the browser.
              {selectedCastId && ' The selected station is drawn dark; click a point to select its station.'}
            </>
          }
        />
      )}
    </Panel>
  );
}

const TS_CONFIG = plotConfig();

export function buildTsFigure(
  casts: readonly TsCast[],
  refPressure: number,
  colourBy: 'pressure' | 'station',
  selectedCastId: string | null,
  pointType: 'scattergl' | 'scatter' = 'scattergl',
) {
  const extent = tsExtent(casts);
  const data: Data[] = [];
  if (extent) {
    const grid = sigmaGrid(extent, refPressure);
    const step = contourStep(grid);
    data.push({
      type: 'contour',
      name: 'isopycnals',
      x: grid.SA,
      y: grid.CT,
      z: grid.sigma as number[][],
      contours: step
        ? {
            coloring: 'none',
            showlabels: true,
            start: step.start,
            end: step.end,
            size: step.size,
            labelfont: { family: '"JetBrains Mono", monospace', size: 9.5, color: PLOT_COLORS.inkMuted },
          }
        : { coloring: 'none', showlabels: true },
      line: { color: PLOT_COLORS.inkFaint, width: 0.8 },
      hoverinfo: 'skip',
      showscale: false,
    } as Data);
  }
  const xs = casts.map((c) => c.x);
  const xMin = Math.min(...xs),
    xMax = Math.max(...xs);
  let pMax = 0;
  for (const c of casts) for (const p of c.p) if (p !== null && p > pMax) pMax = p;
  const anySelected = casts.some((c) => c.castId === selectedCastId);
  // The pressure colour bar hangs on the first trace drawn in pressure colours.
  const scaleHolder = casts.find((c) => c.castId !== selectedCastId);

  const traceOf = (c: TsCast, selected: boolean): Data => {
    const faded = anySelected && !selected;
    const stationColour = colorAt(DEPTHS, xMax > xMin ? 0.15 + (0.85 * (c.x - xMin)) / (xMax - xMin) : 0.6);
    return {
      type: pointType,
      mode: 'markers',
      name: c.station,
      x: c.SA,
      y: c.CT,
      customdata: c.SA.map(() => c.castId) as unknown as Data['customdata' & keyof Data],
      text: c.p.map((p) => (p === null ? '' : p.toFixed(0))),
      hovertemplate: `Station ${c.station}<br>SA %{x:.3f} g/kg<br>CT %{y:.3f} °C<br>p %{text} dbar<extra></extra>`,
      marker: {
        size: selected ? 5 : 4,
        opacity: faded ? 0.35 : 0.9,
        color: selected ? PLOT_COLORS.inkStrong : colourBy === 'pressure' ? (c.p as number[]) : stationColour,
        ...(colourBy === 'pressure' && !selected
          ? {
              colorscale: toPlotly(DEPTHS),
              cmin: -0.12 * (pMax || 1),
              cmax: pMax || 1,
              showscale: c === scaleHolder,
              colorbar: colorBar('Pressure (dbar)'),
            }
          : {}),
        line: selected ? { color: PLOT_COLORS.paper, width: 0.5 } : { width: 0 },
      },
    } as Data;
  };
  // The selected cast is drawn last so it sits on top.
  for (const c of casts) if (c.castId !== selectedCastId) data.push(traceOf(c, false));
  for (const c of casts) if (c.castId === selectedCastId) data.push(traceOf(c, true));
  if (colourBy === 'station' && casts.length > 0) data.push(stationKey(casts, xMin, xMax));

  const layout = baseLayout({
    margin: { l: 56, r: colourBy === 'station' ? 24 : 12, t: 12, b: 44 },
    xaxis: valueAxis('Absolute Salinity SA (g/kg)', extent ? { range: [extent.saMin, extent.saMax] } : {}),
    yaxis: valueAxis('Conservative Temperature CT (°C)', extent ? { range: [extent.ctMin, extent.ctMax] } : {}),
  });
  return { data, layout };
}

/**
 * The key of the station colours: a colour bar along the line (the same scale the points use:
 * 0.15 + 0.85 × the station's place between the first and the last), its ticks naming the stations
 * (every one up to 14, else evenly chosen ones with the first and the last), drawn by a trace that
 * has no points of its own.
 */
export function stationKey(casts: readonly TsCast[], xMin: number, xMax: number): Data {
  const byX = [...new Map(casts.map((c) => [c.station, c.x])).entries()].sort((a, b) => a[1] - b[1]);
  const most = 14;
  const pick =
    byX.length <= most
      ? byX
      : Array.from({ length: most }, (_, i) => byX[Math.round((i * (byX.length - 1)) / (most - 1))]);
  const span = xMax > xMin ? xMax - xMin : 1;
  return {
    type: 'scatter',
    mode: 'markers',
    name: 'station key',
    x: [null],
    y: [null],
    hoverinfo: 'skip',
    showlegend: false,
    marker: {
      color: [xMin, xMax],
      colorscale: toPlotly(DEPTHS),
      cmin: xMax > xMin ? xMin - (0.15 / 0.85) * span : xMin - 1,
      cmax: xMax > xMin ? xMax : xMin + 0.6,
      showscale: true,
      colorbar: {
        ...colorBar('Station (first to last along the line)'),
        tickvals: pick.map(([, x]) => x),
        ticktext: pick.map(([name]) => name),
      },
    },
  } as Data;
}
