import { useEffect, useId, useState, type FormEvent } from 'react';
import { Button } from '../../../components/Button';
import { SelectField } from '../../../components/Field';
import { SECTION_PROPERTIES } from '../properties';
import { INTERPOLATIONS, INVERSION_HANDLINGS, REFERENCE_PRESSURES, type DerivedVariable, type LayerSet, type ReferencePressure } from '../types';
import { INTERPOLATION_TEXT, INVERSION_HANDLING_TEXT, sigmaName, type SectionViewState } from '../viewState';

export interface SectionControlsProps {
  view: SectionViewState;
  onChange: (patch: Partial<SectionViewState>) => void;
  layerSets: readonly LayerSet[];
  derived: readonly DerivedVariable[];
  /** The automatic colour range, shown as the placeholder of the min/max inputs. */
  autoRange: { min: number; max: number } | null;
}

/** The controls above the section; every one writes the view state (and so the URL). */
export function SectionControls({ view, onChange, layerSets, derived, autoRange }: SectionControlsProps) {
  const derivedNames = derived.map((d) => d.name);
  const propertyKnown = SECTION_PROPERTIES.some((p) => p.name === view.property) || derivedNames.includes(view.property);
  const selectedSet = layerSets.find((s) => s.id === view.layerSet);

  return (
    <div role="group" aria-label="Section controls" className="flex flex-wrap items-start gap-x-4 gap-y-3">
      <SelectField
        label="Property"
        fieldClassName="w-64"
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
        fieldClassName="w-40"
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
        fieldClassName="w-52"
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
        fieldClassName="w-56"
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
        fieldClassName="w-52"
        value={view.densityShows}
        onChange={(e) => onChange({ densityShows: e.target.value as SectionViewState['densityShows'] })}
      >
        <option value="property">The property on σ</option>
        <option value="depth">Pressure of the isopycnals</option>
      </SelectField>

      <ColourRange range={view.range} autoRange={autoRange} onChange={(range) => onChange({ range })} />
    </div>
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
              <span className="font-semibold">{INVERSION_HANDLING_TEXT[h].label}.</span> {INVERSION_HANDLING_TEXT[h].explain}
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
}: {
  range: SectionViewState['range'];
  autoRange: { min: number; max: number } | null;
  onChange: (range: SectionViewState['range']) => void;
}) {
  const [min, setMin] = useState(range ? String(range.min) : '');
  const [max, setMax] = useState(range ? String(range.max) : '');
  const [problem, setProblem] = useState<string | null>(null);
  useEffect(() => {
    setMin(range ? String(range.min) : '');
    setMax(range ? String(range.max) : '');
  }, [range]);

  const apply = (e: FormEvent) => {
    e.preventDefault();
    const lo = Number(min), hi = Number(max);
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
    <form onSubmit={apply} aria-label="Colour range" className="flex flex-col gap-1">
      <span className="text-sm font-semibold text-ink-soft">
        Colour range <span className="font-normal text-ink-muted">{range ? 'fixed' : 'automatic'}</span>
      </span>
      <div className="flex items-center gap-1.5">
        <input
          aria-label="Colour range minimum"
          inputMode="decimal"
          value={min}
          placeholder={autoRange ? fmt(autoRange.min) : 'min'}
          onChange={(e) => setMin(e.target.value)}
          aria-invalid={problem ? true : undefined}
          className="h-9 w-20 rounded border border-paper-rule bg-paper-raised px-2 font-mono text-sm tabular-nums"
        />
        <span aria-hidden className="text-ink-muted">–</span>
        <input
          aria-label="Colour range maximum"
          inputMode="decimal"
          value={max}
          placeholder={autoRange ? fmt(autoRange.max) : 'max'}
          onChange={(e) => setMax(e.target.value)}
          aria-invalid={problem ? true : undefined}
          className="h-9 w-20 rounded border border-paper-rule bg-paper-raised px-2 font-mono text-sm tabular-nums"
        />
        <Button type="submit" size="sm">Apply</Button>
        <Button size="sm" variant="quiet" disabled={!range} onClick={() => { setProblem(null); onChange(null); }}>
          Auto
        </Button>
      </div>
      {problem && <p role="alert" className="text-xs text-warn-strong">{problem}</p>}
    </form>
  );
}
