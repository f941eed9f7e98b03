import { useState, type ChangeEvent } from 'react';
import { z } from 'zod';
import { Button } from '../../../components/Button';
import { SelectField, TextAreaField } from '../../../components/Field';
import { ErrorNotice, InfoNotice } from '../../../components/Notice';
import { Num } from '../../../components/Num';
import { formatLatitude, formatLongitude, plural } from '../../../lib/format';
import { isApiError } from '../../../lib/http';
import type { PlanChange } from '../../../../shared/api/stations';
import { useApplyStationTable, usePreviewStationTable, type ImportMode } from '../api';

const problemSchema = z.object({ line: z.number(), column: z.number().nullable(), message: z.string() });

const PLACEHOLDER = `station\tlatitude\tlongitude\tdepth
A01\t54 30.5 S\t57 54.0 W\t4200
A02\t-54.75\t-57.5\t4350`;

type Values = { latitude: number; longitude: number; plannedDepth: number | null };
const show = (f: keyof Values, v: Values) =>
  f === 'latitude'
    ? formatLatitude(v.latitude, 4)
    : f === 'longitude'
      ? formatLongitude(v.longitude, 4)
      : v.plannedDepth === null
        ? '—'
        : `${v.plannedDepth} m`;
const FIELD: Record<keyof Values, string> = { latitude: 'latitude', longitude: 'longitude', plannedDepth: 'depth' };

/**
 * Paste or import a station table (name, latitude, longitude, bottom depth). The server says first what
 * it would change in the plan, and nothing changes until "Apply these changes", which applies exactly
 * that preview (if the plan changed in between, it says so and changes nothing).
 */
export function StationTableImport({ cruiseId }: { cruiseId: string }) {
  const [text, setText] = useState('');
  const [mode, setMode] = useState<ImportMode>('merge');
  const [done, setDone] = useState<string | null>(null);
  const preview = usePreviewStationTable(cruiseId);
  const apply = useApplyStationTable(cruiseId);
  const change = preview.data;

  const reset = () => {
    preview.reset();
    apply.reset();
    setDone(null);
  };
  const onFile = async (e: ChangeEvent<HTMLInputElement>) => {
    const f = e.target.files?.[0];
    if (!f) return;
    setText(await f.text());
    reset();
  };
  const run = () => {
    setDone(null);
    apply.reset();
    preview.mutate({ text, mode });
  };
  const confirm = () => {
    if (!change) return;
    apply.mutate(
      { text, mode, token: change.token },
      {
        onSuccess: (out) => {
          const a = out.applied;
          setDone(
            `Applied: ${plural(a.added.length, 'station')} added, ${a.changed.length} changed, ${a.removed.length} removed${a.orderChanged ? ', the order changed' : ''}.`,
          );
          preview.reset();
        },
      },
    );
  };
  const problems =
    preview.error && isApiError(preview.error, 400)
      ? preview.error.details.flatMap((d) => {
          const p = problemSchema.safeParse(d);
          return p.success ? [p.data] : [];
        })
      : [];

  return (
    <section
      aria-label="Paste or import a station table"
      className="flex flex-col gap-3 border-t border-paper-rule p-4"
    >
      <h3 className="text-xs font-semibold uppercase tracking-[0.08em] text-ink-muted">
        Paste or import a station table
      </h3>
      <TextAreaField
        label="Station table"
        hint="One station a line: name, latitude, longitude, bottom depth (optional), separated by tabs (a spreadsheet paste), semicolons or commas. Decimal degrees (-54.5083) or degrees and decimal minutes (54 30.5 S, 54°30.5'S). A header line may name the columns in any order."
        value={text}
        onChange={(e) => {
          setText(e.target.value);
          reset();
        }}
        placeholder={PLACEHOLDER}
        spellCheck={false}
        className="font-mono text-[0.8rem]"
        rows={6}
      />
      <div className="flex flex-wrap items-end gap-3">
        <label className="flex flex-col gap-1 text-sm">
          <span className="font-medium text-ink">Or read a file</span>
          <input
            type="file"
            accept=".csv,.tsv,.txt,text/plain,text/csv"
            onChange={(e) => void onFile(e)}
            aria-label="Station table file"
            className="text-sm"
          />
        </label>
        <SelectField
          label="The table is"
          value={mode}
          onChange={(e) => {
            setMode(e.target.value as ImportMode);
            reset();
          }}
        >
          <option value="merge">stations to add or correct (others left alone)</option>
          <option value="replace">the whole plan (others removed, unless they have casts)</option>
        </SelectField>
        <Button variant="secondary" onClick={run} busy={preview.isPending} disabled={text.trim() === ''}>
          Preview changes
        </Button>
      </div>
      {problems.length > 0 && (
        <div role="alert" className="border border-warn/50 bg-warn-wash/40 p-3 text-sm">
          <p className="font-medium text-warn-strong">
            The table was not read ({plural(problems.length, 'problem')}); nothing was changed.
          </p>
          <ul className="mt-1 list-disc pl-5 font-mono text-[0.8rem]">
            {problems.slice(0, 30).map((p, i) => (
              <li key={i}>
                line {p.line}
                {p.column ? `, column ${p.column}` : ''}: {p.message}
              </li>
            ))}
          </ul>
          {problems.length > 30 && <p className="text-xs">…and {problems.length - 30} more.</p>}
        </div>
      )}
      {preview.isError && problems.length === 0 && (
        <ErrorNotice error={preview.error} title="The table could not be previewed" />
      )}
      {change && <PreviewTable change={change} />}
      {change && !change.empty && (
        <div className="flex items-center gap-3">
          <Button variant="primary" className="whitespace-nowrap" onClick={confirm} busy={apply.isPending}>
            Apply these changes
          </Button>
          <Button variant="quiet" onClick={reset}>
            Discard
          </Button>
          <span className="text-xs text-ink-muted">
            Nothing has changed yet. Applying is recorded in the audit trail.
          </span>
        </div>
      )}
      {apply.isError &&
        (isApiError(apply.error, 409) ? (
          <InfoNotice>{apply.error.message}</InfoNotice>
        ) : (
          <ErrorNotice error={apply.error} title="The changes were not applied" />
        ))}
      {done && <InfoNotice>{done}</InfoNotice>}
    </section>
  );
}

/** What the table would change: added, changed (old → new), removed, kept because occupied, left alone. */
function PreviewTable({ change }: { change: PlanChange }) {
  const alone = change.unchanged.length;
  return (
    <div aria-label="What the table would change" className="flex flex-col gap-2 border border-paper-rule p-3 text-sm">
      <p className="text-ink-strong">
        {change.empty ? (
          <>The plan already says what this table says: nothing would change.</>
        ) : (
          <>
            This table would add <Num>{change.added.length}</Num>, change <Num>{change.changed.length}</Num> and remove{' '}
            <Num>{change.removed.length}</Num> station{change.removed.length === 1 ? '' : 's'}
            {change.orderChanged ? ', and put the plan in a new order' : ''}; <Num>{alone}</Num> left alone.
          </>
        )}
      </p>
      {!change.empty && (
        <table className="w-full border-collapse" aria-label="Preview of the plan change">
          <thead>
            <tr className="border-b border-paper-rule text-left text-xs uppercase tracking-[0.08em] text-ink-muted">
              <th scope="col" className="px-2 py-1 font-semibold">
                Change
              </th>
              <th scope="col" className="px-2 py-1 font-semibold">
                Station
              </th>
              <th scope="col" className="px-2 py-1 text-right font-semibold">
                Line
              </th>
              <th scope="col" className="px-2 py-1 font-semibold">
                What
              </th>
            </tr>
          </thead>
          <tbody className="font-mono text-[0.8rem] tabular-nums">
            {change.added.map((a) => (
              <tr key={`a-${a.name}`} className="border-b border-paper-rule/60">
                <td className="px-2 py-0.5 font-sans font-medium text-ink-strong">added</td>
                <td className="px-2 py-0.5 font-semibold">{a.name}</td>
                <td className="px-2 py-0.5 text-right text-ink-muted">{a.line}</td>
                <td className="px-2 py-0.5">
                  {formatLatitude(a.latitude, 4)}, {formatLongitude(a.longitude, 4)}
                  {a.plannedDepth !== null ? `, ${a.plannedDepth} m` : ''}
                </td>
              </tr>
            ))}
            {change.changed.map((c) => (
              <tr key={`c-${c.name}`} className="border-b border-paper-rule/60">
                <td className="px-2 py-0.5 font-sans font-medium text-ink-strong">changed</td>
                <td className="px-2 py-0.5 font-semibold">{c.name}</td>
                <td className="px-2 py-0.5 text-right text-ink-muted">{c.line}</td>
                <td className="px-2 py-0.5">
                  {c.fields.map((f) => (
                    <span key={f} className="mr-3 inline-block">
                      <span className="font-sans text-ink-muted">{FIELD[f]} </span>
                      {show(f, c.before)} → <strong className="text-ink-strong">{show(f, c.after)}</strong>
                    </span>
                  ))}
                </td>
              </tr>
            ))}
            {change.removed.map((r) => (
              <tr key={`r-${r.name}`} className="border-b border-paper-rule/60">
                <td className="px-2 py-0.5 font-sans font-medium text-warn-strong">removed</td>
                <td className="px-2 py-0.5 font-semibold">{r.name}</td>
                <td className="px-2 py-0.5 text-right text-ink-muted">—</td>
                <td className="px-2 py-0.5 font-sans text-ink-soft">not in the table; no cast</td>
              </tr>
            ))}
            {change.keptOccupied.map((k) => (
              <tr key={`k-${k.name}`} className="border-b border-paper-rule/60">
                <td className="px-2 py-0.5 font-sans font-medium">kept</td>
                <td className="px-2 py-0.5 font-semibold">{k.name}</td>
                <td className="px-2 py-0.5 text-right text-ink-muted">—</td>
                <td className="px-2 py-0.5 font-sans text-ink-soft">
                  not in the table, but it has {plural(k.casts, 'cast')}: it stays, at the end of the plan
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      )}
      {alone > 0 && !change.empty && (
        <p className="text-xs text-ink-muted">
          {change.unchanged.some((u) => u.named) && (
            <>
              Same in the table and the plan:{' '}
              {change.unchanged
                .filter((u) => u.named)
                .map((u) => u.name)
                .join(', ')}
              .{' '}
            </>
          )}
          {change.unchanged.some((u) => !u.named) && (
            <>
              Not in the table, left as they are:{' '}
              {change.unchanged
                .filter((u) => !u.named)
                .map((u) => u.name)
                .join(', ')}
              .
            </>
          )}
        </p>
      )}
      {change.orderChanged && (
        <p className="text-xs text-ink-muted">
          New order: <span className="font-mono">{change.order.join(' · ')}</span>
        </p>
      )}
    </div>
  );
}
