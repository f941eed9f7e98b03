import { useMemo } from 'react';
import type { Data, Layout, LayoutAxis, PlotMouseEvent, PlotSelectionEvent, Shape } from 'plotly.js';
import { LazyPlot } from '../../../components/plot/LazyPlot';
import {
  baseLayout,
  MONO_FONT,
  PLOT_COLORS,
  plotConfig,
  pressureAxis,
  valueAxis,
} from '../../../components/plot/theme';
import { flaggedRuns, spanOfSelection, type Pick } from '../picking';
import type { CastDetail, CastInversion, OverlayRole, Proposal } from '../types';

/** An overlaid cast's profile on one panel: a neighbouring station, or the same station in an earlier occupation. */
export interface OverlaySeries {
  name: string;
  role: OverlayRole;
  p: readonly (number | null)[];
  v: readonly (number | null)[];
}

/** One panel of a profile figure: a variable against pressure. */
export interface PanelSpec {
  key: string;
  title: string;
  unit: string;
  values: readonly (number | null)[];
  /** pressure of `values` (the levels, or N²'s mid-points) */
  pressure: readonly (number | null)[];
  digits: number;
  /** flag columns drawn on this panel */
  flagSources: string[];
  /** the flag variable a proposal must name to be drawn here */
  proposalVariables: string[];
  overlays?: OverlaySeries[];
  /** N²: power-notation ticks and a zero line */
  signed?: boolean;
  /** draw the inversion tops on this panel */
  inversionMarks?: boolean;
}

/** Overlays: previous station dashed blue, next dotted violet, the same station in an earlier occupation olive. */
export const NEIGHBOUR_STYLE = {
  previous: { color: '#2f5d8a', dash: 'dash', width: 1.4 },
  next: { color: '#7a5c99', dash: 'dot', width: 1.4 },
  earlier: { color: '#5b7a2e', dash: 'longdashdot', width: 1.7 },
} as const satisfies Record<OverlayRole, { color: string; dash: string; width: number }>;
/** Pending proposals: a violet wash, never the warning accent (proposals are not flags). */
export const PROPOSAL_COLOR = '#6b4f8f';

const GAP = 0.03;

export interface ProfileFigureProps {
  cast: CastDetail;
  panels: PanelSpec[];
  label: string;
  inversions: readonly CastInversion[];
  proposals: readonly Proposal[];
  selecting?: boolean;
  onSelectRange?: (pick: Pick) => void;
  range?: { pFrom: number; pTo: number } | null;
  height?: number;
  /** the pressure window shown, dbar (null: the whole cast) */
  pWindow?: [number, number] | null;
}

const pickIdx = (values: readonly (number | null)[], idx: number[]) => idx.map((i) => values[i] ?? null);

/**
 * Variables against pressure (increasing downward), side by side on one shared pressure axis. Each panel draws
 * its flags (3 open circle, 4 cross), the neighbouring casts as thin dashed lines, inversions shaded in the
 * warning accent and pending proposals as a violet band. A drag in select mode picks the pressure span it
 * covers, whatever its direction; a click on an inversion, proposal or flag mark picks that range.
 */
export function ProfileFigure({
  cast,
  panels,
  label,
  inversions,
  proposals,
  selecting = false,
  onSelectRange,
  range,
  height = 520,
  pWindow = null,
}: ProfileFigureProps) {
  const { data, layout } = useMemo(() => {
    const width = (1 - GAP * (panels.length - 1)) / panels.length;
    const traces: Data[] = [];
    const shapes: Partial<Shape>[] = [];
    const axes: Record<string, Partial<LayoutAxis>> = {};
    const pressure = cast.columns.pressure;
    panels.forEach((panel, i) => {
      const axis = i === 0 ? 'x' : `x${i + 1}`;
      const axisName = i === 0 ? 'xaxis' : `xaxis${i + 1}`;
      // the overlaid casts under this one: the cast under QC stays on top, the others show where they part from it
      for (const o of panel.overlays ?? []) {
        const st = NEIGHBOUR_STYLE[o.role];
        traces.push({
          type: 'scatter',
          mode: 'lines',
          name: `${o.name} ${panel.key}`,
          x: [...o.v],
          y: [...o.p],
          xaxis: axis,
          yaxis: 'y',
          line: { color: st.color, width: panel.signed ? 0.7 : st.width, dash: st.dash },
          opacity: panel.signed ? 0.7 : 0.9,
          connectgaps: false,
          hovertemplate: `${o.name}<br>${panel.title} %{x:.${panel.digits}f}<br>p %{y:.1f} dbar<extra></extra>`,
        } as Data);
      }
      traces.push({
        type: 'scatter',
        mode: 'lines',
        name: panel.key,
        x: [...panel.values],
        y: [...panel.pressure],
        xaxis: axis,
        yaxis: 'y',
        line: { color: panel.signed ? PLOT_COLORS.inkSoft : PLOT_COLORS.ink, width: panel.signed ? 0.8 : 1.3 },
        connectgaps: false,
        hovertemplate: `${panel.title} %{x:.${panel.digits}f}<br>p %{y:.1f} dbar<extra></extra>`,
      } as Data);
      if (panel.flagSources.length) {
        for (const run of flaggedRuns(cast.flags, panel.flagSources, pressure)) {
          const idx = run.indices;
          traces.push({
            type: 'scatter',
            mode: 'markers',
            name: `${panel.key} flagged ${run.flag}`,
            x: pickIdx(panel.values, idx),
            y: pickIdx(pressure, idx),
            xaxis: axis,
            yaxis: 'y',
            marker:
              run.flag === 4
                ? { symbol: 'x', size: 6, color: PLOT_COLORS.warnStrong }
                : { symbol: 'circle-open', size: 6, color: PLOT_COLORS.questionable, line: { width: 1.2 } },
            customdata: idx.map(() => [run.pFrom, run.pTo, run.variable]),
            hovertemplate: `flag ${run.flag} · ${run.variable}<br>%{x:.${panel.digits}f} at %{y:.1f} dbar<br>click to pick ${run.pFrom}–${run.pTo} dbar<extra></extra>`,
          } as Data);
        }
      }
      const mine = proposals.filter((pr) => pr.status === 'pending' && panel.proposalVariables.includes(pr.variable));
      if (mine.length) {
        traces.push({
          type: 'scatter',
          mode: 'markers',
          name: `${panel.key} proposals`,
          xaxis: axis,
          yaxis: 'y',
          x: mine.map((pr) => panel.values[pr.iFrom] ?? null),
          y: mine.map((pr) => pr.pFrom),
          marker: { symbol: 'diamond-open', size: 9, color: PROPOSAL_COLOR, line: { width: 1.6 } },
          customdata: mine.map((pr) => [pr.pFrom, pr.pTo, pr.variable, pr.flag]),
          text: mine.map(
            (pr) =>
              `${pr.test.replace(/_/g, ' ')} proposes ${pr.flag} on ${pr.variable}, ${pr.pFrom}–${pr.pTo} dbar: ${pr.detail}`,
          ),
          hovertemplate: '%{text}<br>click to pick<extra>proposal</extra>',
        } as Data);
        for (const pr of mine) {
          shapes.push({
            type: 'rect',
            layer: 'below',
            xref: `${axis} domain` as Shape['xref'],
            yref: 'y',
            x0: 0,
            x1: 1,
            y0: pr.pFrom - 1,
            y1: pr.pTo + 1,
            fillcolor: 'rgba(107, 79, 143, 0.14)',
            line: { width: 0.8, color: PROPOSAL_COLOR, dash: 'dot' },
          });
        }
      }
      if (panel.inversionMarks && inversions.length) {
        traces.push({
          type: 'scatter',
          mode: 'markers',
          name: 'inversions',
          xaxis: axis,
          yaxis: 'y',
          x: inversions.map((inv) => panel.values[inv.iTop] ?? null),
          y: inversions.map((inv) => inv.pTop),
          marker: { symbol: 'triangle-left', size: 9, color: PLOT_COLORS.warn },
          customdata: inversions.map((inv) => [
            inv.class === 'spike' ? (pressure[inv.iTop + 1] ?? inv.pTop) : inv.pTop,
            inv.pBottom,
            'salinity',
          ]),
          text: inversions.map(
            (inv) =>
              `${inv.class} · ${inv.pTop.toFixed(1)}–${inv.pBottom.toFixed(1)} dbar · deficit ${inv.deficit.toFixed(3)} kg/m³`,
          ),
          hovertemplate: '%{text}<br>click to pick<extra>inversion</extra>',
        } as Data);
      }
      for (const inv of inversions) {
        shapes.push({
          type: 'rect',
          layer: 'below',
          xref: `${axis} domain` as Shape['xref'],
          yref: 'y',
          x0: 0,
          x1: 1,
          y0: inv.pTop,
          y1: inv.pBottom,
          fillcolor: PLOT_COLORS.warnWash,
          line: { width: 0.6, color: PLOT_COLORS.warn },
        });
      }
      if (range) {
        shapes.push({
          type: 'rect',
          layer: 'above',
          xref: `${axis} domain` as Shape['xref'],
          yref: 'y',
          x0: 0,
          x1: 1,
          y0: range.pFrom,
          y1: range.pTo,
          fillcolor: 'rgba(18, 63, 68, 0.08)',
          line: { width: 1, dash: 'dot', color: PLOT_COLORS.ink },
        });
      }
      const domain: [number, number] = [i * (width + GAP), i * (width + GAP) + width];
      axes[axisName] = valueAxis(panel.unit ? `${panel.title} (${panel.unit})` : panel.title, {
        domain,
        anchor: 'y',
        side: 'top',
        ...(panel.signed
          ? {
              exponentformat: 'power',
              zeroline: true,
              zerolinecolor: PLOT_COLORS.inkFaint,
              nticks: 3,
              ...robustAxis(panel.values),
            }
          : { nticks: 4 }),
      });
    });
    const layout: Partial<Layout> = baseLayout({
      ...axes,
      yaxis: pressureAxis({
        anchor: 'x',
        rangemode: 'tozero',
        ...(pWindow ? { range: [pWindow[1], pWindow[0]], autorange: false } : {}),
      }),
      margin: { l: 60, r: 12, t: 44, b: 12 },
      shapes: shapes as Layout['shapes'],
      dragmode: selecting ? 'select' : 'zoom',
      // The box always takes the drag's pressure extent, whatever its direction ('any' would turn a shallow
      // sideways drag into a full-depth band); a span thinner than the level spacing is snapped to the nearest
      // level by spanOfSelection (a sideways drag used to give From = To and 0 levels).
      selectdirection: 'v',
      hovermode: 'closest',
      font: { family: '"Source Sans 3", system-ui, sans-serif', size: 12, color: PLOT_COLORS.inkSoft },
      hoverlabel: {
        bgcolor: PLOT_COLORS.paper,
        bordercolor: PLOT_COLORS.ink,
        font: { family: MONO_FONT, size: 11, color: PLOT_COLORS.inkStrong },
      },
      uirevision: `${cast.id}:${pWindow ? pWindow.join('-') : 'all'}`,
    });
    return { data: traces, layout };
  }, [cast, panels, inversions, proposals, selecting, range, pWindow]);

  return (
    <LazyPlot
      label={label}
      height={height}
      data={data}
      layout={layout}
      config={plotConfig({ modeBarButtonsToRemove: ['lasso2d', 'autoScale2d', 'toggleSpikelines'] })}
      onSelected={(e: PlotSelectionEvent) => {
        const span = spanOfSelection(e, cast.columns.pressure);
        if (span && onSelectRange) onSelectRange(span);
      }}
      onClick={(e: PlotMouseEvent) => {
        const cd = (e.points?.[0] as { customdata?: unknown } | undefined)?.customdata;
        if (!Array.isArray(cd) || typeof cd[0] !== 'number' || typeof cd[1] !== 'number' || !onSelectRange) return;
        onSelectRange({
          pFrom: cd[0],
          pTo: cd[1],
          variable: typeof cd[2] === 'string' ? cd[2] : undefined,
          flag: typeof cd[3] === 'number' ? cd[3] : undefined,
        });
      }}
    />
  );
}

/** N² spans decades: a range from the 0.5 and 99.5 percentiles, with zero inside. */
function robustAxis(values: readonly (number | null)[]): Partial<LayoutAxis> {
  const v = values.filter((x): x is number => x != null && Number.isFinite(x)).sort((a, b) => a - b);
  if (v.length < 10) return {};
  const lo = Math.min(0, v[Math.floor(v.length * 0.005)]);
  const hi = Math.max(0, v[Math.ceil(v.length * 0.995) - 1]);
  const pad = (hi - lo) * 0.06 || 1e-6;
  return { range: [lo - pad, hi + pad] };
}
