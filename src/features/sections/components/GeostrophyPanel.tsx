import { useEffect, useState, type FormEvent } from 'react';
import type { Data } from 'plotly.js';
import {
  CLEFT,
  LazyPlot,
  PLOT_COLORS,
  baseLayout,
  colorBar,
  plotConfig,
  pressureAxis,
  sigmaLabel,
  toPlotly,
  valueAxis,
} from '../../../components/plot';
import { Button } from '../../../components/Button';
import { ErrorNotice, Progress } from '../../../components/Notice';
import { Num } from '../../../components/Num';
import { Panel } from '../../../components/Panel';
import { useGeostrophy } from '../api';
import type { Geostrophy } from '../types';
import { geostrophyQueryString, type SectionViewState } from '../viewState';

export interface GeostrophyPanelProps {
  cruiseId: string;
  view: SectionViewState;
  levels: string | null;
  layerSetName: string;
  onReference: (pRef: SectionViewState['pRef']) => void;
}

/** Geostrophic velocity between adjacent casts, and transport per isopycnal layer, with the reference named. */
export function GeostrophyPanel({ cruiseId, view, levels, layerSetName, onReference }: GeostrophyPanelProps) {
  const geo = useGeostrophy(cruiseId, geostrophyQueryString(view, levels));
  const referenceText = view.pRef === 'deepest_common' ? 'the deepest common level of each pair' : `${view.pRef} dbar`;

  return (
    <Panel
      title="Geostrophy"
      titleId="geostrophy-panel"
      actions={<ReferenceControl pRef={view.pRef} onChange={onReference} />}
    >
      {geo.isPending && <Progress label="Computing geostrophic velocity…" />}
      {geo.isError && (
        <div className="p-3">
          <ErrorNotice error={geo.error} title="Geostrophy could not be computed" />
        </div>
      )}
      {geo.data && (
        <div className={geo.isPlaceholderData ? 'opacity-60 transition-opacity' : ''}>
          <LazyPlot
            label="Geostrophic velocity between adjacent casts"
            height={300}
            {...velocityFigure(geo.data)}
            config={plotConfig()}
            caption={
              <>
                Velocity relative to {referenceText} (zero there). {geo.data.convention}.
              </>
            }
          />
          <TransportTable geo={geo.data} refPressure={view.ref} layerSetName={layerSetName} />
        </div>
      )}
    </Panel>
  );
}

function ReferenceControl({
  pRef,
  onChange,
}: {
  pRef: SectionViewState['pRef'];
  onChange: (p: SectionViewState['pRef']) => void;
}) {
  const [text, setText] = useState(pRef === 'deepest_common' ? '' : String(pRef));
  const [problem, setProblem] = useState<string | null>(null);
  useEffect(() => setText(pRef === 'deepest_common' ? '' : String(pRef)), [pRef]);
  const submit = (e: FormEvent) => {
    e.preventDefault();
    const n = Number(text);
    if (!text.trim() || !Number.isFinite(n) || n <= 0 || n > 12000) {
      setProblem('A pressure between 0 and 12 000 dbar.');
      return;
    }
    setProblem(null);
    onChange(n);
  };
  return (
    <form onSubmit={submit} className="flex items-center gap-1.5 text-xs" aria-label="Geostrophic reference">
      <label className="flex items-center gap-1 text-ink-soft">
        <input
          type="radio"
          name="geo-ref"
          checked={pRef === 'deepest_common'}
          onChange={() => onChange('deepest_common')}
        />
        Deepest common level
      </label>
      <label className="ml-2 flex items-center gap-1 text-ink-soft">
        <input
          type="radio"
          name="geo-ref"
          checked={pRef !== 'deepest_common'}
          onChange={() => text && Number(text) > 0 && onChange(Number(text))}
        />
        At
      </label>
      <input
        aria-label="Reference pressure for geostrophy (dbar)"
        inputMode="decimal"
        value={text}
        placeholder="dbar"
        onChange={(e) => setText(e.target.value)}
        aria-invalid={problem ? true : undefined}
        title={problem ?? undefined}
        className={`h-7 w-16 rounded border bg-paper px-1.5 font-mono tabular-nums ${problem ? 'border-warn' : 'border-paper-rule'}`}
      />
      <span className="text-ink-muted">dbar</span>
      <Button type="submit" size="sm">
        Use
      </Button>
      {problem && (
        <span role="alert" className="text-warn-strong">
          {problem}
        </span>
      )}
    </form>
  );
}

export function velocityFigure(geo: Geostrophy): { data: Data[]; layout: ReturnType<typeof baseLayout> } {
  let vmax = 0;
  for (const row of geo.velocity) for (const v of row) if (v !== null && Math.abs(v) > vmax) vmax = Math.abs(v);
  vmax = vmax || 0.01;
  const data: Data[] = [
    {
      type: 'heatmap',
      x: geo.pairs.map((p) => p.x),
      y: geo.pressure,
      z: geo.velocity as number[][],
      // Symmetric about zero, so white is "no flow" and neither sign looks stronger.
      zmin: -vmax,
      zmax: vmax,
      colorscale: toPlotly(CLEFT),
      colorbar: colorBar('Velocity (m/s)'),
      text: geo.velocity.map((row) =>
        row.map((_, i) => `${geo.pairs[i]?.a}–${geo.pairs[i]?.b}`),
      ) as unknown as string[],
      hovertemplate: '%{text}<br>%{x:.1f} km, %{y:.0f} dbar<br>v %{z:.3f} m/s<extra></extra>',
      hoverongaps: false,
    } as Data,
  ];
  return {
    data,
    layout: baseLayout({
      margin: { l: 60, r: 12, t: 10, b: 40 },
      xaxis: valueAxis('Mid-point of the pair (km)'),
      yaxis: pressureAxis(),
    }),
  };
}

function TransportTable({
  geo,
  refPressure,
  layerSetName,
}: {
  geo: Geostrophy;
  refPressure: number;
  layerSetName: string;
}) {
  const total = geo.layers.reduce((s, l) => s + (l.total ?? 0), 0);
  const maxAbs = Math.max(1e-9, ...geo.layers.map((l) => Math.abs(l.total ?? 0)));
  const sigma = sigmaLabel(refPressure);
  return (
    <div className="border-t border-paper-rule">
      <div className="grid gap-3 px-3 py-2 xl:grid-cols-[minmax(0,1fr)_minmax(0,1fr)]">
        <div className="overflow-x-auto">
          {geo.layers.every((l) => !l.total) && (
            <p className="mb-1 border-l-2 border-ink px-2 text-xs text-ink-strong">
              No transport in any of these {sigma} layers: they may lie outside this section’s water. Choose a layer set
              for {sigma}.
            </p>
          )}
          <table className="w-full text-sm" aria-label={`Transport per ${sigma} layer (Sv)`}>
            <caption className="pb-1 text-left text-xs text-ink-muted">
              Transport per {sigma} layer, Sv (10⁶ m³/s), layers of {layerSetName}. Sum over layers:{' '}
              <Num>{total.toFixed(2)}</Num> Sv.
            </caption>
            <thead>
              <tr className="border-b border-paper-rule text-xs text-ink-muted">
                <th scope="col" className="py-1 pr-2 text-left font-semibold">
                  {sigma} layer
                </th>
                <th scope="col" className="px-2 text-right font-semibold">
                  Total
                </th>
                <th scope="col" className="pl-2 text-left font-semibold">
                  <span className="sr-only">Bar</span>
                </th>
              </tr>
            </thead>
            <tbody>
              {geo.layers.map((l) => (
                <tr key={`${l.sigmaTop}-${l.sigmaBottom}`} className="border-b border-paper-rule/60">
                  <th scope="row" className="py-0.5 pr-2 text-left font-normal">
                    <Num>
                      {l.sigmaTop.toFixed(2)}–{l.sigmaBottom.toFixed(2)}
                    </Num>
                  </th>
                  <td className="px-2 text-right">
                    <Num>{l.total === null ? '—' : l.total.toFixed(2)}</Num>
                  </td>
                  <td className="w-1/2 pl-2">
                    <Bar value={l.total} maxAbs={maxAbs} />
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
        <div className="overflow-x-auto">
          <table className="w-full text-xs" aria-label="Transport per layer and pair (Sv)">
            <caption className="pb-1 text-left text-ink-muted">By station pair, Sv</caption>
            <thead>
              <tr className="border-b border-paper-rule text-ink-muted">
                <th scope="col" className="py-1 pr-2 text-left font-semibold">
                  {sigma}
                </th>
                {geo.pairs.map((p) => (
                  <th key={`${p.a}-${p.b}`} scope="col" className="px-1 text-right font-mono font-normal">
                    {p.a}–{p.b}
                  </th>
                ))}
              </tr>
            </thead>
            <tbody>
              {geo.layers.map((l) => (
                <tr key={`${l.sigmaTop}-${l.sigmaBottom}`} className="border-b border-paper-rule/60">
                  <th scope="row" className="py-0.5 pr-2 text-left font-normal">
                    <Num>{l.sigmaTop.toFixed(2)}</Num>
                  </th>
                  {l.transport.map((t, i) => (
                    <td key={i} className="px-1 text-right">
                      <Num>{t === null ? '·' : t.toFixed(2)}</Num>
                    </td>
                  ))}
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      </div>
    </div>
  );
}

/** A horizontal bar from the centre: blue one way, brick the other, as the velocity colours. */
function Bar({ value, maxAbs }: { value: number | null; maxAbs: number }) {
  if (value === null) return null;
  const share = Math.min(1, Math.abs(value) / maxAbs) * 50;
  const colour = value >= 0 ? CLEFT[CLEFT.length - 3][1] : CLEFT[2][1];
  return (
    <div className="relative h-3 w-full bg-paper-sunk/60" aria-hidden>
      <div className="absolute inset-y-0 left-1/2 w-px" style={{ background: PLOT_COLORS.inkFaint }} />
      <div
        className="absolute inset-y-0"
        style={{ background: colour, width: `${share}%`, left: value >= 0 ? '50%' : `${50 - share}%` }}
      />
    </div>
  );
}
