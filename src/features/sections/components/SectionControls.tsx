import { useEffect, useId, useState, type FormEvent } from 'react';
import { Button } from '../../../components/Button';
import { SelectField } from '../../../components/Field';
import { SECTION_PROPERTIES } from '../properties';
import {
  INTERPOLATIONS,
  INVERSION_HANDLINGS,
  REFERENCE_PRESSURES,
  type DerivedVariable,
  type LayerSet,
  type ReferencePressure,
} from '../types';
import {
  INTERPOLATION_TEXT,
  INVERSION_HANDLING_TEXT,
  PALETTE_CHOICES,
  sigmaName,
  type SectionViewState,
} from '../viewState';
import { PALETTES } from '../../../components/plot';

export interface SectionControlsProps {
  view: SectionViewState;
  onChange: (patch: Partial<SectionViewState>) => void;
  layerSets: readonly LayerSet[];
  derived: readonly DerivedVariable[];
  /** extra variables of the files (`x:<name>`) with their units */
  extras?: readonly { name: string; label: string; unit: string; casts: number }[];
  /** The automatic colour range, shown as the placeholder of the min/max inputs. */
  autoRange: { min: number; max: number } | null;
  /** The density frame's automatic colour range. */
  autoDensityRange?: { min: number; max: number } | null;
  /** The palette the automatic choice gives for this property. */
  autoPaletteLabel?: string;
}

/** The controls above the section; every one writes the view state (and so the URL). */
export function SectionControls({
  view,
  onChange,
  layerSets,
  derived,
  extras = [],
  autoRange,
  autoDensityRange = null,
  autoPaletteLabel,
}: SectionControlsProps) {
  const derivedNames = derived.map((d) => d.name);
  const propertyKnown =
    SECTION_PROPERTIES.some((p) => p.name === view.property) ||
    derivedNames.includes(view.property) ||
    extras.some((x) => x.name === view.property);
  const selectedSet = layerSets.find((s) => s.id === view.layerSet);
  // The figure options start open when the view already uses one of them (a shared link).
  const [figureOpen, setFigureOpen] = useState(() => !!(view.range || view.densityRange));

  return (
    <div role="group" aria-label="Section controls" className="flex flex-col gap-2 print:hidden">
      <div className="flex flex-wrap items-start gap-x-3 gap-y-2">
        <SelectField
          label="Property"
          fieldClassName="w-56"
          value={view.property}
          onChange={(e) => onChange({ property: e.target.value, range: null })}
        >
          <optgroup label="Cast columns">
            {SECTION_PROPERTIES.map((p) => (
              <option key={p.name} value={p.name}>
                {p.name} — {p.label}
              </option>
            ))}
          </optgroup>
          {extras.length > 0 && (
            <optgroup label="Variables of the files">
              {extras.map((x) => (
                <option key={x.name} value={x.name}>
                  {x.label}
                  {x.unit ? ` (${x.unit})` : ''} — {x.casts === 1 ? '1 cast' : `${x.casts} casts`}
                </option>
              ))}
            </optgroup>
          )}
          {derived.length > 0 && (
            <optgroup label="Derived variables">
              {derived.map((d) => (
                <option key={d.id} value={d.name}>
                  {d.name} = {d.formula}
                </option>
              ))}
            </optgroup>
          )}
          {!propertyKnown && <option value={view.property}>{view.property} (from the link)</option>}
        </SelectField>

        <SelectField
          label="Reference pressure"
          fieldClassName="w-36"
          value={String(view.ref)}
          onChange={(e) => {
            const ref = Number(e.target.value) as ReferencePressure;
            // A layer set belongs to one reference pressure: leaving it drops the set.
            onChange({ ref, layerSet: selectedSet && selectedSet.referencePressure !== ref ? null : view.layerSet });
          }}
        >
          {REFERENCE_PRESSURES.map((p) => (
            <option key={p} value={p}>
              {sigmaName(p)} · {p} dbar
            </option>
          ))}
        </SelectField>

        <SelectField
          label="Layer set"
          fieldClassName="w-44"
          value={view.layerSet ?? ''}
          onChange={(e) => {
            const set = layerSets.find((s) => s.id === e.target.value);
            onChange(set ? { layerSet: set.id, ref: set.referencePressure as ReferencePressure } : { layerSet: null });
          }}
        >
          <option value="">Default levels for {sigmaName(view.ref)}</option>
          {layerSets.map((s) => (
            <option key={s.id} value={s.id}>
              {s.name} · {sigmaName(s.referencePressure)} · {s.count} levels
            </option>
          ))}
        </SelectField>

        <div className="flex items-start gap-1">
          <SelectField
            label="Inversion handling"
            fieldClassName="w-48"
            value={view.inversions}
            onChange={(e) => onChange({ inversions: e.target.value as SectionViewState['inversions'] })}
          >
            {INVERSION_HANDLINGS.map((h) => (
              <option key={h} value={h} title={INVERSION_HANDLING_TEXT[h].explain}>
                {INVERSION_HANDLING_TEXT[h].label}
              </option>
            ))}
          </SelectField>
          <InversionHelp />
        </div>

        <SelectField
          label="Interpolation"
          fieldClassName="w-44"
          value={view.interpolation}
          onChange={(e) => onChange({ interpolation: e.target.value as SectionViewState['interpolation'] })}
        >
          {INTERPOLATIONS.map((i) => (
            <option key={i} value={i}>
              {INTERPOLATION_TEXT[i]}
            </option>
          ))}
        </SelectField>

        <SelectField
          label="Density frame shows"
          fieldClassName="w-48"
          value={view.densityShows}
          onChange={(e) => onChange({ densityShows: e.target.value as SectionViewState['densityShows'] })}
        >
          <option value="property">The property on σ</option>
          <option value="depth">Pressure of the isopycnals</option>
        </SelectField>
      </div>
      <details
        className="group border-y border-paper-rule/70"
        open={figureOpen}
        onToggle={(e) => setFigureOpen(e.currentTarget.open)}
      >
        <summary className="cursor-pointer py-1 text-sm text-ink-soft">
          <span className="font-semibold text-ink-strong">Figure</span>{' '}
          <span className="text-ink-muted">
            — palette, contours, axes, colour ranges: {figureSummary(view, autoPaletteLabel)}
          </span>
        </summary>
        <div className="flex flex-wrap items-start gap-x-3 gap-y-2 pb-2 pt-1">
          <ColourRange range={view.range} autoRange={autoRange} onChange={(range) => onChange({ range })} />
          {view.densityShows === 'property' && (
            <ColourRange
              which="density"
              range={view.densityRange}
              autoRange={autoDensityRange}
              onChange={(densityRange) => onChange({ densityRange })}
            />
          )}
          <FigureControls view={view} onChange={onChange} autoPaletteLabel={autoPaletteLabel} />
        </div>
      </details>
    </div>
  );
}

/** The figure choices in a few words, for the closed figure options. */
function figureSummary(view: SectionViewState, autoPaletteLabel?: string): string {
  const palette =
    view.palette === 'auto'
      ? `${autoPaletteLabel ?? 'automatic'} (automatic)`
      : PALETTES[view.palette].label.split(' —')[0];
  const contours =
    view.contours === 'auto'
      ? 'contours automatic'
      : view.contours === 'off'
        ? 'no contours'
        : `contours every ${view.contours}`;
  const axes = `${view.yAxis}${view.stretch ? ' (upper 1000 dbar stretched)' : ''} by ${view.xAxis}`;
  const ranges = view.range || view.densityRange ? 'a fixed colour range' : 'colour ranges automatic';
  return `${palette}, ${contours}, ${axes}, ${ranges}`;
}

/** How the frames are drawn: palette, contours, axes. */
function FigureControls({
  view,
  onChange,
  autoPaletteLabel,
}: {
  view: SectionViewState;
  onChange: (patch: Partial<SectionViewState>) => void;
  autoPaletteLabel?: string;
}) {
  const custom = typeof view.contours === 'number';
  const [interval, setIntervalText] = useState(custom ? String(view.contours) : '');
  useEffect(() => setIntervalText(typeof view.contours === 'number' ? String(view.contours) : ''), [view.contours]);
  return (
    <>
      <SelectField
        label="Palette"
        fieldClassName="w-56"
        value={view.palette}
        onChange={(e) => onChange({ palette: e.target.value as SectionViewState['palette'] })}
      >
        {PALETTE_CHOICES.map((p) => (
          <option key={p} value={p}>
            {p === 'auto' ? `Automatic${autoPaletteLabel ? ` (${autoPaletteLabel})` : ''}` : PALETTES[p].label}
          </option>
        ))}
      </SelectField>
      <div className="flex items-end gap-1">
        <SelectField
          label="Contours"
          fieldClassName="w-32"
          value={custom ? 'every' : String(view.contours)}
          onChange={(e) => {
            const v = e.target.value;
            if (v === 'every') {
              const n = Number(interval);
              if (n > 0) onChange({ contours: n });
              else setIntervalText('');
            } else onChange({ contours: v as 'auto' | 'off' });
          }}
        >
          <option value="auto">Automatic</option>
          <option value="every">Every…</option>
          <option value="off">None</option>
        </SelectField>
        <form
          className="flex items-center gap-1"
          onSubmit={(e) => {
            e.preventDefault();
            const n = Number(interval);
            if (Number.isFinite(n) && n > 0) onChange({ contours: n });
          }}
        >
          <input
            aria-label="Contour interval"
            inputMode="decimal"
            placeholder="interval"
            value={interval}
            onChange={(e) => setIntervalText(e.target.value)}
            className="h-9 w-20 rounded border border-paper-rule bg-paper-raised px-2 font-mono text-sm tabular-nums"
          />
          <Button type="submit" size="sm" aria-label="Use this contour interval">
            Use
          </Button>
        </form>
      </div>
      <SelectField
        label="Vertical axis"
        fieldClassName="w-36"
        value={view.yAxis}
        onChange={(e) => onChange({ yAxis: e.target.value as SectionViewState['yAxis'] })}
      >
        <option value="pressure">Pressure (dbar)</option>
        <option value="depth">Depth (m)</option>
      </SelectField>
      <label className="mt-6 flex items-center gap-1.5 text-sm text-ink-soft">
        <input type="checkbox" checked={view.stretch} onChange={(e) => onChange({ stretch: e.target.checked })} />
        Stretch the upper 1000 dbar
      </label>
      <SelectField
        label="Horizontal axis"
        fieldClassName="w-40"
        value={view.xAxis}
        onChange={(e) => onChange({ xAxis: e.target.value as SectionViewState['xAxis'] })}
      >
        <option value="distance">Distance (km)</option>
        <option value="latitude">Latitude</option>
        <option value="longitude">Longitude</option>
      </SelectField>
    </>
  );
}

function InversionHelp() {
  const id = useId();
  const [open, setOpen] = useState(false);
  return (
    <span className="relative mt-6" onMouseEnter={() => setOpen(true)} onMouseLeave={() => setOpen(false)}>
      <button
        type="button"
        aria-label="What the inversion handlings do"
        aria-describedby={open ? id : undefined}
        aria-expanded={open}
        onFocus={() => setOpen(true)}
        onBlur={() => setOpen(false)}
        onClick={() => setOpen((o) => !o)}
        className="flex size-6 items-center justify-center rounded-full border border-ink/40 font-mono text-xs text-ink hover:bg-ink-wash"
      >
        ?
      </button>
      {open && (
        <span
          id={id}
          role="tooltip"
          className="absolute top-8 left-0 z-20 block w-80 border border-ink/30 bg-paper-raised p-3 text-xs text-ink-strong shadow-md"
        >
          {INVERSION_HANDLINGS.map((h) => (
            <span key={h} className="mb-1.5 block last:mb-0">
              <span className="font-semibold">{INVERSION_HANDLING_TEXT[h].label}.</span>{' '}
              {INVERSION_HANDLING_TEXT[h].explain}
            </span>
          ))}
          <span className="mt-1.5 block text-ink-muted">On a stable cast all three give the same section.</span>
        </span>
      )}
    </span>
  );
}

function ColourRange({
  range,
  autoRange,
  onChange,
  which = 'pressure',
}: {
  range: SectionViewState['range'];
  autoRange: { min: number; max: number } | null;
  onChange: (range: SectionViewState['range']) => void;
  /** Which frame's range: the density frame's inputs and buttons say so in their names. */
  which?: 'pressure' | 'density';
}) {
  const d = which === 'density';
  const [min, setMin] = useState(range ? String(range.min) : '');
  const [max, setMax] = useState(range ? String(range.max) : '');
  const [problem, setProblem] = useState<string | null>(null);
  useEffect(() => {
    setMin(range ? String(range.min) : '');
    setMax(range ? String(range.max) : '');
  }, [range]);

  const apply = (e: FormEvent) => {
    e.preventDefault();
    const lo = Number(min),
      hi = Number(max);
    if (min.trim() === '' || max.trim() === '' || !Number.isFinite(lo) || !Number.isFinite(hi)) {
      setProblem('Give both ends as numbers.');
      return;
    }
    if (lo >= hi) {
      setProblem('The minimum must be below the maximum.');
      return;
    }
    setProblem(null);
    onChange({ min: lo, max: hi });
  };
  const fmt = (v: number) => String(Number(v.toPrecision(4)));

  return (
    <form onSubmit={apply} aria-label={d ? 'Colour range by density' : 'Colour range'} className="flex flex-col gap-1">
      <span className="text-sm font-semibold text-ink-soft">
        Colour range {d ? 'by density' : 'by pressure'}{' '}
        <span className="font-normal text-ink-muted">{range ? 'fixed' : 'automatic'}</span>
      </span>
      <div className="flex items-center gap-1.5">
        <input
          aria-label={d ? 'Density colour range minimum' : 'Colour range minimum'}
          inputMode="decimal"
          value={min}
          placeholder={autoRange ? fmt(autoRange.min) : 'min'}
          onChange={(e) => setMin(e.target.value)}
          aria-invalid={problem ? true : undefined}
          className="h-9 w-20 rounded border border-paper-rule bg-paper-raised px-2 font-mono text-sm tabular-nums"
        />
        <span aria-hidden className="text-ink-muted">
          –
        </span>
        <input
          aria-label={d ? 'Density colour range maximum' : 'Colour range maximum'}
          inputMode="decimal"
          value={max}
          placeholder={autoRange ? fmt(autoRange.max) : 'max'}
          onChange={(e) => setMax(e.target.value)}
          aria-invalid={problem ? true : undefined}
          className="h-9 w-20 rounded border border-paper-rule bg-paper-raised px-2 font-mono text-sm tabular-nums"
        />
        <Button type="submit" size="sm" aria-label={d ? 'Apply the density range' : undefined}>
          Apply
        </Button>
        <Button
          size="sm"
          variant="quiet"
          disabled={!range}
          aria-label={d ? 'Automatic density range' : undefined}
          onClick={() => {
            setProblem(null);
            onChange(null);
          }}
        >
          Auto
        </Button>
      </div>
      {problem && (
        <p role="alert" className="text-xs text-warn-strong">
          {problem}
        </p>
      )}
    </form>
  );
}
