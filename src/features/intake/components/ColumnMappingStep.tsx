import { useState, type FormEvent } from 'react';
import { Button } from '../../../components/Button';
import { ErrorNotice } from '../../../components/Notice';
import { useColumnMapping, useRetryUpload, useSaveColumnMapping } from '../api';
import { COLUMN_ROLES, COLUMN_ROLE_LABELS, type ColumnMapping, type ColumnRole } from '../types';

/**
 * The step a failed upload with unrecognised headers asks for: one select per header, saved as the
 * cruise's mapping (so the next file with the same headers goes straight through), then the file is
 * processed again.
 */
export function ColumnMappingStep({
  cruiseId,
  uploadId,
  filename,
  headers,
  onDone,
}: {
  cruiseId: string;
  uploadId: string;
  filename: string;
  headers: readonly string[];
  onDone?: () => void;
}) {
  const remembered = useColumnMapping(cruiseId);
  const save = useSaveColumnMapping(cruiseId);
  const retry = useRetryUpload(cruiseId);
  const [chosen, setChosen] = useState<Record<string, ColumnRole | ''>>({});
  const [missing, setMissing] = useState<string[]>([]);

  const roleOf = (h: string): ColumnRole | '' => chosen[h] ?? remembered.data?.[h] ?? '';

  const submit = async (e: FormEvent) => {
    e.preventDefault();
    const unset = headers.filter((h) => roleOf(h) === '');
    setMissing(unset);
    if (unset.length > 0) return;
    const mapping: ColumnMapping = Object.fromEntries(headers.map((h) => [h, roleOf(h) as ColumnRole]));
    try {
      await save.mutateAsync(mapping);
      await retry.mutateAsync(uploadId);
      onDone?.();
    } catch {
      // shown below from the mutation state
    }
  };

  const busy = save.isPending || retry.isPending;
  return (
    <form
      onSubmit={submit}
      noValidate
      aria-label={`Column mapping for ${filename}`}
      className="flex flex-col gap-3 border border-paper-rule bg-paper px-3 py-3"
    >
      <div>
        <p className="text-sm font-semibold text-ink-strong">Tell Sigmaline what these columns are</p>
        <p className="text-xs text-ink-muted">
          {headers.length === 1 ? 'One header' : `${headers.length} headers`} of {filename} were not recognised. The
          mapping is remembered for this cruise, so later files with the same headers need no answer.
        </p>
      </div>
      <div className="grid grid-cols-[repeat(auto-fill,minmax(15rem,1fr))] gap-x-4 gap-y-2">
        {headers.map((h) => {
          const unset = missing.includes(h) && roleOf(h) === '';
          const id = `map-${uploadId}-${h}`;
          return (
            <div key={h} className="flex flex-col gap-1">
              <label htmlFor={id} className="text-xs text-ink-soft">
                Column <span className="font-mono font-semibold text-ink-strong">{h}</span>
              </label>
              <select
                id={id}
                aria-label={`Role of column ${h}`}
                aria-invalid={unset || undefined}
                value={roleOf(h)}
                onChange={(e) => setChosen((c) => ({ ...c, [h]: e.target.value as ColumnRole | '' }))}
                className={`h-8 rounded border bg-paper-raised px-2 text-sm text-ink-strong ${unset ? 'border-warn' : 'border-paper-rule'}`}
              >
                <option value="">Choose…</option>
                {COLUMN_ROLES.map((r) => (
                  <option key={r} value={r}>
                    {COLUMN_ROLE_LABELS[r]}
                  </option>
                ))}
              </select>
            </div>
          );
        })}
      </div>
      {missing.some((h) => roleOf(h) === '') && (
        <p role="alert" className="text-sm text-warn-strong">
          Choose a role for every column (or “Ignore this column”): {missing.filter((h) => roleOf(h) === '').join(', ')}
          .
        </p>
      )}
      {save.isError && <ErrorNotice error={save.error} title="The mapping was not saved" />}
      {retry.isError && <ErrorNotice error={retry.error} title="The file was not queued again" />}
      <div>
        <Button type="submit" variant="primary" size="sm" busy={busy}>
          Save mapping and process again
        </Button>
      </div>
    </form>
  );
}
