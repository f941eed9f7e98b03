import { useState, type DragEvent } from 'react';
import { Button } from '../../../components/Button';
import { ErrorNotice, InfoNotice } from '../../../components/Notice';
import { EmptyState } from '../../../components/Panel';
import { formatLatitude, formatLongitude } from '../../../lib/format';
import { isApiError } from '../../../lib/http';
import { parseCoordinate, parseDepth, STATION_NAME_MAX } from '../../../../shared/api/stations';
import { useEditStation, useRemoveStation, useReorderStations } from '../api';
import type { Station } from '../types';

const th = 'whitespace-nowrap px-1.5 py-1.5 font-semibold';
const num = 'whitespace-nowrap px-1.5 py-1 text-right';
const tight = 'px-1.5!';

/**
 * The planned stations with the chief scientist's tools: edit a row (positions in decimal degrees or
 * degrees and decimal minutes), remove a station after a confirmation (an occupied one stays: its
 * casts carry its name), and move a station up or down, or drag it, to reorder the plan. The default
 * line follows the plan's order.
 */
export function StationPlanEditor({ cruiseId, stations }: { cruiseId: string; stations: readonly Station[] }) {
  const ordered = [...stations].sort((a, b) => a.order - b.order);
  const [editing, setEditing] = useState<string | null>(null);
  const [removing, setRemoving] = useState<string | null>(null);
  const [dragged, setDragged] = useState<string | null>(null);
  const reorder = useReorderStations(cruiseId);
  const remove = useRemoveStation(cruiseId);

  if (ordered.length === 0)
    return (
      <EmptyState title="No stations planned yet">
        Add stations one by one below, or paste the plan as a table.
      </EmptyState>
    );

  const move = (from: number, to: number) => {
    if (to < 0 || to >= ordered.length || from === to) return;
    const ids = ordered.map((s) => s.id);
    const [id] = ids.splice(from, 1);
    ids.splice(to, 0, id);
    reorder.mutate(ids);
  };
  const onDrop = (e: DragEvent, to: number) => {
    e.preventDefault();
    const from = ordered.findIndex((s) => s.id === dragged);
    setDragged(null);
    if (from >= 0) move(from, to);
  };

  return (
    <div className="max-h-[30rem] overflow-auto">
      <table className="w-full border-collapse text-sm" aria-label="Planned stations">
        <thead className="sticky top-0 z-10 bg-paper-raised">
          <tr className="border-b border-paper-rule text-left text-xs uppercase tracking-[0.08em] text-ink-muted">
            <th scope="col" className={`${th} text-right`}>
              #
            </th>
            <th scope="col" className={th}>
              Station
            </th>
            <th scope="col" className={`${th} text-right`}>
              Latitude
            </th>
            <th scope="col" className={`${th} text-right`}>
              Longitude
            </th>
            <th scope="col" className={`${th} text-right`}>
              Depth m
            </th>
            <th scope="col" className={th}>
              Casts
            </th>
            <th scope="col" className={th}>
              <span className="sr-only">Actions</span>
            </th>
          </tr>
        </thead>
        <tbody className="font-mono text-[0.8rem] tabular-nums">
          {ordered.map((s, i) =>
            editing === s.id ? (
              <EditRow key={s.id} cruiseId={cruiseId} station={s} onDone={() => setEditing(null)} />
            ) : (
              <tr
                key={s.id}
                draggable={!reorder.isPending}
                onDragStart={() => setDragged(s.id)}
                onDragOver={(e) => e.preventDefault()}
                onDrop={(e) => onDrop(e, i)}
                className={`border-b border-paper-rule/70 last:border-0 hover:bg-ink-wash/40 ${dragged === s.id ? 'opacity-50' : ''}`}
              >
                <td className={`${num} cursor-grab text-ink-muted`} title="Drag to move">
                  {i + 1}
                </td>
                <td className="px-1.5 py-1 font-semibold text-ink-strong">{s.name}</td>
                <td className={num}>{formatLatitude(s.latitude)}</td>
                <td className={num}>{formatLongitude(s.longitude)}</td>
                <td className={num}>{s.plannedDepth ?? '—'}</td>
                <td
                  className="whitespace-nowrap px-2 py-1"
                  title={s.occupied ? `Occupied: ${s.casts ?? ''} cast(s)` : 'Planned, no cast yet'}
                >
                  {s.occupied ? (
                    <span className="inline-flex items-center gap-1.5 text-ink">
                      <span aria-hidden className="size-2 rounded-full bg-ink" />
                      {s.casts ?? ''}
                      <span className="sr-only">occupied</span>
                    </span>
                  ) : (
                    <span className="inline-flex items-center gap-1.5 text-ink-muted">
                      <span aria-hidden className="size-2 rounded-full border border-ink" />
                      <span className="sr-only">planned</span>
                    </span>
                  )}
                </td>
                <td className="whitespace-nowrap px-0.5 py-0.5 text-right font-sans">
                  <Button
                    size="sm"
                    variant="quiet"
                    className={tight}
                    aria-label={`Move station ${s.name} up`}
                    disabled={i === 0 || reorder.isPending}
                    onClick={() => move(i, i - 1)}
                  >
                    ↑
                  </Button>
                  <Button
                    size="sm"
                    variant="quiet"
                    className={tight}
                    aria-label={`Move station ${s.name} down`}
                    disabled={i === ordered.length - 1 || reorder.isPending}
                    onClick={() => move(i, i + 1)}
                  >
                    ↓
                  </Button>
                  <Button
                    size="sm"
                    variant="quiet"
                    aria-label={`Edit station ${s.name}`}
                    onClick={() => setEditing(s.id)}
                  >
                    Edit
                  </Button>
                  <Button
                    size="sm"
                    variant="quiet"
                    className={tight}
                    aria-label={`Remove station ${s.name}`}
                    onClick={() => setRemoving(removing === s.id ? null : s.id)}
                  >
                    Remove
                  </Button>
                </td>
              </tr>
            ),
          )}
        </tbody>
      </table>
      {removing && (
        <RemoveConfirm
          station={ordered.find((s) => s.id === removing)}
          busy={remove.isPending}
          onCancel={() => setRemoving(null)}
          onConfirm={(id) => remove.mutate(id, { onSuccess: () => setRemoving(null) })}
        />
      )}
      {remove.isError && (
        <div className="p-3">
          <ErrorNotice error={remove.error} title="The station was not removed" />
        </div>
      )}
      {reorder.isError && (
        <div className="p-3">
          <ErrorNotice error={reorder.error} title="The plan was not reordered" />
        </div>
      )}
      <p className="border-t border-paper-rule px-3 py-1.5 text-xs text-ink-muted">
        <span aria-hidden>●</span> occupied (number of casts) · <span aria-hidden>○</span> planned. The default line
        draws the occupied stations in this order; drag a row or use the arrows to move a station.
      </p>
    </div>
  );
}

function RemoveConfirm({
  station,
  busy,
  onCancel,
  onConfirm,
}: {
  station: Station | undefined;
  busy: boolean;
  onCancel: () => void;
  onConfirm: (id: string) => void;
}) {
  if (!station) return null;
  return (
    <div
      role="alertdialog"
      aria-label={`Remove station ${station.name}`}
      className="m-3 flex flex-col gap-2 border border-warn/50 bg-warn-wash/40 p-3 text-sm"
    >
      {station.occupied ? (
        <>
          <p>
            Station <strong className="font-mono">{station.name}</strong> has casts, so it stays in the plan: its casts
            carry its name, and the plan places it in the default line. The casts are not touched. Remove the casts
            first (Casts, below) if the station was never meant to be there.
          </p>
          <div>
            <Button size="sm" onClick={onCancel}>
              Close
            </Button>
          </div>
        </>
      ) : (
        <>
          <p>
            Remove station <strong className="font-mono">{station.name}</strong> ({formatLatitude(station.latitude)},{' '}
            {formatLongitude(station.longitude)}) from the plan? It has no cast. The removal is recorded in the audit
            trail.
          </p>
          <div className="flex gap-2">
            <Button size="sm" variant="danger" busy={busy} onClick={() => onConfirm(station.id)}>
              Remove {station.name}
            </Button>
            <Button size="sm" variant="quiet" onClick={onCancel}>
              Keep it
            </Button>
          </div>
        </>
      )}
    </div>
  );
}

const cell = 'h-7 w-full rounded border border-ink/30 bg-paper-raised px-1.5 font-mono text-[0.8rem]';

/** One station being edited in place; coordinates read as on the table (decimal or degrees and minutes). */
function EditRow({ cruiseId, station, onDone }: { cruiseId: string; station: Station; onDone: () => void }) {
  const [v, setV] = useState({
    name: station.name,
    latitude: String(station.latitude),
    longitude: String(station.longitude),
    plannedDepth: station.plannedDepth === null ? '' : String(station.plannedDepth),
  });
  const [problem, setProblem] = useState<string | null>(null);
  const edit = useEditStation(cruiseId);
  const set = (k: keyof typeof v) => (e: { target: { value: string } }) => setV({ ...v, [k]: e.target.value });

  const save = () => {
    const lat = parseCoordinate(v.latitude, 'latitude');
    const lon = parseCoordinate(v.longitude, 'longitude');
    const depth = parseDepth(v.plannedDepth);
    const name = v.name.trim();
    if (!name || name.length > STATION_NAME_MAX) return setProblem(`Name: 1 to ${STATION_NAME_MAX} characters.`);
    if (!lat.ok) return setProblem(`Latitude: ${lat.message}.`);
    if (!lon.ok) return setProblem(`Longitude: ${lon.message}.`);
    if (!depth.ok) return setProblem(`Depth: ${depth.message}.`);
    setProblem(null);
    edit.mutate(
      {
        stationId: station.id,
        patch: {
          ...(name !== station.name ? { name } : {}),
          latitude: lat.value,
          longitude: lon.value,
          plannedDepth: depth.value,
        },
      },
      { onSuccess: onDone },
    );
  };

  return (
    <>
      <tr className="border-b border-paper-rule/70 bg-ink-wash/30" aria-label={`Editing station ${station.name}`}>
        <td className={`${num} text-ink-muted`}>{station.order}</td>
        <td className="px-1 py-1">
          <input
            aria-label="Station name"
            className={cell}
            value={v.name}
            onChange={set('name')}
            disabled={station.occupied}
            title={station.occupied ? 'An occupied station keeps its name: its casts carry it' : undefined}
          />
        </td>
        <td className="px-1 py-1">
          <input aria-label="Latitude" className={`${cell} text-right`} value={v.latitude} onChange={set('latitude')} />
        </td>
        <td className="px-1 py-1">
          <input
            aria-label="Longitude"
            className={`${cell} text-right`}
            value={v.longitude}
            onChange={set('longitude')}
          />
        </td>
        <td className="px-1 py-1">
          <input
            aria-label="Depth (m)"
            className={`${cell} text-right`}
            value={v.plannedDepth}
            onChange={set('plannedDepth')}
          />
        </td>
        <td colSpan={2} className="whitespace-nowrap px-1 py-1 text-right font-sans">
          <Button size="sm" variant="primary" busy={edit.isPending} onClick={save}>
            Save
          </Button>
          <Button size="sm" variant="quiet" onClick={onDone}>
            Cancel
          </Button>
        </td>
      </tr>
      {(problem || edit.isError) && (
        <tr>
          <td colSpan={7} className="px-2 py-1 font-sans text-sm">
            {problem && <p className="text-warn-strong">{problem}</p>}
            {edit.isError &&
              (isApiError(edit.error, 409) ? (
                <InfoNotice>{edit.error.message}</InfoNotice>
              ) : (
                <ErrorNotice error={edit.error} title="The station was not saved" />
              ))}
          </td>
        </tr>
      )}
    </>
  );
}
