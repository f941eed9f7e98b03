import { useEffect, useId, useMemo, useState, type FormEvent } from 'react';
import { Button } from '../../../components/Button';
import { SelectField, TextField } from '../../../components/Field';
import { ErrorNotice, Progress } from '../../../components/Notice';
import { isApiError } from '../../../lib/http';
import type { CastSummary } from '../../casts';
import { useQuery } from '@tanstack/react-query';
import { castQuery } from '../../castsheet';
import { useCreateDerivedVariable, useFormulaPreview } from '../api';
import { formulaProblemOf, validateDerived, type NewDerivedVariable } from '../types';
import { FormulaProblemView } from './FormulaProblemView';
import { PreviewPlot } from './PreviewPlot';

function useDebounced<T>(value: T, ms: number): T {
  const [v, setV] = useState(value);
  useEffect(() => {
    const t = setTimeout(() => setV(value), ms);
    return () => clearTimeout(t);
  }, [value, ms]);
  return v;
}

/** Column names of a cast a formula may use (the columns and kept extra variables). */
export function columnNamesOf(
  cast: { columns: Record<string, unknown>; extras: Record<string, unknown> } | undefined,
): string[] {
  if (!cast) return [];
  return [...Object.keys(cast.columns), ...Object.keys(cast.extras)]
    .filter((n) => n !== 'p_mid' && n !== 'N2')
    .sort((a, b) => a.localeCompare(b));
}

const EMPTY: NewDerivedVariable = { name: '', formula: '', unit: '', description: '' };

/**
 * A new derived variable: a name, a mathjs formula over the cast columns (listed, and insertable),
 * a unit and a description; previewed live on a chosen cast through the preview route, with the
 * parser's error shown inline at its position.
 */
export function DerivedForm({
  cruiseId,
  casts,
  taken,
  previewDelayMs = 400,
}: {
  cruiseId: string;
  casts: readonly CastSummary[];
  taken: readonly string[];
  previewDelayMs?: number;
}) {
  const [input, setInput] = useState<NewDerivedVariable>(EMPTY);
  const [errors, setErrors] = useState<Partial<Record<keyof NewDerivedVariable, string>>>({});
  const [castId, setCastId] = useState<string | null>(casts[0]?.id ?? null);
  const create = useCreateDerivedVariable(cruiseId);
  const formulaHint = useId();
  const cast = useQuery({ ...castQuery(castId ?? ''), enabled: castId !== null });
  const debounced = useDebounced(input.formula, previewDelayMs);
  const preview = useFormulaPreview(castId, debounced);

  useEffect(() => {
    if (castId === null && casts.length > 0) setCastId(casts[0].id);
  }, [casts, castId]);

  const columns = useMemo(() => {
    // The cast's own columns, plus any name the preview reports reading (derived variables, say).
    return [...new Set([...columnNamesOf(cast.data), ...(preview.data?.variables ?? [])])].sort((a, b) =>
      a.localeCompare(b),
    );
  }, [preview.data, cast.data]);

  const change = (key: keyof NewDerivedVariable, value: string) => {
    setInput((v) => ({ ...v, [key]: value }));
    setErrors((e) => ({ ...e, [key]: undefined }));
    if (create.isError) create.reset();
  };

  const submit = (e: FormEvent) => {
    e.preventDefault();
    const found = validateDerived(input, [...taken, ...columns]);
    setErrors(found);
    if (Object.keys(found).length > 0) return;
    const body: NewDerivedVariable = {
      name: input.name.trim(),
      formula: input.formula.trim(),
      ...(input.unit?.trim() ? { unit: input.unit.trim() } : {}),
      ...(input.description?.trim() ? { description: input.description.trim() } : {}),
    };
    create.mutate(body, { onSuccess: () => setInput(EMPTY) });
  };

  // The formula problem to show: from saving (the server's word) first, else from the live preview,
  // but only for the text now in the field.
  const saveProblem = create.isError ? formulaProblemOf(create.error) : null;
  const saveFields = create.isError && isApiError(create.error, 400) ? create.error.fieldErrors() : {};
  const saveFormulaProblem =
    saveProblem && (saveFields.formula !== undefined || Object.keys(saveFields).length === 0) ? saveProblem : null;
  const previewProblem =
    preview.isError && debounced.trim() === input.formula.trim() ? formulaProblemOf(preview.error) : null;
  const problem = saveFormulaProblem ?? previewProblem;
  const castLabel = (() => {
    const c = casts.find((x) => x.id === castId);
    return c ? `station ${c.station} cast ${c.cast}` : 'the chosen cast';
  })();

  return (
    <form
      onSubmit={submit}
      noValidate
      aria-label="New derived variable"
      className="grid gap-4 px-4 py-3 lg:grid-cols-[minmax(0,1fr)_minmax(0,0.9fr)]"
    >
      <div className="flex min-w-0 flex-col gap-3">
        <div className="grid grid-cols-[minmax(0,1fr)_9rem] gap-3">
          <TextField
            label="Name"
            mono
            value={input.name}
            error={errors.name ?? saveFields.name}
            onChange={(e) => change('name', e.target.value)}
            placeholder="spice_anom"
          />
          <TextField
            label="Unit"
            optional
            mono
            value={input.unit}
            error={saveFields.unit}
            onChange={(e) => change('unit', e.target.value)}
            placeholder="kg/m³"
          />
        </div>
        <div className="flex flex-col gap-1">
          <label htmlFor={`${formulaHint}-f`} className="text-sm font-semibold text-ink-soft">
            Formula
          </label>
          <textarea
            id={`${formulaHint}-f`}
            value={input.formula}
            onChange={(e) => change('formula', e.target.value)}
            spellCheck={false}
            rows={3}
            placeholder="sigma2 - sigma0"
            aria-invalid={problem || errors.formula ? true : undefined}
            aria-describedby={problem ? `${formulaHint}-problem` : `${formulaHint}-hint`}
            className={`w-full rounded border bg-paper-raised px-2.5 py-2 font-mono text-sm text-ink-strong placeholder:text-ink-faint focus:outline-2 focus:outline-ink/70 ${problem || errors.formula ? 'border-warn' : 'border-paper-rule'}`}
          />
          {errors.formula && <p className="text-sm text-warn-strong">{errors.formula}</p>}
          {problem && <FormulaProblemView id={`${formulaHint}-problem`} formula={input.formula} problem={problem} />}
          <p id={`${formulaHint}-hint`} className="text-xs text-ink-muted">
            mathjs expressions over the cast’s columns, level by level: + − * / ^, sqrt, log, exp, abs, min, max… Click
            a name to insert it.
          </p>
        </div>
        <div>
          <p className="mb-1 text-xs font-semibold uppercase tracking-[0.08em] text-ink-muted">
            Columns of {castLabel}
          </p>
          <ul aria-label="Available columns" className="flex flex-wrap gap-1">
            {columns.map((c) => (
              <li key={c}>
                <button
                  type="button"
                  onClick={() =>
                    change('formula', `${input.formula}${input.formula && !/\s$/.test(input.formula) ? ' ' : ''}${c}`)
                  }
                  className="rounded-sm border border-paper-rule bg-paper px-1.5 py-px font-mono text-xs text-ink hover:border-ink/40 hover:bg-ink-wash"
                  aria-label={`Insert ${c}`}
                >
                  {c}
                </button>
              </li>
            ))}
            {columns.length === 0 && (
              <li className="text-xs text-ink-muted">
                {cast.isPending && castId ? 'loading…' : 'Choose a cast to see its columns.'}
              </li>
            )}
          </ul>
        </div>
        <TextField
          label="Description"
          optional
          value={input.description}
          onChange={(e) => change('description', e.target.value)}
          placeholder="What it is and why; shown in the section picker"
        />
        {create.isError && !saveFormulaProblem && Object.keys(saveFields).length === 0 && (
          <ErrorNotice error={create.error} title="The variable was not saved" />
        )}
        <div>
          <Button type="submit" variant="primary" busy={create.isPending}>
            Add derived variable
          </Button>
        </div>
      </div>
      <div className="flex min-w-0 flex-col gap-2">
        <SelectField label="Preview on cast" value={castId ?? ''} onChange={(e) => setCastId(e.target.value || null)}>
          {casts.length === 0 && <option value="">no casts yet</option>}
          {casts.map((c) => (
            <option key={c.id} value={c.id}>
              {c.station} · cast {c.cast}
            </option>
          ))}
        </SelectField>
        <div className="relative min-h-[340px] border border-paper-rule bg-paper-raised">
          {!input.formula.trim() ? (
            <p className="px-4 py-6 text-sm text-ink-muted">
              Write a formula to see it drawn against pressure on this cast.
            </p>
          ) : preview.isPending && preview.fetchStatus === 'fetching' ? (
            <Progress label="Evaluating the formula on the cast…" />
          ) : preview.data && !previewProblem ? (
            <>
              {preview.isFetching && (
                <span className="absolute top-1 right-2 z-10 text-2xs text-ink-muted">updating…</span>
              )}
              <PreviewPlot
                preview={preview.data}
                name={input.name.trim()}
                unit={input.unit?.trim() || null}
                castLabel={castLabel}
              />
            </>
          ) : previewProblem ? (
            <p className="px-4 py-6 text-sm text-ink-muted">The preview waits for a formula that parses.</p>
          ) : preview.isError ? (
            <div className="p-3">
              <ErrorNotice error={preview.error} title="The preview failed" />
            </div>
          ) : null}
        </div>
      </div>
    </form>
  );
}
