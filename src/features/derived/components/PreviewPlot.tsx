import { useMemo } from 'react';
import type { Data } from 'plotly.js';
import { LazyPlot } from '../../../components/plot/LazyPlot';
import { baseLayout, PLOT_COLORS, plotConfig, pressureAxis, valueAxis } from '../../../components/plot/theme';
import type { FormulaPreview } from '../types';

/** A small profile of the formula's values against pressure (increasing downward) on one cast. */
export function PreviewPlot({
  preview,
  name,
  unit,
  castLabel,
}: {
  preview: FormulaPreview;
  name: string;
  unit: string | null;
  castLabel: string;
}) {
  const data = useMemo<Data[]>(
    () => [
      {
        type: 'scatter',
        mode: 'lines',
        x: preview.values,
        y: preview.pressure,
        line: { color: PLOT_COLORS.ink, width: 1.3 },
        hovertemplate: `${name || 'value'} %{x:.5g}${unit ? ` ${unit}` : ''}<br>p %{y:.1f} dbar<extra></extra>`,
      } as Data,
    ],
    [preview, name, unit],
  );
  const title = `${name || 'formula'}${unit ? ` (${unit})` : ''}`;
  return (
    <LazyPlot
      label={`Preview of ${title} on ${castLabel} against pressure`}
      height={340}
      data={data}
      layout={baseLayout({
        xaxis: valueAxis(title, { side: 'top', nticks: 5 }),
        yaxis: pressureAxis(),
        margin: { l: 56, r: 12, t: 40, b: 12 },
      })}
      config={plotConfig({ displayModeBar: false })}
    />
  );
}
