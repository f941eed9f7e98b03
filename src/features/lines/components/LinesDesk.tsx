import { useEffect, useMemo, useState } from 'react';
import { Link } from 'react-router-dom';
import { Button } from '../../../components/Button';
import { ErrorNotice, Progress } from '../../../components/Notice';
import type { Station } from '../../cruises';
import { useCreateLine, useDeleteLine, useLines, useUpdateLine } from '../api';
import { parseStationList, type CastChoice, type Line } from '../types';
import { LinesMap, mapStations, type MapMode } from './LinesMap';

/**
 * The lines on the cruise desk: the map with every line, the tools to make one (pick stations by
 * click or lasso, draw a polyline, paste a station list), and the editor of the selected line.
 */
export function LinesDesk({
  cruiseId,
  cruiseName,
  plan,
  canEdit,
}: {
  cruiseId: string;
  cruiseName: string;
  plan: readonly Station[];
  canEdit: boolean;
}) {
  const lines = useLines(cruiseId);
  const list = useMemo(() => lines.data ?? [], [lines.data]);
  const [selectedId, setSelectedId] = useState<string | null>(null);
  const [mode, setMode] = useState<MapMode>('view');
  const [picked, setPicked] = useState<string[]>([]);
  const [drawn, setDrawn] = useState<[number, number][]>([]);
  const [name, setName] = useState('');
  const [corridor, setCorridor] = useState('30');
  const [pasted, setPasted] = useState('');
  const [pasting, setPasting] = useState(false);
  const create = useCreateLine(cruiseId);
  const stations = useMemo(() => mapStations(plan, list), [plan, list]);
  useEffect(() => {
    if (!selectedId && list.length) setSelectedId(list[0].id);
  }, [list, selectedId]);
  const selected = list.find((l) => l.id === selectedId) ?? null;

  const reset = () => {
    setMode('view');
    setPicked([]);
    setDrawn([]);
    setName('');
    setPasting(false);
    setPasted('');
  };
  const make = (body: Parameters<typeof create.mutate>[0]) =>
    create.mutate(body, {
      onSuccess: (l) => {
        setSelectedId(l.id);
        reset();
      },
    });
  const lineName = name.trim() || `Line ${list.length}`;

  if (lines.isPending) return <Progress label="Loading the lines…" />;
  if (lines.isError)
    return (
      <div className="p-4">
        <ErrorNotice error={lines.error} title="The lines could not be loaded" />
      </div>
    );

  return (
    <div className="flex flex-col">
      {canEdit && (
        <div
          className="flex flex-wrap items-end gap-2 border-b border-paper-rule px-3 py-2 text-sm"
          role="toolbar"
          aria-label="Make a line"
        >
          <Button
            size="sm"
            variant={mode === 'pick' ? 'primary' : 'secondary'}
            onClick={() => {
              reset();
              setMode('pick');
            }}
          >
            Pick stations
          </Button>
          <Button
            size="sm"
            variant={mode === 'draw' ? 'primary' : 'secondary'}
            onClick={() => {
              reset();
              setMode('draw');
            }}
          >
            Draw a line
          </Button>
          <Button
            size="sm"
            variant={pasting ? 'primary' : 'secondary'}
            onClick={() => {
              reset();
              setPasting(true);
            }}
          >
            Paste a station list
          </Button>
          {(mode !== 'view' || pasting) && (
            <>
              <label className="flex flex-col text-xs text-ink-soft">
                Name
                <input
                  aria-label="Line name"
                  className="h-7 w-40 rounded border border-ink/40 bg-paper-raised px-2 text-sm"
                  value={name}
                  onChange={(e) => setName(e.target.value)}
                  placeholder={lineName}
                />
              </label>
              {mode === 'draw' && (
                <label className="flex flex-col text-xs text-ink-soft">
                  Within (km)
                  <input
                    aria-label="Corridor in km"
                    className="h-7 w-16 rounded border border-ink/40 bg-paper-raised px-2 font-mono text-sm"
                    value={corridor}
                    onChange={(e) => setCorridor(e.target.value)}
                  />
                </label>
              )}
              {mode === 'pick' && (
                <Button
                  size="sm"
                  variant="primary"
                  disabled={picked.length < 1}
                  busy={create.isPending}
                  onClick={() => make({ name: lineName, stations: picked })}
                >
                  Make the line ({picked.length})
                </Button>
              )}
              {mode === 'draw' && (
                <Button
                  size="sm"
                  variant="primary"
                  disabled={drawn.length < 2}
                  busy={create.isPending}
                  onClick={() => make({ name: lineName, polyline: drawn, corridorKm: Number(corridor) || 30 })}
                >
                  Take the stations near it ({drawn.length} points)
                </Button>
              )}
              {pasting && (
                <Button
                  size="sm"
                  variant="primary"
                  disabled={!parseStationList(pasted).length}
                  busy={create.isPending}
                  onClick={() => make({ name: lineName, stations: parseStationList(pasted) })}
                >
                  Make the line
                </Button>
              )}
              <Button size="sm" variant="quiet" onClick={reset}>
                Cancel
              </Button>
            </>
          )}
          <span className="ml-auto text-xs text-ink-muted">
            {mode === 'pick' && 'Click stations in line order, or drag a lasso round them.'}
            {mode === 'draw' &&
              'Click the map to add the points of the line; stations within the distance are taken, in order along it.'}
          </span>
        </div>
      )}
      {pasting && (
        <textarea
          aria-label="Station list"
          className="m-3 h-16 rounded border border-ink/40 bg-paper-raised p-2 font-mono text-sm"
          value={pasted}
          onChange={(e) => setPasted(e.target.value)}
          placeholder="Station names in line order, e.g. CP-01, CP-02, CP-05"
        />
      )}
      {create.isError && (
        <div className="px-3 pt-2">
          <ErrorNotice error={create.error} title="The line could not be made" />
        </div>
      )}
      <LinesMap
        cruiseName={cruiseName}
        stations={stations}
        lines={list}
        selectedLineId={selectedId}
        onSelectLine={setSelectedId}
        mode={mode}
        picked={picked}
        drawn={drawn}
        onDrawPoint={(p) => setDrawn((d) => [...d, p])}
        onPick={(names, how) =>
          setPicked((cur) =>
            how === 'toggle' && names.length === 1 && cur.includes(names[0])
              ? cur.filter((n) => n !== names[0])
              : [...cur, ...names.filter((n) => !cur.includes(n))],
          )
        }
      />
      {selected && (
        <LineEditor
          key={selected.id}
          cruiseId={cruiseId}
          line={selected}
          canEdit={canEdit}
          onDeleted={() => setSelectedId(null)}
        />
      )}
    </div>
  );
}

/** The selected line: its stations in order with the cast of each, off-line and left-out stations. */
function LineEditor({
  cruiseId,
  line,
  canEdit,
  onDeleted,
}: {
  cruiseId: string;
  line: Line;
  canEdit: boolean;
  onDeleted: () => void;
}) {
  const update = useUpdateLine(cruiseId);
  const del = useDeleteLine(cruiseId);
  const [rename, setRename] = useState(line.name);
  const names = line.stations.map((s) => s.station);
  const patch = (body: Parameters<typeof update.mutate>[0]) => update.mutate(body);
  const move = (i: number, d: number) => {
    const next = [...names];
    const [s] = next.splice(i, 1);
    next.splice(i + d, 0, s);
    patch({ id: line.id, stations: next });
  };
  const remove = (station: string) =>
    line.isDefault
      ? patch({
          id: line.id,
          exclude: [...line.excluded.filter((e) => e.why === 'left out by the analyst').map((e) => e.station), station],
        })
      : patch({ id: line.id, stations: names.filter((n) => n !== station) });
  const setCast = (station: string, choice: CastChoice | null) => patch({ id: line.id, casts: { [station]: choice } });
  const leftOut = line.excluded.filter((e) => e.why === 'left out by the analyst').map((e) => e.station);

  return (
    <section
      aria-label={`Line ${line.name}`}
      className="flex flex-col gap-3 border-t border-paper-rule p-3 text-sm"
      data-testid="line-editor"
    >
      <div className="flex flex-wrap items-center gap-2">
        {canEdit ? (
          <input
            aria-label="Rename the line"
            className="h-8 w-56 rounded border border-ink/40 bg-paper-raised px-2 font-semibold"
            value={rename}
            onChange={(e) => setRename(e.target.value)}
            onBlur={() => rename.trim() && rename !== line.name && patch({ id: line.id, name: rename.trim() })}
          />
        ) : (
          <h3 className="font-semibold text-ink-strong">{line.name}</h3>
        )}
        <span className="text-ink-muted">
          {line.stations.length} stations{line.isDefault ? ' · the default line, kept up to date as casts arrive' : ''}
          {line.polyline ? ` · drawn, stations within ${line.corridorKm} km` : ''}
        </span>
        <Link
          className="ml-auto text-ink underline"
          to={`section?line=${encodeURIComponent(line.id)}`}
          relative="path"
          data-testid="open-section"
        >
          Open its section
        </Link>
        {canEdit && !line.isDefault && (
          <Button
            size="sm"
            variant="danger"
            busy={del.isPending}
            onClick={() => del.mutate(line.id, { onSuccess: onDeleted })}
          >
            Delete
          </Button>
        )}
      </div>
      {(update.isError || del.isError) && (
        <ErrorNotice error={update.error ?? del.error} title="The line could not be changed" />
      )}
      <div className="max-h-72 overflow-auto">
        <table className="w-full text-left">
          <thead className="text-xs uppercase tracking-[0.08em] text-ink-muted">
            <tr>
              <th className="px-1">#</th>
              <th className="px-1">Station</th>
              <th className="px-1">Cast</th>
              <th className="px-1 text-right">km</th>
              <th className="px-1" />
            </tr>
          </thead>
          <tbody>
            {line.stations.map((s, i) => (
              <tr key={s.station} className="border-t border-paper-rule">
                <td className="px-1 font-mono text-ink-muted">{i + 1}</td>
                <td className="px-1 font-mono">{s.station}</td>
                <td className="px-1">
                  {canEdit && s.candidates.length > 1 ? (
                    <CastSelect station={s} onChoose={(c) => setCast(s.station, c)} />
                  ) : (
                    <span className="font-mono">{s.cast}</span>
                  )}
                  {s.note && <span className="ml-2 text-xs text-ink-muted">{s.note}</span>}
                </td>
                <td className="px-1 text-right font-mono tabular-nums">{s.x.toFixed(1)}</td>
                <td className="whitespace-nowrap px-1 text-right">
                  {canEdit && !line.isDefault && (
                    <>
                      <Button
                        size="sm"
                        variant="quiet"
                        aria-label={`Move ${s.station} up`}
                        disabled={i === 0}
                        onClick={() => move(i, -1)}
                      >
                        ↑
                      </Button>
                      <Button
                        size="sm"
                        variant="quiet"
                        aria-label={`Move ${s.station} down`}
                        disabled={i === names.length - 1}
                        onClick={() => move(i, 1)}
                      >
                        ↓
                      </Button>
                    </>
                  )}
                  {canEdit && (
                    <Button
                      size="sm"
                      variant="quiet"
                      aria-label={`Leave ${s.station} out`}
                      onClick={() => remove(s.station)}
                    >
                      ✕
                    </Button>
                  )}
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      {line.offLine.length > 0 && (
        <p className="flex flex-wrap items-center gap-2" data-testid="off-line">
          <span className="font-semibold text-ink-soft">Off the line:</span>
          {line.offLine.map((o) => (
            <span key={o.station} className="inline-flex items-center gap-1 font-mono">
              {o.station} <span className="text-xs text-ink-muted">({o.offKm.toFixed(0)} km off)</span>
              {canEdit && (
                <Button
                  size="sm"
                  variant="secondary"
                  onClick={() => patch({ id: line.id, include: [...new Set([...line.include, o.station])] })}
                >
                  Take back in
                </Button>
              )}
            </span>
          ))}
        </p>
      )}
      {leftOut.length > 0 && canEdit && (
        <p className="flex flex-wrap items-center gap-2">
          <span className="font-semibold text-ink-soft">Left out:</span>
          {leftOut.map((n) => (
            <Button
              key={n}
              size="sm"
              variant="secondary"
              onClick={() => patch({ id: line.id, exclude: leftOut.filter((x) => x !== n) })}
            >
              Put {n} back
            </Button>
          ))}
        </p>
      )}
    </section>
  );
}

function CastSelect({
  station,
  onChoose,
}: {
  station: Line['stations'][number];
  onChoose: (c: CastChoice | null) => void;
}) {
  const deepest = station.candidates[0];
  const shallow = station.candidates.slice(1);
  const composite = station.composite;
  const value = composite ? `composite:${composite.shallowCastId}` : station.choice === 'deepest' ? '' : station.castId;
  /** A first join: 10 dbar above the shallow cast's deepest level, or half the deep cast's depth, on 10 dbar. */
  const firstJoin = (top: { deepest: number }) =>
    Math.max(10, Math.round(Math.min(top.deepest - 10, deepest.deepest / 2) / 10) * 10);
  return (
    <span className="inline-flex flex-wrap items-center gap-1">
      <select
        aria-label={`Cast at ${station.station}`}
        className="h-7 rounded border border-ink/40 bg-paper-raised px-1 font-mono text-sm"
        value={value}
        onChange={(e) => {
          const v = e.target.value;
          if (v === '') onChoose(null);
          else if (v.startsWith('composite:')) {
            const top = shallow.find((c) => c.castId === v.slice('composite:'.length)) ?? shallow[0];
            onChoose({ shallow: top.castId, deep: deepest.castId, joinPressure: firstJoin(top) });
          } else onChoose(v);
        }}
      >
        <option value="">
          deepest (cast {deepest.cast}, {deepest.deepest.toFixed(0)} dbar)
        </option>
        {station.candidates.map((c) => (
          <option key={c.castId} value={c.castId}>
            cast {c.cast} · {c.deepest.toFixed(0)} dbar
          </option>
        ))}
        {shallow.map((c) => (
          <option key={`composite:${c.castId}`} value={`composite:${c.castId}`}>
            composite: cast {c.cast} above cast {deepest.cast}
          </option>
        ))}
      </select>
      {composite && (
        <JoinField
          key={`${composite.shallowCastId}:${composite.joinPressure}`}
          station={station.station}
          join={composite.joinPressure}
          onJoin={(joinPressure) =>
            onChoose({ shallow: composite.shallowCastId, deep: composite.deepCastId, joinPressure })
          }
        />
      )}
    </span>
  );
}

/** The join pressure of a composite, dbar: sent on Enter or when the field is left, if it changed. */
function JoinField({ station, join, onJoin }: { station: string; join: number; onJoin: (p: number) => void }) {
  const [text, setText] = useState(String(join));
  const send = () => {
    const p = Number(text);
    if (Number.isFinite(p) && p > 0 && p !== join) onJoin(p);
    else setText(String(join));
  };
  return (
    <label className="inline-flex items-center gap-1 text-xs text-ink-soft">
      joined at
      <input
        aria-label={`Join pressure at ${station} in dbar`}
        className="h-7 w-16 rounded border border-ink/40 bg-paper-raised px-1 text-right font-mono text-sm tabular-nums"
        inputMode="decimal"
        value={text}
        onChange={(e) => setText(e.target.value)}
        onBlur={send}
        onKeyDown={(e) => {
          if (e.key === 'Enter') send();
        }}
      />
      dbar
    </label>
  );
}
