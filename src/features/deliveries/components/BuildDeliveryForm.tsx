import { useState, type FormEvent } from 'react';
import { Button } from '../../../components/Button';
import { SelectField, TextField } from '../../../components/Field';
import { ErrorNotice, InfoNotice } from '../../../components/Notice';
import { useBuildDelivery, useDeliveries } from '../api';
import { DEFAULT_FORM, validateDeliveryForm, type DeliveryFormErrors, type LayerSetChoice } from '../form';
import {
  DELIVERY_FORMATS,
  DELIVERY_KINDS,
  FLAG_MEANINGS,
  FORMAT_TEXT,
  KIND_TEXT,
  type DeliveryFormValues,
} from '../types';

const SIGMA = (ref: number) => `σ${ref / 1000}`;

/** Build a delivery: what kind, from which choices, which flags, which formats. */
export function BuildDeliveryForm({
  cruiseId,
  layerSets,
  line = null,
}: {
  cruiseId: string;
  layerSets: readonly LayerSetChoice[];
  line?: string | null;
}) {
  const [values, setValues] = useState<DeliveryFormValues>(DEFAULT_FORM);
  const [errors, setErrors] = useState<DeliveryFormErrors>({});
  const build = useBuildDelivery(cruiseId);
  // the delivery this form started, as the (polled) list now shows it: the notice follows its state
  const list = useDeliveries(cruiseId);
  const started = build.data ? (list.data?.find((d) => d.id === build.data.id) ?? build.data) : null;
  const set = (patch: Partial<DeliveryFormValues>) => {
    setValues((v) => ({ ...v, ...patch }));
    // A changed form is a new delivery: the last one's notice no longer applies.
    if (build.isSuccess || build.isError) build.reset();
  };
  const selectedSet = layerSets.find((s) => s.id === values.layerSetId);
  const usesIsopycnals = values.kind === 'isopycnal' || values.kind === 'package';
  const usesBins = values.kind === 'pressure' || values.kind === 'package';

  const submit = (e: FormEvent) => {
    e.preventDefault();
    const result = validateDeliveryForm(values, layerSets);
    if (!result.ok) {
      setErrors(result.errors);
      return;
    }
    setErrors({});
    // the line the delivery is drawn from (docs/lines.md); without it, the default line
    build.mutate(line ? { ...result.body, line } : result.body);
  };

  const toggle = <T,>(list: readonly T[], item: T): T[] =>
    list.includes(item) ? list.filter((x) => x !== item) : [...list, item];

  return (
    <form onSubmit={submit} noValidate aria-label="Build a delivery" className="flex flex-col gap-4 p-4">
      <fieldset className="flex flex-col gap-1.5">
        <legend className="mb-1 text-sm font-semibold text-ink-soft">Kind</legend>
        {DELIVERY_KINDS.map((k) => (
          <label key={k} className="flex items-start gap-2 text-sm">
            <input
              type="radio"
              name="kind"
              value={k}
              checked={values.kind === k}
              onChange={() => set({ kind: k })}
              className="mt-1"
            />
            <span>
              <span className="font-semibold text-ink-strong">{KIND_TEXT[k].label}</span>
              <span className="block text-xs text-ink-muted">{KIND_TEXT[k].explain}</span>
            </span>
          </label>
        ))}
      </fieldset>

      {usesIsopycnals && (
        <div className="grid grid-cols-2 gap-3">
          <SelectField
            label="Layer set"
            value={values.layerSetId}
            onChange={(e) => set({ layerSetId: e.target.value })}
            fieldClassName="col-span-2"
          >
            <option value="">Default levels of the reference pressure</option>
            {layerSets.map((s) => (
              <option key={s.id} value={s.id}>
                {s.name} · {SIGMA(s.referencePressure)} · {s.levels}
              </option>
            ))}
          </SelectField>
          <SelectField
            label="Reference pressure"
            value={selectedSet ? String(selectedSet.referencePressure) : values.ref}
            disabled={!!selectedSet}
            hint={selectedSet ? 'Set by the layer set.' : undefined}
            error={errors.ref}
            onChange={(e) => set({ ref: e.target.value })}
          >
            {[0, 1000, 2000, 3000, 4000].map((p) => (
              <option key={p} value={p}>
                {SIGMA(p)} · {p} dbar
              </option>
            ))}
          </SelectField>
          <SelectField
            label="Inversion handling"
            value={values.inversions}
            onChange={(e) => set({ inversions: e.target.value as DeliveryFormValues['inversions'] })}
          >
            <option value="sort">Sort (reorder parcels)</option>
            <option value="drop">Drop inverted levels</option>
            <option value="raw">Raw (first crossing)</option>
          </SelectField>
          <SelectField
            label="Interpolation"
            value={values.interpolation}
            onChange={(e) => set({ interpolation: e.target.value as DeliveryFormValues['interpolation'] })}
          >
            <option value="linear">Linear in σ</option>
            <option value="pchip">Monotone cubic</option>
          </SelectField>
        </div>
      )}

      {usesBins && (
        <TextField
          label="Pressure bin (dbar)"
          mono
          inputMode="decimal"
          value={values.bin}
          error={errors.bin}
          onChange={(e) => set({ bin: e.target.value })}
          fieldClassName="w-40"
        />
      )}

      <fieldset aria-describedby={errors.flags ? 'flags-error' : undefined}>
        <legend className="mb-1 text-sm font-semibold text-ink-soft">Quality flags to include</legend>
        <div className="grid grid-cols-3 gap-x-3 gap-y-1">
          {Object.entries(FLAG_MEANINGS).map(([flag, meaning]) => {
            const f = Number(flag);
            return (
              <label key={flag} className="flex items-center gap-1.5 text-sm">
                <input
                  type="checkbox"
                  checked={values.flags.includes(f)}
                  onChange={() => set({ flags: toggle(values.flags, f) })}
                  aria-label={`Flag ${f}: ${meaning}`}
                />
                <span className="font-mono text-ink-strong">{f}</span>
                <span className="text-ink-soft">{meaning}</span>
              </label>
            );
          })}
        </div>
        {errors.flags && (
          <p id="flags-error" className="mt-1 text-sm text-warn-strong">
            {errors.flags}
          </p>
        )}
      </fieldset>

      <fieldset aria-describedby={errors.formats ? 'formats-error' : undefined}>
        <legend className="mb-1 text-sm font-semibold text-ink-soft">Formats</legend>
        <div className="flex flex-wrap gap-x-4 gap-y-1">
          {DELIVERY_FORMATS.map((f) => (
            <label key={f} className="flex items-center gap-1.5 text-sm">
              <input
                type="checkbox"
                checked={values.formats.includes(f)}
                onChange={() => set({ formats: toggle(values.formats, f) })}
              />
              {FORMAT_TEXT[f]}
            </label>
          ))}
        </div>
        {errors.formats && (
          <p id="formats-error" className="mt-1 text-sm text-warn-strong">
            {errors.formats}
          </p>
        )}
      </fieldset>

      {build.isError && <ErrorNotice error={build.error} title="The delivery was not started" />}
      {started && (started.status === 'queued' || started.status === 'building') && (
        <InfoNotice>
          Building the {KIND_TEXT[started.kind].label.toLowerCase()} — its progress shows in the list.
        </InfoNotice>
      )}
      {started?.status === 'ready' && (
        <InfoNotice>
          The {KIND_TEXT[started.kind].label.toLowerCase()} is built ({started.files.length}{' '}
          {started.files.length === 1 ? 'file' : 'files'}): download or release it in the list.
        </InfoNotice>
      )}
      {started?.status === 'failed' && (
        <div role="alert" className="border-l-2 border-warn bg-warn-wash/60 px-3 py-1.5 text-sm text-warn-strong">
          The build failed{started.error ? `: ${started.error}` : '.'}
        </div>
      )}
      <div>
        <Button type="submit" variant="primary" busy={build.isPending}>
          Build delivery
        </Button>
      </div>
    </form>
  );
}
