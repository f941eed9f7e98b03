import { useEffect, useState, type FormEvent } from 'react';
import { Button } from '../../../components/Button';
import { SelectField, TextField } from '../../../components/Field';
import { ErrorNotice, InfoNotice } from '../../../components/Notice';
import { useSetFlag } from '../api';
import { FLAG_CHOICES, FLAG_VARIABLE_LABELS, levelsInRange, validateFlagForm, type FlagFormValues } from '../profiles';
import { FLAG_VARIABLES, type FlagVariable } from '../types';

const EMPTY: FlagFormValues = { variable: '', pFrom: '', pTo: '', flag: '', reason: '' };

export interface FlagFormProps {
  cruiseId: string;
  castId: string;
  pressure: readonly (number | null)[];
  /** A range picked on the plot or in a table; each new pick fills the pressure fields (and the variable and
   * flag when the pick names them: a proposal, an inversion, a flagged range). */
  picked?: { pFrom: number; pTo: number; at: number; variable?: string; flag?: number } | null;
  /** The range as typed, for the plot to outline (null when it is not two numbers in order). */
  onRangeChange?: (range: { pFrom: number; pTo: number } | null) => void;
  /** Ask the plot to switch box-select on. */
  onPickOnPlot?: () => void;
  picking?: boolean;
}

/**
 * Quality flags on a level range: the variable, the pressure range (typed, or box-selected on the
 * plot), the flag on the community 1–9 scale and the reason that goes in the audit trail.
 */
export function FlagForm({
  cruiseId,
  castId,
  pressure,
  picked,
  onRangeChange,
  onPickOnPlot,
  picking = false,
}: FlagFormProps) {
  const [values, setValues] = useState<FlagFormValues>(EMPTY);
  const [errors, setErrors] = useState<Partial<Record<keyof FlagFormValues, string>>>({});
  const [done, setDone] = useState<string | null>(null);
  const setFlag = useSetFlag(cruiseId, castId);

  useEffect(() => {
    if (picked) {
      const variable = (FLAG_VARIABLES as readonly string[]).includes(picked.variable ?? '')
        ? (picked.variable as FlagVariable)
        : null;
      const flag = FLAG_CHOICES.some((c) => c.value === picked.flag) ? String(picked.flag) : null;
      setValues((v) => ({
        ...v,
        pFrom: String(picked.pFrom),
        pTo: String(picked.pTo),
        ...(variable ? { variable } : {}),
        ...(flag ? { flag } : {}),
      }));
      setDone(null);
      setErrors((e) => ({ ...e, pFrom: undefined, pTo: undefined }));
    }
  }, [picked]);

  useEffect(() => {
    const a = Number(values.pFrom);
    const b = Number(values.pTo);
    const ok =
      values.pFrom.trim() !== '' && values.pTo.trim() !== '' && Number.isFinite(a) && Number.isFinite(b) && b >= a;
    onRangeChange?.(ok ? { pFrom: a, pTo: b } : null);
  }, [values.pFrom, values.pTo, onRangeChange]);

  const set = (field: keyof FlagFormValues) => (value: string) => {
    setValues((v) => ({ ...v, [field]: value }));
    setDone(null);
  };

  const submit = (e: FormEvent) => {
    e.preventDefault();
    const result = validateFlagForm(values, pressure);
    setErrors(result.ok ? {} : result.errors);
    if (!result.ok) return;
    setFlag.mutate(result.edit, {
      onSuccess: ({ levels }) => {
        setDone(
          `Flag ${result.edit.flag} set on ${levels} ${levels === 1 ? 'level' : 'levels'} of ${FLAG_VARIABLE_LABELS[result.edit.variable].toLowerCase()}, ${result.edit.pFrom}–${result.edit.pTo} dbar. The cast and the sections are recomputed.`,
        );
        setValues((v) => ({ ...v, reason: '' }));
      },
    });
  };

  const a = Number(values.pFrom);
  const b = Number(values.pTo);
  const preview =
    values.pFrom.trim() && values.pTo.trim() && Number.isFinite(a) && Number.isFinite(b) && b >= a
      ? levelsInRange(pressure, a, b)
      : null;

  return (
    <form onSubmit={submit} noValidate aria-label="Set quality flags" className="flex flex-col gap-3 px-4 py-3">
      <div className="grid grid-cols-2 gap-3">
        <SelectField
          label="Variable"
          value={values.variable}
          error={errors.variable}
          onChange={(e) => set('variable')(e.target.value)}
        >
          <option value="">Choose…</option>
          {FLAG_VARIABLES.map((v) => (
            <option key={v} value={v}>
              {FLAG_VARIABLE_LABELS[v]}
            </option>
          ))}
        </SelectField>
        <SelectField label="Flag" value={values.flag} error={errors.flag} onChange={(e) => set('flag')(e.target.value)}>
          <option value="">Choose…</option>
          {FLAG_CHOICES.map((c) => (
            <option key={c.value} value={c.value}>
              {c.label}
            </option>
          ))}
        </SelectField>
        <TextField
          label="From (dbar)"
          mono
          inputMode="decimal"
          value={values.pFrom}
          error={errors.pFrom}
          onChange={(e) => set('pFrom')(e.target.value)}
        />
        <TextField
          label="To (dbar)"
          mono
          inputMode="decimal"
          value={values.pTo}
          error={errors.pTo}
          onChange={(e) => set('pTo')(e.target.value)}
        />
      </div>
      <div className="flex flex-wrap items-center gap-x-3 gap-y-1 text-xs text-ink-muted">
        {onPickOnPlot && (
          <Button size="sm" variant={picking ? 'primary' : 'secondary'} onClick={onPickOnPlot} aria-pressed={picking}>
            {picking ? 'Drag on the plot, any direction…' : 'Pick the range on the plot'}
          </Button>
        )}
        <span aria-live="polite">
          {preview == null ? (
            'Type a range or pick it on the plot.'
          ) : (
            <>
              <span className="font-mono tabular-nums">{preview}</span> {preview === 1 ? 'level' : 'levels'} in the
              range
            </>
          )}
        </span>
      </div>
      <p className="text-xs text-ink-soft" data-testid="flag-preview">
        {preview == null || preview === 0 || !values.variable || !values.flag
          ? 'Choose the variable, the range and the flag; the count of levels it will change shows here.'
          : `Set flag will flag ${preview} ${preview === 1 ? 'level' : 'levels'} of ${values.variable === 'all' ? 'every sensor' : FLAG_VARIABLE_LABELS[values.variable].toLowerCase()} as ${values.flag}.`}
      </p>
      <TextField
        label="Reason"
        optional={!(values.flag === '3' || values.flag === '4' || values.flag === '9')}
        value={values.reason}
        error={errors.reason}
        maxLength={500}
        placeholder="e.g. conductivity cell fouled on the downcast"
        onChange={(e) => set('reason')(e.target.value)}
      />
      {setFlag.isError && <ErrorNotice error={setFlag.error} title="The flag was not set" />}
      {done && <InfoNotice>{done}</InfoNotice>}
      <div>
        <Button type="submit" variant="primary" busy={setFlag.isPending}>
          Set flag
        </Button>
      </div>
    </form>
  );
}
