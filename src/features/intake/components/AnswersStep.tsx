import { useEffect, useMemo, useState, type FormEvent } from 'react';
import { useQuery } from '@tanstack/react-query';
import { Button } from '../../../components/Button';
import { ErrorNotice } from '../../../components/Notice';
import { isApiError } from '../../../lib/http';
import { intakeAnswersQuery, uploadPreviewQuery, useAnswerAndRetry } from '../api';
import {
  UNIT_CHOICES,
  unitAnswerKey,
  type CastAnswer,
  type FileNeed,
  type FilePreview,
  type IntakeAnswers,
  type Upload,
} from '../types';

type CastDraft = { station: string; cast: string; latitude: string; longitude: string; time: string };
const EMPTY: CastDraft = { station: '', cast: '', latitude: '', longitude: '', time: '' };

const SOURCE_WORDS: Record<string, string> = {
  file: 'from the file',
  'file name': 'from the file name',
  'station table': 'from the station table',
  plan: 'from the station plan',
  answer: 'your answer',
  default: 'assumed',
  missing: 'missing',
};

/** "2026-03-05 06:30" (UTC, as typed; a T between date and time is fine too) to ISO 8601 UTC; anything
 * else is sent as typed, so the server's message says what is wrong. */
function isoOf(t: string): string {
  const m = /^(\d{4}-\d{2}-\d{2})[T ](\d{2}:\d{2})(:\d{2})?Z?$/.exec(t.trim());
  return m ? `${m[1]}T${m[2]}${m[3] ?? ':00'}Z` : t.trim();
}
const localOf = (iso: string | undefined) =>
  iso
    ? iso
        .replace('T', ' ')
        .replace(/:00(\.000)?Z$/, '')
        .replace(/Z$/, '')
    : '';

function draftOf(a: CastAnswer | undefined): CastDraft {
  if (!a) return EMPTY;
  return {
    station: a.station ?? '',
    cast: a.cast ?? '',
    latitude: a.latitude === undefined ? '' : String(a.latitude),
    longitude: a.longitude === undefined ? '' : String(a.longitude),
    time: localOf(a.time),
  };
}

/** The answers as the server takes them: only what the technician filled in. */
function answersOf(units: Record<string, string>, drafts: Record<string, CastDraft>, needs: FileNeed[]): IntakeAnswers {
  const casts: Record<string, CastAnswer> = {};
  for (const n of needs) {
    const d = drafts[n.file] ?? EMPTY;
    const a: Record<string, string | number> = {};
    if (n.missing.includes('station') && d.station.trim()) a.station = d.station.trim();
    if (n.missing.includes('cast') && d.cast.trim()) a.cast = d.cast.trim();
    if (n.missing.includes('position') && (d.latitude.trim() || d.longitude.trim())) {
      // sent as typed when not a number, so the server's message names what is wrong
      a.latitude = d.latitude.trim() === '' ? NaN : Number(d.latitude.replace(',', '.'));
      a.longitude = d.longitude.trim() === '' ? NaN : Number(d.longitude.replace(',', '.'));
    }
    if (n.missing.includes('time') && d.time.trim()) a.time = isoOf(d.time);
    if (Object.keys(a).length) casts[n.file] = a as CastAnswer;
  }
  const u = Object.fromEntries(Object.entries(units).filter(([, v]) => v !== '')) as IntakeAnswers['units'];
  return { units: u, casts };
}

/** The server's reasons a set of answers was refused, by file and field ("casts.<file>.latitude"). */
function problemsOf(error: unknown): { key: string; text: string }[] {
  if (!isApiError(error, 400)) return [];
  return Object.entries(error.fieldErrors()).map(([field, message]) => {
    const m = /^casts\.(.+)\.(station|cast|latitude|longitude|time)$/.exec(field) ?? /^casts\.(.+)$/.exec(field);
    if (m) return { key: field, text: `${m[1]}${m[2] ? ` (${m[2]})` : ''}: ${message}` };
    const u = /^units\.(.+)$/.exec(field);
    return { key: field, text: u ? `unit of ${u[1]}: ${message}` : `${field || 'answers'}: ${message}` };
  });
}

function useDebounced<T>(value: T, ms: number): T {
  const [v, setV] = useState(value);
  useEffect(() => {
    const id = setTimeout(() => setV(value), ms);
    return () => clearTimeout(id);
  }, [value, ms]);
  return v;
}

const fmt = (x: number | null, d: number) => (x === null ? '—' : x.toFixed(d));
const DECIMALS: Record<string, number> = { pressure: 1, depth: 1, temperature: 4, SP: 4, oxygen: 1 };

function latText(v: number | null) {
  return v === null ? '—' : `${Math.abs(v).toFixed(4)}° ${v < 0 ? 'S' : 'N'}`;
}
function lonText(v: number | null) {
  return v === null ? '—' : `${Math.abs(v).toFixed(4)}° ${v < 0 ? 'W' : 'E'}`;
}

function Preview({ p }: { p: FilePreview }) {
  const md = p.metadata;
  const item = (label: string, text: string, source: string) => (
    <div className="flex flex-col">
      <dt className="text-[0.7rem] uppercase tracking-[0.08em] text-ink-muted">{label}</dt>
      <dd className={`font-mono text-sm ${source === 'missing' ? 'text-warn-strong' : 'text-ink-strong'}`}>
        {text} <span className="font-sans text-xs text-ink-muted">({SOURCE_WORDS[source] ?? source})</span>
      </dd>
    </div>
  );
  return (
    <div className="flex flex-col gap-2">
      <dl className="flex flex-wrap gap-x-6 gap-y-1">
        {item('Station', md.station.value ?? '—', md.station.source)}
        {item('Cast', md.cast.value ?? '—', md.cast.source)}
        {item(
          'Position',
          `${latText(md.latitude.value)} ${lonText(md.longitude.value)}`,
          md.latitude.source === 'missing' || md.longitude.source === 'missing' ? 'missing' : md.latitude.source,
        )}
        {item(
          'Time (UTC)',
          md.time.value ? md.time.value.replace('T', ' ').replace(/:00Z$|Z$/, '') : '—',
          md.time.source,
        )}
      </dl>
      <table className="w-fit border-collapse font-mono text-[0.8rem] tabular-nums" aria-label={`Preview of ${p.file}`}>
        <thead>
          <tr className="border-b border-paper-rule text-xs text-ink-muted">
            {p.columns.map((c) => (
              <th key={c.name} scope="col" className="px-3 py-1 text-right font-sans font-semibold">
                {c.label}
                {c.unit && <span className="block font-normal">{c.unit}</span>}
              </th>
            ))}
          </tr>
        </thead>
        <tbody>
          {p.rows.map((r, i) => (
            <tr key={i} className="border-b border-paper-rule/60">
              {r.map((x, j) => (
                <td key={j} className="px-3 py-0.5 text-right text-ink-strong">
                  {fmt(x, DECIMALS[p.columns[j].name] ?? 3)}
                </td>
              ))}
            </tr>
          ))}
        </tbody>
      </table>
      <p className="text-xs text-ink-muted">
        The first {p.rows.length} of {p.levels} levels, in the units they will be stored in.
      </p>
      {p.stillMissing.length > 0 && (
        <p className="text-sm text-warn-strong">Still missing: {p.stillMissing.join(', ')}.</p>
      )}
    </div>
  );
}

/**
 * What the files of a batch lack (station, cast, position, time, the unit of a column), asked once for
 * the whole batch: one choice per column without a unit, one row per file for its metadata, a preview
 * of the first rows as they will be read, then the answers are remembered for the cruise and the files
 * processed again.
 */
export function AnswersStep({ cruiseId, uploads }: { cruiseId: string; uploads: readonly Upload[] }) {
  const remembered = useQuery(intakeAnswersQuery(cruiseId));
  const submit = useAnswerAndRetry(cruiseId);
  const needs = useMemo(
    () => uploads.flatMap((u) => (u.needs ?? []).map((n) => ({ ...n, uploadId: u.id }))),
    [uploads],
  );
  const unitColumns = useMemo(() => {
    const m = new Map<string, { column: string; role: 'oxygen'; files: number }>();
    for (const n of needs)
      for (const u of n.units) {
        const k = unitAnswerKey(u.column);
        const e = m.get(k);
        if (e) e.files++;
        else m.set(k, { column: u.column, role: u.role, files: 1 });
      }
    return [...m.entries()];
  }, [needs]);
  const metaNeeds = needs.filter((n) => n.missing.length > 0);

  const [units, setUnits] = useState<Record<string, string>>({});
  const [drafts, setDrafts] = useState<Record<string, CastDraft>>({});
  const unitOf = (k: string) => units[k] ?? remembered.data?.units[k] ?? '';
  const draftFor = (file: string) => drafts[file] ?? draftOf(remembered.data?.casts[file]);
  const setDraft = (file: string, change: Partial<CastDraft>) =>
    setDrafts((d) => ({ ...d, [file]: { ...(d[file] ?? draftOf(remembered.data?.casts[file])), ...change } }));

  const allUnits = Object.fromEntries(unitColumns.map(([k]) => [k, unitOf(k)]));
  const allDrafts = Object.fromEntries(needs.map((n) => [n.file, draftFor(n.file)]));
  const answers = answersOf(allUnits, allDrafts, needs);
  const shown = useDebounced(JSON.stringify(answers), 350);
  const [chosenPreview, setPreviewFile] = useState<string>('');
  const previewFile = needs.some((n) => n.file === chosenPreview) ? chosenPreview : (needs[0]?.file ?? '');
  const previewUpload = needs.find((n) => n.file === previewFile)?.uploadId ?? needs[0]?.uploadId ?? '';
  const preview = useQuery({
    ...uploadPreviewQuery(previewUpload, JSON.parse(shown) as IntakeAnswers),
    enabled: previewUpload !== '' && remembered.isSuccess,
    placeholderData: (prev) => prev,
  });
  const previewed = preview.data?.files.find((f) => f.file === previewFile) ?? preview.data?.files[0];

  const onSubmit = (e: FormEvent) => {
    e.preventDefault();
    submit.mutate({ answers, uploadIds: uploads.map((u) => u.id) });
  };

  const cell = 'px-2 py-1';
  const input =
    'h-8 w-full rounded border border-paper-rule bg-paper-raised px-2 font-mono text-sm text-ink-strong hover:border-ink-faint';
  return (
    <form
      onSubmit={onSubmit}
      noValidate
      aria-label="What the files do not say"
      className="flex flex-col gap-4 border border-warn/40 bg-paper px-4 py-4"
    >
      <div>
        <h2 className="text-base font-semibold text-ink-strong">The files do not say everything a cast needs</h2>
        <p className="text-sm text-ink-soft">
          {needs.length === 1 ? 'One file' : `${needs.length} files`} of{' '}
          {uploads.length === 1 ? 'this upload' : `these ${uploads.length} uploads`}{' '}
          {needs.length === 1 ? 'lacks' : 'lack'} what is asked below. Answer once for the whole batch: the answers are
          remembered for this cruise, so a later file with the same gaps goes straight through.
        </p>
      </div>

      {unitColumns.length > 0 && (
        <fieldset className="flex flex-col gap-2">
          <legend className="text-sm font-semibold text-ink-strong">Units the headers do not state</legend>
          {unitColumns.map(([k, u]) => (
            <div key={k} className="flex flex-wrap items-center gap-3">
              <label htmlFor={`unit-${k}`} className="text-sm text-ink-soft">
                Column <span className="font-mono font-semibold text-ink-strong">{u.column}</span> (dissolved oxygen,{' '}
                {u.files === 1 ? '1 file' : `${u.files} files`}) is in
              </label>
              <select
                id={`unit-${k}`}
                aria-label={`Unit of column ${u.column}`}
                value={unitOf(k)}
                onChange={(e) => setUnits((s) => ({ ...s, [k]: e.target.value }))}
                className="h-8 rounded border border-paper-rule bg-paper-raised px-2 text-sm text-ink-strong"
              >
                <option value="">Choose…</option>
                {UNIT_CHOICES[u.role].map((c) => (
                  <option key={c.unit} value={c.unit}>
                    {c.label}
                  </option>
                ))}
              </select>
              <span className="text-xs text-ink-muted">stored as µmol/kg (ml/l × 44.661, per kg with σ0)</span>
            </div>
          ))}
        </fieldset>
      )}

      {metaNeeds.length > 0 && (
        <fieldset className="flex flex-col gap-1">
          <legend className="text-sm font-semibold text-ink-strong">What each file lacks</legend>
          <p className="text-xs text-ink-muted">
            Only the fields a file does not give are asked; what it gives is shown. Latitude and longitude in decimal
            degrees (south and west negative); time in UTC as 2026-03-07 04:15. A cast left empty is cast 1.
          </p>
          <div className="overflow-x-auto">
            <table className="w-full border-collapse text-sm" aria-label="Metadata answers by file">
              <thead>
                <tr className="border-b border-paper-rule text-left text-xs uppercase tracking-[0.08em] text-ink-muted">
                  <th scope="col" className={cell}>
                    File
                  </th>
                  <th scope="col" className={cell}>
                    Station
                  </th>
                  <th scope="col" className={cell}>
                    Cast
                  </th>
                  <th scope="col" className={cell}>
                    Latitude °N
                  </th>
                  <th scope="col" className={cell}>
                    Longitude °E
                  </th>
                  <th scope="col" className={cell}>
                    Time (UTC)
                  </th>
                </tr>
              </thead>
              <tbody>
                {metaNeeds.map((n) => {
                  const d = draftFor(n.file);
                  const asks = (f: string) => n.missing.includes(f as FileNeed['missing'][number]);
                  const known = (v: string | number | null) => (
                    <span className="font-mono text-ink-soft">{v === null ? '—' : String(v)}</span>
                  );
                  return (
                    <tr key={n.file} className="border-b border-paper-rule/60 align-middle">
                      <td className={`${cell} max-w-[16rem] truncate font-mono text-ink-strong`} title={n.file}>
                        {n.file}
                      </td>
                      <td className={cell}>
                        {asks('station') ? (
                          <input
                            aria-label={`Station of ${n.file}`}
                            className={input}
                            value={d.station}
                            onChange={(e) => setDraft(n.file, { station: e.target.value })}
                          />
                        ) : (
                          known(n.known.station)
                        )}
                      </td>
                      <td className={`${cell} w-20`}>
                        {asks('cast') ? (
                          <input
                            aria-label={`Cast of ${n.file}`}
                            className={input}
                            placeholder="1"
                            value={d.cast}
                            onChange={(e) => setDraft(n.file, { cast: e.target.value })}
                          />
                        ) : (
                          known(n.known.cast)
                        )}
                      </td>
                      <td className={`${cell} w-32`}>
                        {asks('position') ? (
                          <input
                            aria-label={`Latitude of ${n.file}`}
                            className={input}
                            inputMode="decimal"
                            placeholder="-40.75"
                            value={d.latitude}
                            onChange={(e) => setDraft(n.file, { latitude: e.target.value })}
                          />
                        ) : (
                          known(n.known.latitude)
                        )}
                      </td>
                      <td className={`${cell} w-32`}>
                        {asks('position') ? (
                          <input
                            aria-label={`Longitude of ${n.file}`}
                            className={input}
                            inputMode="decimal"
                            placeholder="11.5"
                            value={d.longitude}
                            onChange={(e) => setDraft(n.file, { longitude: e.target.value })}
                          />
                        ) : (
                          known(n.known.longitude)
                        )}
                      </td>
                      <td className={`${cell} w-52`}>
                        {asks('time') ? (
                          <input
                            aria-label={`Time (UTC) of ${n.file}`}
                            className={input}
                            placeholder="2026-03-07 04:15"
                            value={d.time}
                            onChange={(e) => setDraft(n.file, { time: e.target.value })}
                          />
                        ) : (
                          known(n.known.time)
                        )}
                      </td>
                    </tr>
                  );
                })}
              </tbody>
            </table>
          </div>
        </fieldset>
      )}

      <section aria-label="Preview" className="flex flex-col gap-2 border-t border-paper-rule pt-3">
        <div className="flex flex-wrap items-center gap-2">
          <h3 className="text-sm font-semibold text-ink-strong">Preview: the first rows as they will be read</h3>
          {needs.length > 1 && (
            <select
              aria-label="File to preview"
              value={previewFile}
              onChange={(e) => setPreviewFile(e.target.value)}
              className="h-7 rounded border border-paper-rule bg-paper-raised px-2 font-mono text-xs text-ink-strong"
            >
              {needs.map((n) => (
                <option key={n.file} value={n.file}>
                  {n.file}
                </option>
              ))}
            </select>
          )}
          {preview.isFetching && <span className="text-xs text-ink-muted">updating…</span>}
        </div>
        {preview.isError && (
          <ErrorNotice
            error={preview.error}
            title={`These answers cannot be previewed${
              problemsOf(preview.error).length
                ? `: ${problemsOf(preview.error)
                    .map((p) => p.text)
                    .join('; ')}`
                : ''
            }`}
          />
        )}
        {previewed && !preview.isError && <Preview p={previewed} />}
      </section>

      {submit.isError && (
        <div className="flex flex-col gap-1">
          <ErrorNotice error={submit.error} title="The answers were not taken; nothing was changed" />
          {problemsOf(submit.error).length > 0 && (
            <ul aria-label="What is wrong with the answers" className="list-disc pl-5 text-sm text-warn-strong">
              {problemsOf(submit.error).map((p) => (
                <li key={p.key}>{p.text}</li>
              ))}
            </ul>
          )}
        </div>
      )}
      <div className="flex flex-wrap items-center gap-3">
        <Button type="submit" variant="primary" size="sm" busy={submit.isPending}>
          Retry with these answers
        </Button>
        <span className="text-xs text-ink-muted">
          Remembers the answers for this cruise and processes{' '}
          {uploads.length === 1 ? 'the upload' : `the ${uploads.length} uploads`} again.
        </span>
      </div>
    </form>
  );
}
