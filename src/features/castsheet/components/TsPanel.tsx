import { useMemo } from 'react';
import type { Data, Layout } from 'plotly.js';
import { LazyPlot } from '../../../components/plot/LazyPlot';
import { baseLayout, PLOT_COLORS, plotConfig, valueAxis } from '../../../components/plot/theme';
import { sigma0 } from '../../../../shared/seawater/density';
import { flaggedLevels } from '../profiles';
import { NEIGHBOUR_STYLE } from './ProfileFigure';
import type { CastDetail, OverlayCast } from '../types';

const finite = (v: readonly (number | null)[] | undefined) =>
  (v ?? []).filter((x): x is number => x != null && Number.isFinite(x));

/**
 * The T–S diagram of the cast (CT against SA) with its neighbours and the earlier occupation, on σ0 isopycnals (TEOS-10, computed here);
 * levels flagged 3 and 4 marked as on the profiles.
 */
export function TsPanel({
  cast,
  neighbours,
  height = 420,
}: {
  cast: CastDetail;
  neighbours: readonly OverlayCast[];
  height?: number;
}) {
  const { data, layout } = useMemo(() => {
    const SA = cast.columns.SA ?? [];
    const CT = cast.columns.CT ?? [];
    const traces: Data[] = [];
    const allSA = [...finite(SA), ...neighbours.flatMap((n) => finite(n.columns.SA))];
    const allCT = [...finite(CT), ...neighbours.flatMap((n) => finite(n.columns.CT))];
    if (allSA.length > 2) {
      const sMin = Math.min(...allSA),
        sMax = Math.max(...allSA),
        tMin = Math.min(...allCT),
        tMax = Math.max(...allCT);
      const ps = (sMax - sMin) * 0.05 || 0.05,
        pt = (tMax - tMin) * 0.05 || 0.5;
      const xs = Array.from({ length: 41 }, (_, i) => sMin - ps + ((sMax - sMin + 2 * ps) * i) / 40);
      const ys = Array.from({ length: 41 }, (_, j) => tMin - pt + ((tMax - tMin + 2 * pt) * j) / 40);
      traces.push({
        type: 'contour',
        x: xs,
        y: ys,
        z: ys.map((t) => xs.map((s) => sigma0(s, t))),
        showscale: false,
        hoverinfo: 'skip',
        name: 'σ₀',
        contours: { coloring: 'none', showlabels: true, labelfont: { size: 9, color: PLOT_COLORS.inkFaint } },
        line: { color: PLOT_COLORS.rule, width: 0.6 },
      } as Data);
    }
    for (const n of neighbours) {
      const st = NEIGHBOUR_STYLE[n.role];
      traces.push({
        type: 'scatter',
        mode: 'lines',
        name: n.label,
        x: n.columns.SA ?? [],
        y: n.columns.CT ?? [],
        line: { color: st.color, width: st.width * 0.7, dash: st.dash },
        hovertemplate: `${n.label}<br>SA %{x:.4f}<br>CT %{y:.4f}<extra></extra>`,
      } as Data);
    }
    traces.push({
      type: 'scatter',
      mode: 'lines',
      name: `station ${cast.station}`,
      x: [...SA],
      y: [...CT],
      line: { color: PLOT_COLORS.ink, width: 1.3 },
      hovertemplate: 'SA %{x:.4f} g/kg<br>CT %{y:.4f} °C<extra></extra>',
    } as Data);
    const { questionable, bad } = flaggedLevels(cast.flags, 'sigma');
    const pick = (idx: number[], v: readonly (number | null)[]) => idx.map((i) => v[i] ?? null);
    if (questionable.length)
      traces.push({
        type: 'scatter',
        mode: 'markers',
        name: 'flag 3',
        x: pick(questionable, SA),
        y: pick(questionable, CT),
        marker: { symbol: 'circle-open', size: 6, color: PLOT_COLORS.questionable },
      } as Data);
    if (bad.length)
      traces.push({
        type: 'scatter',
        mode: 'markers',
        name: 'flag 4',
        x: pick(bad, SA),
        y: pick(bad, CT),
        marker: { symbol: 'x', size: 6, color: PLOT_COLORS.warnStrong },
      } as Data);
    const layout: Partial<Layout> = baseLayout({
      xaxis: valueAxis('SA (g/kg)', { nticks: 6 }),
      yaxis: valueAxis('CT (°C)', { nticks: 6 }),
      margin: { l: 56, r: 12, t: 12, b: 44 },
      uirevision: cast.id,
    });
    return { data: traces, layout };
  }, [cast, neighbours]);
  return (
    <LazyPlot
      label={`T–S diagram of station ${cast.station} with ${neighbours.map((n) => n.label).join(', ') || 'no overlay'}`}
      height={height}
      data={data}
      layout={layout}
      config={plotConfig()}
    />
  );
}
