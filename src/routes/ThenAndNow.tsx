// "Then and now": one line occupied twice, compared. The two occupations side by side, the change
// on pressure and on isopycnals, the heave and the water-mass term (Bindoff & McDougall 1994) as
// frames centred on zero, along-line mean profiles of each term, both in one T–S diagram. The
// whole view is in the URL.
import { useEffect, useMemo, useState } from 'react';
import { useSearchParams } from 'react-router-dom';
import { ErrorNotice, Progress } from '../components/Notice';
import { EmptyState, Panel } from '../components/Panel';
import { Button } from '../components/Button';
import { SelectField, TextField } from '../components/Field';
import { preloadPlotly, sigmaLabel } from '../components/plot';
import {
  GridFrame,
  MeanProfiles,
  TsBoth,
  exportHref,
  lineText,
  magnitudeQuantile,
  parseLineText,
  parseView,
  scaled,
  serialiseView,
  useComparison,
  useLines,
  useLinkLine,
  useMyCruises,
  useOccupations,
  valueRange,
  type Comparison,
  type ComparisonView,
} from '../features/comparisons';
import { useCurrentCruise } from './CruiseLayout';

const PROPERTIES: [string, string][] = [
  ['CT', 'Conservative Temperature'],
  ['SA', 'Absolute Salinity'],
  ['oxygen', 'Oxygen'],
  ['pt0', 'Potential temperature'],
];

function useView(): [ComparisonView, (patch: Partial<ComparisonView>) => void] {
  const [sp, setSp] = useSearchParams();
  const view = useMemo(() => parseView(sp), [sp]);
  const set = (patch: Partial<ComparisonView>) => setSp(serialiseView({ ...view, ...patch }), { replace: true });
  return [view, set];
}

const fmtYears = (y: number | null) => (y === null ? 'unknown' : `${y.toFixed(1)} years`);

export default function ThenAndNow() {
  const cruise = useCurrentCruise();
  const [view, setView] = useView();
  useEffect(() => void preloadPlotly().catch(() => undefined), []);
  const lines = useLines(cruise.id);
  const here = useMemo(() => lines.data ?? [], [lines.data]);
  const defaultHere = here.find((l) => l.isDefault) ?? here[0] ?? null;
  const anchor = view.b ?? view.a ?? defaultHere?.id ?? null;
  const offers = useOccupations(anchor);
  const others = useMemo(() => offers.data?.occupations ?? [], [offers.data]);

  // First visit: this cruise's default line against its earliest other occupation, earlier as A.
  useEffect(() => {
    if (view.a && view.b) return;
    if (!defaultHere || !offers.data) return;
    const other = others[0];
    if (!other) return;
    const mineFirst = String(cruise.startDate ?? '') < other.startDate;
    setView(mineFirst ? { a: defaultHere.id, b: other.lineId } : { a: other.lineId, b: defaultHere.id });
  }, [defaultHere, offers.data]); // eslint-disable-line react-hooks/exhaustive-deps

  const choices = useMemo(() => {
    const mine = here.map((l) => ({ id: l.id, label: `${cruise.name} · ${l.name}` }));
    const theirs = others.map((o) => ({ id: o.lineId, label: `${o.cruise} · ${o.line} (${o.why.join(', ')})` }));
    return [...mine, ...theirs];
  }, [here, others, cruise.name]);

  const comparison = useComparison(view);
  const c = comparison.data;

  return (
    <div className="flex flex-col gap-4">
      <div className="flex flex-wrap items-end justify-between gap-3">
        <div>
          <h2 className="text-lg font-semibold text-ink-strong">Then and now</h2>
          <p className="text-sm text-ink-soft">
            One line occupied twice: what changed on pressure surfaces, and how much of it is heave and how much is
            water-mass change.
          </p>
        </div>
        {c && (
          <div className="flex flex-wrap gap-2 text-sm">
            <a className="underline" href={exportHref(view, 'csv', 'pressure')}>
              CSV on pressure
            </a>
            <a className="underline" href={exportHref(view, 'csv', 'density')}>
              CSV on {sigmaLabel(view.ref)}
            </a>
            <a className="underline" href={exportHref(view, 'nc')}>
              NetCDF-CF
            </a>
          </div>
        )}
      </div>
      <Controls
        view={view}
        setView={setView}
        choices={choices}
        track={
          c
            ? c.positions.flatMap((q) =>
                q.longitude === null || q.latitude === null ? [] : [[q.longitude, q.latitude] as [number, number]],
              )
            : null
        }
      />
      <LinkByHand lineId={anchor} currentCruise={cruise.id} />
      {comparison.isError && <ErrorNotice error={comparison.error} title="The comparison could not be made" />}
      {!view.a || !view.b ? (
        offers.isPending || lines.isPending ? (
          <Progress label="Finding other occupations of this line…" />
        ) : (
          <Panel title="Occupations">
            <EmptyState title="No other occupation of this line yet">
              Lines of your other cruises with the same name or the same section identifier appear here; you can also
              link one by hand above.
            </EmptyState>
          </Panel>
        )
      ) : comparison.isPending ? (
        <Progress label="Comparing the two occupations…" />
      ) : c ? (
        <Frames c={c} view={view} />
      ) : null}
      <p className="text-xs text-ink-muted">Provisional research data; not for navigation or safety-of-life use.</p>
    </div>
  );
}

function Controls({
  view,
  setView,
  choices,
  track,
}: {
  view: ComparisonView;
  setView: (p: Partial<ComparisonView>) => void;
  choices: { id: string; label: string }[];
  /** The common positions of the comparison shown (A's paired stations), to start a drawn line from. */
  track: [number, number][] | null;
}) {
  const [levels, setLevels] = useState(view.levels ?? '');
  useEffect(() => setLevels(view.levels ?? ''), [view.levels]);
  const [drawing, setDrawing] = useState(view.line !== null);
  const [lineDraft, setLineDraft] = useState(lineText(view.line));
  useEffect(() => setLineDraft(lineText(view.line)), [view.line]);
  const draftLine = parseLineText(lineDraft);
  return (
    <Panel title="Occupations and choices" bodyClassName="grid grid-cols-2 gap-3 p-3 lg:grid-cols-6">
      <SelectField
        label="Earlier occupation (A)"
        value={view.a ?? ''}
        onChange={(e) => setView({ a: e.target.value || null })}
        fieldClassName="col-span-2 lg:col-span-2"
      >
        <option value="">—</option>
        {choices.map((o) => (
          <option key={o.id} value={o.id}>
            {o.label}
          </option>
        ))}
      </SelectField>
      <SelectField
        label="Later occupation (B)"
        value={view.b ?? ''}
        onChange={(e) => setView({ b: e.target.value || null })}
        fieldClassName="col-span-2 lg:col-span-2"
      >
        <option value="">—</option>
        {choices.map((o) => (
          <option key={o.id} value={o.id}>
            {o.label}
          </option>
        ))}
      </SelectField>
      <SelectField label="Property" value={view.property} onChange={(e) => setView({ property: e.target.value })}>
        {PROPERTIES.map(([k, l]) => (
          <option key={k} value={k}>
            {l}
          </option>
        ))}
      </SelectField>
      <SelectField
        label="Reference pressure"
        value={String(view.ref)}
        onChange={(e) => setView({ ref: Number(e.target.value), levels: null })}
      >
        {[0, 1000, 2000, 3000, 4000].map((r) => (
          <option key={r} value={r}>
            {sigmaLabel(r)} ({r} dbar)
          </option>
        ))}
      </SelectField>
      <SelectField
        label="Inversions"
        value={view.inversions}
        onChange={(e) => setView({ inversions: e.target.value as ComparisonView['inversions'] })}
      >
        <option value="sort">sorted (Thorpe)</option>
        <option value="drop">light levels dropped</option>
        <option value="raw">as measured</option>
      </SelectField>
      <SelectField
        label="Common positions"
        value={view.positions}
        onChange={(e) => setView({ positions: e.target.value as ComparisonView['positions'] })}
      >
        <option value="stations">A's stations</option>
        <option value="regular">regular spacing</option>
      </SelectField>
      <TextField
        label="Pairing distance (km)"
        type="number"
        min={1}
        max={500}
        value={view.pair}
        onChange={(e) => Number(e.target.value) > 0 && setView({ pair: Number(e.target.value) })}
        mono
      />
      <TextField
        label="Pressure step (dbar)"
        type="number"
        min={1}
        max={500}
        value={view.bin}
        onChange={(e) => Number(e.target.value) > 0 && setView({ bin: Number(e.target.value) })}
        mono
      />
      <TextField
        label="Levels (start:step:end)"
        value={levels}
        placeholder="default"
        onChange={(e) => setLevels(e.target.value)}
        onBlur={() => setView({ levels: levels.trim() || null })}
        mono
        fieldClassName="col-span-2"
      />
      <label className="flex items-center gap-2 self-end pb-2 text-sm text-ink">
        <input type="checkbox" checked={view.perDecade} onChange={(e) => setView({ perDecade: e.target.checked })} />{' '}
        changes per decade
      </label>
      <SelectField
        label="Positions along"
        value={drawing ? 'drawn' : 'track'}
        onChange={(e) => {
          const drawn = e.target.value === 'drawn';
          setDrawing(drawn);
          if (!drawn) setView({ line: null });
        }}
      >
        <option value="track">A's track</option>
        <option value="drawn">a line I draw</option>
      </SelectField>
      {drawing && (
        <>
          <TextField
            label="Drawn line (lon lat; lon lat; …)"
            value={lineDraft}
            placeholder="-30.0 -35.0; -20.0 -34.5"
            hint="2 to 200 points in degrees; stations of either occupation farther than the pairing distance from it are left out and listed"
            error={lineDraft.trim() && !draftLine ? 'Give 2 to 200 points, each as longitude latitude' : undefined}
            onChange={(e) => setLineDraft(e.target.value)}
            onBlur={() => draftLine && setView({ line: draftLine })}
            mono
            fieldClassName="col-span-2 lg:col-span-4"
          />
          <div className="flex items-end pb-1">
            <Button
              size="sm"
              variant="quiet"
              disabled={!track || track.length < 2}
              onClick={() => track && setView({ line: track })}
            >
              Start from A's track
            </Button>
          </div>
        </>
      )}
    </Panel>
  );
}

function LinkByHand({ lineId, currentCruise }: { lineId: string | null; currentCruise: string }) {
  const [open, setOpen] = useState(false);
  const [cruiseId, setCruiseId] = useState('');
  const [other, setOther] = useState('');
  const cruises = useMyCruises();
  const lines = useLines(cruiseId || null);
  const link = useLinkLine(lineId);
  if (!lineId) return null;
  if (!open)
    return (
      <div>
        <Button size="sm" variant="quiet" onClick={() => setOpen(true)}>
          Link a line of another cruise by hand…
        </Button>
      </div>
    );
  return (
    <Panel title="Link a line by hand" bodyClassName="flex flex-wrap items-end gap-3 p-3">
      <SelectField
        label="Cruise"
        value={cruiseId}
        onChange={(e) => {
          setCruiseId(e.target.value);
          setOther('');
        }}
      >
        <option value="">—</option>
        {(cruises.data ?? [])
          .filter((c) => c.id !== currentCruise)
          .map((c) => (
            <option key={c.id} value={c.id}>
              {c.name}
            </option>
          ))}
      </SelectField>
      <SelectField label="Line" value={other} onChange={(e) => setOther(e.target.value)}>
        <option value="">—</option>
        {(lines.data ?? []).map((l) => (
          <option key={l.id} value={l.id}>
            {l.name}
          </option>
        ))}
      </SelectField>
      <Button
        variant="primary"
        size="sm"
        disabled={!other}
        busy={link.isPending}
        onClick={() => link.mutate(other, { onSuccess: () => setOpen(false) })}
      >
        Link as an occupation
      </Button>
      <Button size="sm" variant="quiet" onClick={() => setOpen(false)}>
        Cancel
      </Button>
      {link.isError && <ErrorNotice error={link.error} title="Not linked" />}
    </Panel>
  );
}

function Frames({ c, view }: { c: Comparison; view: ComparisonView }) {
  const k = view.perDecade && c.perDecade !== null ? c.perDecade : 1;
  const rate = k !== 1 ? ' per decade' : '';
  const unit = c.unit || '1';
  const prop = PROPERTIES.find(([p]) => p === c.choices.property)?.[1] ?? c.choices.property;
  const stations = useMemo(
    () =>
      c.pairs.map((p) => ({ x: p.x, name: p.stationA === p.stationB ? p.stationA : `${p.stationA}/${p.stationB}` })),
    [c],
  );
  const seq = useMemo(() => valueRange([c.onPressure.A, c.onPressure.B]), [c]);
  const g = useMemo(
    () => ({
      diffP: scaled(c.onPressure.diff, k),
      diffS: scaled(c.onDensity.diff, k),
      heave: scaled(c.onDensity.heave, k),
      wm: scaled(c.decomposition.waterMassTerm, k),
      ht: scaled(c.decomposition.heaveTerm, k),
      res: scaled(c.decomposition.residual, k),
    }),
    [c, k],
  );
  const changeRange = useMemo(() => magnitudeQuantile([g.diffP, g.wm, g.ht]), [g]);
  const diffSRange = useMemo(() => magnitudeQuantile([g.diffS]), [g]);
  const heaveRange = useMemo(() => magnitudeQuantile([g.heave]), [g]);
  const sig = sigmaLabel(c.choices.ref);
  const A = c.occupations.A;
  const B = c.occupations.B;
  const common = {
    x: c.x,
    stations,
    refDbar: c.choices.ref,
    xTitle: c.choices.line ? 'Distance along the drawn line (km)' : 'Distance along line A (km)',
  };
  return (
    <>
      <Panel title="What is compared" bodyClassName="grid grid-cols-1 gap-2 p-3 text-sm md:grid-cols-3">
        <p>
          <span className="font-semibold">A (earlier)</span>: {A.cruise}, line “{A.line}”, {A.casts} casts
          {A.firstCast ? `, ${A.firstCast.slice(0, 10)}` : ''}
        </p>
        <p>
          <span className="font-semibold">B (later)</span>: {B.cruise}, line “{B.line}”, {B.casts} casts
          {B.firstCast ? `, ${B.firstCast.slice(0, 10)}` : ''}
        </p>
        <p>
          {fmtYears(c.years)} apart · {c.pairs.length} positions paired within {c.choices.pairDistanceKm} km
          {c.choices.line ? ` along a drawn line of ${c.choices.line.length} points` : " along A's track"} ·{' '}
          {c.excluded.length} stations left out · flagged levels A {c.counts.flaggedLevels.A}, B{' '}
          {c.counts.flaggedLevels.B} ({c.counts.leftOut.pressure + c.counts.leftOut.density} cells left out)
        </p>
      </Panel>
      <Panel title={`${prop} in each occupation (${unit})`} bodyClassName="grid grid-cols-1 gap-2 p-2 lg:grid-cols-2">
        <GridFrame
          {...common}
          label={`${prop} of A on pressure`}
          y={c.pressure}
          z={c.onPressure.A}
          coord="pressure"
          palette="sequential"
          range={seq}
          bar={`A (${unit})`}
          caption={`A · ${A.cruise}${A.firstCast ? ` · ${A.firstCast.slice(0, 4)}` : ''}`}
        />
        <GridFrame
          {...common}
          label={`${prop} of B on pressure`}
          y={c.pressure}
          z={c.onPressure.B}
          coord="pressure"
          palette="sequential"
          range={seq}
          bar={`B (${unit})`}
          caption={`B · ${B.cruise}${B.firstCast ? ` · ${B.firstCast.slice(0, 4)}` : ''}`}
        />
      </Panel>
      <Panel title={`Change B − A${rate}`} bodyClassName="grid grid-cols-1 gap-2 p-2 lg:grid-cols-2">
        <GridFrame
          {...common}
          label="Change on pressure surfaces"
          y={c.pressure}
          z={g.diffP}
          coord="pressure"
          palette="diverging"
          range={changeRange}
          bar={`ΔC|p (${unit})`}
          caption="On pressure surfaces: ΔC|p"
        />
        <GridFrame
          {...common}
          label="Change on isopycnals"
          y={c.sigma}
          z={g.diffS}
          coord="density"
          palette="diverging"
          range={diffSRange}
          bar={`ΔC|${sig} (${unit})`}
          caption={`On isopycnals: ΔC|${sig}`}
        />
      </Panel>
      <Panel
        title={`Heave and water-mass change${rate} (Bindoff & McDougall 1994)`}
        bodyClassName="grid grid-cols-1 gap-2 p-2 lg:grid-cols-2"
      >
        <GridFrame
          {...common}
          label="Heave of the isopycnals"
          y={c.sigma}
          z={g.heave}
          coord="density"
          palette="diverging"
          range={heaveRange}
          bar="Δp (dbar)"
          caption="Heave Δp on each isopycnal, positive where it deepened"
        />
        <GridFrame
          {...common}
          label="Water-mass term on pressure"
          y={c.pressure}
          z={g.wm}
          coord="pressure"
          palette="diverging"
          range={changeRange}
          bar={`ΔC|${sig} at p (${unit})`}
          caption={`Water-mass term ΔC|${sig}, mapped onto pressure`}
        />
        <GridFrame
          {...common}
          label="Heave term on pressure"
          y={c.pressure}
          z={g.ht}
          coord="pressure"
          palette="diverging"
          range={changeRange}
          bar={`−(∂C/∂p)·Δp (${unit})`}
          caption="Heave term −(∂C/∂p)·Δp"
        />
        <GridFrame
          {...common}
          label="Residual"
          y={c.pressure}
          z={g.res}
          coord="pressure"
          palette="diverging"
          range={changeRange}
          bar={`residual (${unit})`}
          caption="Residual: ΔC|p minus both terms (second order)"
        />
      </Panel>
      <Panel title={`Along-line means${rate}`} bodyClassName="p-2">
        <MeanProfiles c={c} k={k} unit={unit} />
      </Panel>
      <div className="grid grid-cols-1 gap-4 lg:grid-cols-2">
        <Panel title="T–S, both occupations" bodyClassName="p-2">
          <TsBoth c={c} />
        </Panel>
        <Panel title="Geostrophic transport per layer (Sv, relative to the deepest common level)" bodyClassName="p-3">
          <table className="w-full text-sm">
            <thead>
              <tr className="text-left text-ink-muted">
                <th>{sig} layer</th>
                <th className="text-right">A</th>
                <th className="text-right">B</th>
                <th className="text-right">B − A{rate}</th>
              </tr>
            </thead>
            <tbody className="font-mono">
              {c.transport.map((l) => (
                <tr key={l.sigmaTop}>
                  <td>
                    {l.sigmaTop.toFixed(2)}–{l.sigmaBottom.toFixed(2)}
                  </td>
                  <td className="text-right">{l.A.toFixed(2)}</td>
                  <td className="text-right">{l.B.toFixed(2)}</td>
                  <td className="text-right">{(l.change * k).toFixed(2)}</td>
                </tr>
              ))}
            </tbody>
          </table>
          {c.excluded.length > 0 && (
            <div className="mt-3 text-sm">
              <p className="font-semibold text-ink">Left out</p>
              <ul className="list-disc pl-5 text-ink-soft">
                {c.excluded.map((e) => (
                  <li key={`${e.line}${e.station}`}>
                    {e.line} {e.station}: {e.why}
                  </li>
                ))}
              </ul>
            </div>
          )}
        </Panel>
      </div>
    </>
  );
}
