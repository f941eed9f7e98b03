import { useMemo } from 'react';
import type { Data, Layout, LayoutAxis, PlotSelectionEvent, Shape } from 'plotly.js';
import { LazyPlot } from '../../../components/plot/LazyPlot';
import { baseLayout, MONO_FONT, PLOT_COLORS, plotConfig, pressureAxis, sigmaLabel, valueAxis } from '../../../components/plot/theme';
import { flaggedLevels } from '../profiles';
import type { CastDetail, CastInversion } from '../types';

/** The four panels, left to right, each with its own x axis and all sharing the pressure axis. */
const PANELS = [
  { key: 'CT', axis: 'x', title: 'CT (°C)' },
  { key: 'SA', axis: 'x2', title: 'SA (g/kg)' },
  { key: 'sigma', axis: 'x3', title: 'σ' },
  { key: 'N2', axis: 'x4', title: 'N² (s⁻²)' },
] as const;

const GAP = 0.035;
const WIDTH = (1 - GAP * (PANELS.length - 1)) / PANELS.length;
const domainOf = (i: number): [number, number] => [i * (WIDTH + GAP), i * (WIDTH + GAP) + WIDTH];

export interface ProfilePanelsProps {
  cast: CastDetail;
  refPressure: number;
  sigma: readonly (number | null)[];
  inversions: readonly CastInversion[];
  /** Box-select on the plot picks a pressure range (for the flag form). */
  selecting?: boolean;
  onSelectRange?: (pFrom: number, pTo: number) => void;
  /** The range being edited, outlined on every panel. */
  range?: { pFrom: number; pTo: number } | null;
  height?: number;
}

/** [low, high] from the 0.5 and 99.5 percentiles, with 0 inside and a small margin; null without data. */
function robustRange(values: readonly (number | null)[]): [number, number] | null {
  const v = values.filter((x): x is number => x != null && Number.isFinite(x)).sort((a, b) => a - b);
  if (v.length < 10) return null;
  const lo = Math.min(0, v[Math.floor(v.length * 0.005)]);
  const hi = Math.max(0, v[Math.ceil(v.length * 0.995) - 1]);
  const pad = (hi - lo) * 0.06 || 1e-6;
  return [lo - pad, hi + pad];
}

const pick = (values: readonly (number | null)[], idx: number[]) => idx.map((i) => values[i] ?? null);

/** The pressure range of a box selection, from its y range or, failing that, the points inside it. */
export function rangeOfSelection(event: PlotSelectionEvent | undefined): [number, number] | null {
  if (!event) return null;
  const range = (event as { range?: Record<string, number[]> }).range;
  if (range) {
    const y = Object.entries(range).find(([axis]) => axis.startsWith('y'))?.[1];
    if (y && y.length === 2 && y.every(Number.isFinite)) return [Math.min(y[0], y[1]), Math.max(y[0], y[1])];
  }
  const ys = (event.points ?? []).map((pt) => Number(pt.y)).filter(Number.isFinite);
  return ys.length ? [Math.min(...ys), Math.max(...ys)] : null;
}

/**
 * CT, SA, σ at the chosen reference and N² against pressure (increasing downward), side by side on
 * one shared pressure axis. Inversion intervals are shaded in the warning accent on every panel;
 * levels flagged questionable (3) and bad (4) are drawn as their own marks.
 */
export function ProfilePanels({ cast, refPressure, sigma, inversions, selecting = false, onSelectRange, range, height = 560 }: ProfilePanelsProps) {
  const { data, layout } = useMemo(() => {
    const p = cast.columns.pressure;
    const values: Record<'CT' | 'SA' | 'sigma', readonly (number | null)[]> = {
      CT: cast.columns.CT ?? [],
      SA: cast.columns.SA ?? [],
      sigma,
    };
    const traces: Data[] = [];
    const hover = (name: string, unit: string, digits: number) =>
      `${name} %{x:.${digits}f} ${unit}<br>p %{y:.1f} dbar<extra></extra>`;

    (['CT', 'SA', 'sigma'] as const).forEach((key, i) => {
      const axis = PANELS[i].axis;
      const name = key === 'sigma' ? sigmaLabel(refPressure) : key;
      const unit = key === 'CT' ? '°C' : key === 'SA' ? 'g/kg' : 'kg/m³';
      traces.push({
        type: 'scatter',
        mode: 'lines',
        name,
        x: [...values[key]],
        y: [...p],
        xaxis: axis,
        yaxis: 'y',
        line: { color: PLOT_COLORS.ink, width: 1.3 },
        hovertemplate: hover(name, unit, key === 'CT' ? 4 : 4),
        connectgaps: false,
      } as Data);
      const { questionable, bad } = flaggedLevels(cast.flags, key);
      if (questionable.length) {
        traces.push({
          type: 'scatter', mode: 'markers', name: `${name} flagged 3`, x: pick(values[key], questionable), y: pick(p, questionable), xaxis: axis, yaxis: 'y',
          marker: { symbol: 'circle-open', size: 6, color: PLOT_COLORS.questionable, line: { width: 1.2 } },
          hovertemplate: `flag 3 questionable<br>${name} %{x:.4f}<br>p %{y:.1f} dbar<extra></extra>`,
        } as Data);
      }
      if (bad.length) {
        traces.push({
          type: 'scatter', mode: 'markers', name: `${name} flagged 4`, x: pick(values[key], bad), y: pick(p, bad), xaxis: axis, yaxis: 'y',
          marker: { symbol: 'x', size: 6, color: PLOT_COLORS.warnStrong },
          hovertemplate: `flag 4 bad<br>${name} %{x:.4f}<br>p %{y:.1f} dbar<extra></extra>`,
        } as Data);
      }
    });

    // Inversion tops on the σ panel, so a spike thinner than a pixel of shading is still seen.
    if (inversions.length) {
      traces.push({
        type: 'scatter', mode: 'markers', name: 'inversions', xaxis: 'x3', yaxis: 'y',
        x: inversions.map((inv) => sigma[inv.iTop] ?? null),
        y: inversions.map((inv) => inv.pTop),
        marker: { symbol: 'triangle-left', size: 9, color: PLOT_COLORS.warn },
        text: inversions.map((inv) => `${inv.class} · ${inv.pTop.toFixed(1)}–${inv.pBottom.toFixed(1)} dbar · deficit ${inv.deficit.toFixed(3)} kg/m³`),
        hovertemplate: '%{text}<extra>inversion</extra>',
      } as Data);
    }

    const N2 = cast.columns.N2 ?? [];
    const pMid = cast.columns.p_mid ?? [];
    traces.push({
      type: 'scatter', mode: 'lines', name: 'N²', x: [...N2], y: [...pMid], xaxis: 'x4', yaxis: 'y',
      line: { color: PLOT_COLORS.inkSoft, width: 0.8 },
      hovertemplate: 'N² %{x:.2e} s⁻²<br>p %{y:.1f} dbar<extra></extra>',
    } as Data);
    // Negative N² is everywhere at noise level in a 1 dbar deep profile; only where it belongs to an
    // inversion is it a warning, so only there is it marked.
    const unstable = N2.map((v, i) => (v != null && v < 0 && pMid[i] != null && inversions.some((inv) => pMid[i]! >= inv.pTop && pMid[i]! <= inv.pBottom) ? i : -1)).filter((i) => i >= 0);
    if (unstable.length) {
      traces.push({
        type: 'scatter', mode: 'markers', name: 'N² < 0 in an inversion', x: pick(N2, unstable), y: pick(pMid, unstable), xaxis: 'x4', yaxis: 'y',
        marker: { size: 5, color: PLOT_COLORS.warn },
        hovertemplate: 'N² %{x:.2e} s⁻² (unstable, in an inversion)<br>p %{y:.1f} dbar<extra></extra>',
      } as Data);
    }

    const shapes: Partial<Shape>[] = [];
    for (const inv of inversions) {
      for (const panel of PANELS) {
        shapes.push({
          type: 'rect', layer: 'below', xref: `${panel.axis} domain` as Shape['xref'], yref: 'y', x0: 0, x1: 1,
          y0: inv.pTop, y1: inv.pBottom, fillcolor: PLOT_COLORS.warnWash, line: { width: 0.6, color: PLOT_COLORS.warn },
        });
      }
    }
    if (range) {
      for (const panel of PANELS) {
        shapes.push({
          type: 'rect', layer: 'above', xref: `${panel.axis} domain` as Shape['xref'], yref: 'y', x0: 0, x1: 1,
          y0: range.pFrom, y1: range.pTo, fillcolor: 'rgba(18, 63, 68, 0.08)', line: { width: 1, dash: 'dot', color: PLOT_COLORS.ink },
        });
      }
    }

    // N² spans decades between the seasonal thermocline and the abyss; a robust range (0.5–99.5 %
    // of the values, always with zero and the inversions' minima) keeps the interior readable.
    const n2Base = robustRange(N2);
    const n2Floor = Math.min(0, ...inversions.map((inv) => inv.minN2 ?? 0));
    // Reach down to an inversion's minimum only so far that the stable interior stays readable; the
    // interval is shaded on every panel and its N² is in the table either way.
    const n2Range: [number, number] | null = n2Base
      ? [Math.max(Math.min(n2Base[0], n2Floor * 1.08), n2Base[0] - 0.6 * (n2Base[1] - n2Base[0])), n2Base[1]]
      : null;

    const axes: Record<string, Partial<LayoutAxis>> = {};
    PANELS.forEach((panel, i) => {
      const name = panel.axis === 'x' ? 'xaxis' : `xaxis${panel.axis.slice(1)}`;
      const title = panel.key === 'sigma' ? `${sigmaLabel(refPressure)} (kg/m³)` : panel.title;
      axes[name] = valueAxis(title, {
        domain: domainOf(i),
        anchor: 'y',
        side: 'top',
        ...(panel.key === 'N2'
          ? { exponentformat: 'power', zeroline: true, zerolinecolor: PLOT_COLORS.inkFaint, nticks: 4, ...(n2Range ? { range: n2Range } : {}) }
          : { nticks: 5 }),
      });
    });

    const layout: Partial<Layout> = baseLayout({
      ...axes,
      yaxis: pressureAxis({ anchor: 'x', rangemode: 'tozero' }),
      margin: { l: 60, r: 12, t: 44, b: 12 },
      shapes: shapes as Layout['shapes'],
      dragmode: selecting ? 'select' : 'zoom',
      selectdirection: 'v',
      hovermode: 'closest',
      font: { family: '"Source Sans 3", system-ui, sans-serif', size: 12, color: PLOT_COLORS.inkSoft },
      hoverlabel: { bgcolor: PLOT_COLORS.paper, bordercolor: PLOT_COLORS.ink, font: { family: MONO_FONT, size: 11, color: PLOT_COLORS.inkStrong } },
      uirevision: cast.id,
    });
    return { data: traces, layout };
  }, [cast, refPressure, sigma, inversions, selecting, range]);

  return (
    <LazyPlot
      label={`Profiles of station ${cast.station} cast ${cast.cast}: CT, SA, ${sigmaLabel(refPressure)} and N² against pressure`}
      height={height}
      data={data}
      layout={layout}
      config={plotConfig({ modeBarButtonsToRemove: ['lasso2d', 'autoScale2d', 'toggleSpikelines'] })}
      onSelected={(e) => {
        const r = rangeOfSelection(e);
        if (r && onSelectRange) onSelectRange(Math.round(r[0] * 10) / 10, Math.round(r[1] * 10) / 10);
      }}
    />
  );
}
