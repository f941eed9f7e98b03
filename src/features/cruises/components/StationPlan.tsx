import { useState, type FormEvent } from 'react';
import { Button } from '../../../components/Button';
import { TextField } from '../../../components/Field';
import { ErrorNotice, InfoNotice } from '../../../components/Notice';
import { EmptyState } from '../../../components/Panel';
import { formatLatitude, formatLongitude } from '../../../lib/format';
import { isApiError } from '../../../lib/http';
import { useAddStation } from '../api';
import { fieldErrorsOf, newStationSchema, type Station } from '../types';

/** The planned stations, in order; numbers right-aligned in the monospaced face. */
export function StationList({ stations }: { stations: readonly Station[] }) {
  const ordered = [...stations].sort((a, b) => a.order - b.order);
  if (ordered.length === 0) {
    return (
      <EmptyState title="No stations planned yet">
        The chief scientist adds the planned stations of the line here.
      </EmptyState>
    );
  }
  return (
    <div className="max-h-[22rem] overflow-auto">
      <table className="w-full border-collapse text-sm" aria-label="Planned stations">
        <thead className="sticky top-0 bg-paper-raised">
          <tr className="border-b border-paper-rule text-left text-xs uppercase tracking-[0.08em] text-ink-muted">
            <th scope="col" className="px-3 py-1.5 text-right font-semibold">
              #
            </th>
            <th scope="col" className="px-3 py-1.5 font-semibold">
              Station
            </th>
            <th scope="col" className="px-3 py-1.5 text-right font-semibold">
              Latitude
            </th>
            <th scope="col" className="px-3 py-1.5 text-right font-semibold">
              Longitude
            </th>
            <th scope="col" className="px-3 py-1.5 text-right font-semibold">
              Depth (m)
            </th>
            <th scope="col" className="px-3 py-1.5 font-semibold">
              Status
            </th>
          </tr>
        </thead>
        <tbody className="font-mono text-[0.8rem] tabular-nums">
          {ordered.map((s) => (
            <tr key={s.id} className="border-b border-paper-rule/70 last:border-0 hover:bg-ink-wash/40">
              <td className="px-3 py-1 text-right text-ink-muted">{s.order}</td>
              <td className="px-3 py-1 font-semibold text-ink-strong">{s.name}</td>
              <td className="px-3 py-1 text-right">{formatLatitude(s.latitude)}</td>
              <td className="px-3 py-1 text-right">{formatLongitude(s.longitude)}</td>
              <td className="px-3 py-1 text-right">{s.plannedDepth ?? '—'}</td>
              <td className="px-3 py-1 font-sans">
                {s.occupied ? (
                  <span className="inline-flex items-center gap-1.5 text-ink">
                    <span aria-hidden className="size-2 rounded-full bg-ink" />
                    Occupied
                  </span>
                ) : (
                  <span className="inline-flex items-center gap-1.5 text-ink-muted">
                    <span aria-hidden className="size-2 rounded-full border border-ink" />
                    Planned
                  </span>
                )}
              </td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}

const EMPTY = { name: '', latitude: '', longitude: '', plannedDepth: '' };

/** Add one planned station (chief scientist). Decimal degrees, south and west negative. */
export function AddStationForm({ cruiseId }: { cruiseId: string }) {
  const [values, setValues] = useState(EMPTY);
  const [errors, setErrors] = useState<Record<string, string>>({});
  const [added, setAdded] = useState<string | null>(null);
  const add = useAddStation(cruiseId);

  const set = (field: keyof typeof EMPTY) => (e: { target: { value: string } }) => {
    const value = e.target.value;
    setValues((v) => ({ ...v, [field]: value }));
    setAdded(null);
  };

  const submit = (e: FormEvent<HTMLFormElement>) => {
    e.preventDefault();
    const parsed = newStationSchema.safeParse(values);
    if (!parsed.success) {
      setErrors(fieldErrorsOf(parsed.error));
      return;
    }
    setErrors({});
    add.mutate(parsed.data, {
      onSuccess: (station) => {
        setValues(EMPTY);
        setAdded(station.name);
      },
      onError: (error) => {
        if (isApiError(error, 400)) setErrors(error.fieldErrors());
      },
    });
  };

  return (
    <form
      onSubmit={submit}
      noValidate
      aria-label="Add a planned station"
      className="flex flex-col gap-3 border-t border-paper-rule p-4"
    >
      <div className="grid grid-cols-2 items-start gap-3 2xl:grid-cols-4">
        <TextField
          label="Station name"
          value={values.name}
          onChange={set('name')}
          error={errors.name}
          mono
          placeholder="K-07"
          autoComplete="off"
        />
        <TextField
          label="Latitude (°)"
          value={values.latitude}
          onChange={set('latitude')}
          error={errors.latitude}
          mono
          inputMode="decimal"
          placeholder="-35.250"
          autoComplete="off"
        />
        <TextField
          label="Longitude (°)"
          value={values.longitude}
          onChange={set('longitude')}
          error={errors.longitude}
          mono
          inputMode="decimal"
          placeholder="-20.500"
          autoComplete="off"
        />
        <TextField
          label="Planned depth (m)"
          value={values.plannedDepth}
          onChange={set('plannedDepth')}
          error={errors.plannedDepth}
          optional
          mono
          inputMode="numeric"
          autoComplete="off"
        />
      </div>
      <div className="flex items-center gap-3">
        <Button type="submit" variant="primary" className="whitespace-nowrap" busy={add.isPending}>
          Add station
        </Button>
        <p className="text-xs text-ink-muted">
          Decimal degrees; south and west are negative. New stations go to the end of the line.
        </p>
      </div>
      {add.error && !isApiError(add.error, 400) && <ErrorNotice error={add.error} title="The station was not added" />}
      {added && <InfoNotice>Station {added} added to the plan.</InfoNotice>}
    </form>
  );
}
