import { useMemo, useState } from 'react';
import { Link, useParams } from 'react-router-dom';
import {
  columnFilteringFeature,
  createColumnHelper,
  createFilteredRowModel,
  createSortedRowModel,
  filterFn_includesString,
  globalFilteringFeature,
  rowSortingFeature,
  sortFn_alphanumeric,
  sortFn_basic,
  sortFn_datetime,
  tableFeatures,
  useTable,
  type ColumnFiltersState,
  type SortingState,
} from '@tanstack/react-table';
import { EmptyState } from '../../../components/Panel';
import { formatLatitude, formatLongitude, formatUtc, plural } from '../../../lib/format';
import type { CastSummary } from '../types';
import { Button } from '../../../components/Button';
import { ErrorNotice } from '../../../components/Notice';
import { useCastLife } from '../api';

const features = tableFeatures({
  rowSortingFeature,
  columnFilteringFeature,
  globalFilteringFeature,
  sortedRowModel: createSortedRowModel(),
  filteredRowModel: createFilteredRowModel(),
  sortFns: { alphanumeric: sortFn_alphanumeric, basic: sortFn_basic, datetime: sortFn_datetime },
  filterFns: { includesString: filterFn_includesString },
});

const helper = createColumnHelper<typeof features, CastSummary>();

const num = (digits: number) => (v: number | null) => (v == null ? '—' : v.toFixed(digits));

const columns = helper.columns([
  helper.accessor('station', {
    header: 'Station',
    sortFn: 'alphanumeric',
    cell: (info) => (
      <>
        <CastLink castId={info.row.original.id} station={info.row.original.station} cast={info.row.original.cast} />
        <PartlyReadMark cast={info.row.original} />
      </>
    ),
    meta: { align: 'left' },
  }),
  helper.accessor('cast', { header: 'Cast', sortFn: 'alphanumeric', meta: { align: 'left' } }),
  helper.accessor((row) => row.time ?? '', {
    id: 'time',
    header: 'Time (UTC)',
    sortFn: 'alphanumeric',
    cell: (info) => formatUtc(info.row.original.time),
    meta: { align: 'left' },
  }),
  helper.accessor('latitude', {
    header: 'Latitude',
    sortFn: 'basic',
    sortUndefined: 'last',
    enableGlobalFilter: false,
    cell: (info) => (info.getValue() == null ? '—' : formatLatitude(info.getValue() as number)),
  }),
  helper.accessor('longitude', {
    header: 'Longitude',
    sortFn: 'basic',
    sortUndefined: 'last',
    enableGlobalFilter: false,
    cell: (info) => (info.getValue() == null ? '—' : formatLongitude(info.getValue() as number)),
  }),
  helper.accessor('bottomDepth', {
    header: 'Bottom (m)',
    sortFn: 'basic',
    sortUndefined: 'last',
    enableGlobalFilter: false,
    cell: (info) => num(0)(info.getValue()),
  }),
  helper.accessor('levels', { header: 'Levels', sortFn: 'basic', enableGlobalFilter: false }),
  helper.accessor('inversions', {
    header: 'Inversions',
    sortFn: 'basic',
    enableGlobalFilter: false,
    filterFn: (row, columnId, onlyWarned: boolean) => !onlyWarned || (row.getValue(columnId) as number) > 0,
    cell: (info) => {
      const n = info.getValue();
      return n > 0 ? (
        <span
          className="inline-flex items-center gap-1 font-semibold text-warn"
          aria-label={`${plural(n, 'inversion')}`}
        >
          <span aria-hidden>▲</span>
          {n}
        </span>
      ) : (
        <span className="text-ink-faint" aria-label="no inversions">
          0
        </span>
      );
    },
  }),
]);

/** What this person may do to a cast from the table: remove it (chief scientist), decide on a partly read one (intake). */
export interface CastActions {
  cruiseId: string;
  canRemove: boolean;
  canDecide: boolean;
}

function LifeButtons({ cast, actions }: { cast: CastSummary; actions: CastActions }) {
  const life = useCastLife(actions.cruiseId);
  const pending = cast.partlyRead && cast.partlyRead.decision === null;
  const what = `station ${cast.station} cast ${cast.cast}`;
  return (
    <span className="inline-flex items-center gap-1 font-sans">
      {pending && actions.canDecide && (
        <>
          <Button
            size="sm"
            variant="secondary"
            busy={life.isPending}
            onClick={() => life.mutate({ castId: cast.id, action: 'accept' })}
            aria-label={`Accept the partly read ${what}`}
          >
            Accept
          </Button>
          <Button
            size="sm"
            variant="quiet"
            disabled={life.isPending}
            onClick={() => life.mutate({ castId: cast.id, action: 'reject' })}
            aria-label={`Reject the partly read ${what}`}
          >
            Reject
          </Button>
        </>
      )}
      {actions.canRemove && (
        <Button
          size="sm"
          variant="quiet"
          busy={life.isPending && !pending}
          onClick={() => life.mutate({ castId: cast.id, action: 'remove' })}
          aria-label={`Remove ${what}`}
        >
          Remove
        </Button>
      )}
      {life.isError && <ErrorNotice error={life.error} title="Not done" />}
    </span>
  );
}

/** "partly read": some lines of the file were left out; the title lists them. */
function PartlyReadMark({ cast }: { cast: CastSummary }) {
  if (!cast.partlyRead) return null;
  const lines = cast.partlyRead.dropped
    .map((d) => `line ${d.line ?? '?'}${d.column ? `, column ${d.column}` : ''}: ${d.message}`)
    .join('\n');
  return (
    <span
      title={lines}
      className="ml-2 rounded-sm border border-warn/50 px-1 font-sans text-2xs uppercase tracking-[0.06em] text-warn-strong"
    >
      partly read{cast.partlyRead.decision ? ' · accepted' : ` · ${cast.partlyRead.dropped.length} lines left out`}
    </span>
  );
}

/** The station name opens the cast sheet (the table always sits inside `/cruises/:id`). */
function CastLink({ castId, station, cast }: { castId: string; station: string; cast: string }) {
  const { id = '' } = useParams();
  return (
    <Link
      to={`/cruises/${encodeURIComponent(id)}/casts/${encodeURIComponent(castId)}`}
      aria-label={`Open the cast sheet of station ${station} cast ${cast}`}
    >
      {station}
    </Link>
  );
}

interface ColumnMetaAlign {
  align?: 'left' | 'right';
}

/** The cruise's casts: sortable by any column, filtered by station or cast, inversions flagged in the warm accent. */
export function CastsTable({ casts, actions }: { casts: readonly CastSummary[]; actions?: CastActions }) {
  const [sorting, setSorting] = useState<SortingState>([{ id: 'station', desc: false }]);
  const [globalFilter, setGlobalFilter] = useState('');
  const [columnFilters, setColumnFilters] = useState<ColumnFiltersState>([]);
  const [data] = useStableData(casts);

  const withActions = actions && (actions.canRemove || actions.canDecide);
  const shown = useMemo(
    () =>
      withActions
        ? [
            ...columns,
            helper.display({
              id: 'life',
              header: '',
              cell: (info) => <LifeButtons cast={info.row.original} actions={actions} />,
            }),
          ]
        : columns,
    [withActions, actions],
  );
  const table = useTable({
    features,
    columns: shown,
    data,
    state: { sorting, globalFilter, columnFilters },
    onSortingChange: setSorting,
    onGlobalFilterChange: setGlobalFilter,
    onColumnFiltersChange: setColumnFilters,
    globalFilterFn: 'includesString',
    getColumnCanGlobalFilter: (column) => column.id === 'station' || column.id === 'cast' || column.id === 'time',
  });

  const onlyWarned = columnFilters.some((f) => f.id === 'inversions' && f.value === true);
  const rows = table.getRowModel().rows;
  const warnedTotal = casts.filter((c) => c.inversions > 0).length;

  if (casts.length === 0) {
    return (
      <EmptyState title="No casts yet">
        Casts appear here as the technicians' files come through intake: one row per cast, with its level count and any
        density inversions found.
      </EmptyState>
    );
  }

  return (
    <div>
      <div className="flex flex-wrap items-center gap-4 border-b border-paper-rule px-4 py-2">
        <label className="flex items-center gap-2 text-sm text-ink-soft">
          <span>Filter</span>
          <input
            type="search"
            aria-label="Filter casts by station, cast or time"
            value={globalFilter}
            onChange={(e) => setGlobalFilter(e.target.value)}
            placeholder="station, cast or date"
            className="h-8 w-56 rounded border border-paper-rule bg-paper-raised px-2 font-mono text-sm text-ink-strong placeholder:font-sans placeholder:text-ink-faint focus:outline-2 focus:outline-ink/70"
          />
        </label>
        <label className="flex items-center gap-2 text-sm text-ink-soft">
          <input
            type="checkbox"
            checked={onlyWarned}
            onChange={(e) =>
              setColumnFilters((filters) => [
                ...filters.filter((f) => f.id !== 'inversions'),
                ...(e.target.checked ? [{ id: 'inversions', value: true }] : []),
              ])
            }
            className="size-4 accent-[#123f44]"
          />
          Only casts with inversions
          <span className={`font-mono text-xs tabular-nums ${warnedTotal > 0 ? 'text-warn' : 'text-ink-muted'}`}>
            ({warnedTotal})
          </span>
        </label>
        <span className="ml-auto text-xs text-ink-muted" aria-live="polite">
          <span className="font-mono tabular-nums">{rows.length}</span> of{' '}
          <span className="font-mono tabular-nums">{casts.length}</span> casts
        </span>
      </div>
      <div className="max-h-[28rem] overflow-auto">
        <table className="w-full border-collapse text-sm" aria-label="Casts">
          <thead className="sticky top-0 z-10 bg-paper-raised">
            {table.getHeaderGroups().map((group) => (
              <tr key={group.id} className="border-b border-paper-rule">
                {group.headers.map((header) => {
                  const sorted = header.column.getIsSorted();
                  const align = (header.column.columnDef.meta as ColumnMetaAlign | undefined)?.align ?? 'right';
                  return (
                    <th
                      key={header.id}
                      scope="col"
                      aria-sort={sorted === 'asc' ? 'ascending' : sorted === 'desc' ? 'descending' : 'none'}
                      className={`px-3 py-1.5 text-xs font-semibold uppercase tracking-[0.08em] text-ink-muted ${align === 'left' ? 'text-left' : 'text-right'}`}
                    >
                      <button
                        type="button"
                        onClick={header.column.getToggleSortingHandler()}
                        className={`inline-flex items-center gap-1 uppercase hover:text-ink ${sorted ? 'text-ink' : ''}`}
                      >
                        <table.FlexRender header={header} />
                        <span aria-hidden className="w-2 text-[0.6rem]">
                          {sorted === 'asc' ? '▴' : sorted === 'desc' ? '▾' : ''}
                        </span>
                      </button>
                    </th>
                  );
                })}
              </tr>
            ))}
          </thead>
          <tbody className="font-mono text-[0.8rem] tabular-nums">
            {rows.map((row) => (
              <tr
                key={row.id}
                className={`border-b border-paper-rule/70 last:border-0 hover:bg-ink-wash/40 ${row.original.inversions > 0 ? 'bg-warn-wash/25' : ''}`}
              >
                {row.getAllCells().map((cell) => {
                  const align = (cell.column.columnDef.meta as ColumnMetaAlign | undefined)?.align ?? 'right';
                  return (
                    <td
                      key={cell.id}
                      className={`px-3 py-1 ${align === 'left' ? 'text-left' : 'text-right'} ${cell.column.id === 'station' ? 'font-semibold text-ink-strong' : ''}`}
                    >
                      <table.FlexRender cell={cell} />
                    </td>
                  );
                })}
              </tr>
            ))}
            {rows.length === 0 && (
              <tr>
                <td colSpan={shown.length} className="px-3 py-6 text-center font-sans text-ink-muted">
                  No cast matches the filter.
                </td>
              </tr>
            )}
          </tbody>
        </table>
      </div>
    </div>
  );
}

/** TanStack Table wants a stable data array; the query result is one, but a readonly copy is not. */
function useStableData(casts: readonly CastSummary[]): [CastSummary[]] {
  const [state, setState] = useState<{ source: readonly CastSummary[]; copy: CastSummary[] }>(() => ({
    source: casts,
    copy: [...casts],
  }));
  if (state.source !== casts) {
    const next = { source: casts, copy: [...casts] };
    setState(next);
    return [next.copy];
  }
  return [state.copy];
}
