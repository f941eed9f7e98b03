import { useMemo, useRef, useState, type PointerEvent as ReactPointerEvent } from 'react';
import { useQuery } from '@tanstack/react-query';
import { geoGraticule, geoPath } from 'd3-geo';
import { degreeLabel, fitStationFrame, landQueryKey, loadLand, type Station } from '../../cruises';
import { insidePolygon, placeLabels } from '../labels';
import { lineStyle } from '../styles';
import type { Line } from '../types';

const WIDTH = 800;
const HEIGHT = 460;
const MARGIN = 30;

export type MapMode = 'view' | 'pick' | 'draw';

export interface MapStation {
  name: string;
  latitude: number;
  longitude: number;
  occupied: boolean;
}

/** Every station to map: the plan's, and those the lines know of (occupied without a plan). */
export function mapStations(plan: readonly Station[], lines: readonly Line[]): MapStation[] {
  const by = new Map<string, MapStation>();
  for (const s of [...plan].sort((a, b) => a.order - b.order))
    by.set(s.name, { name: s.name, latitude: s.latitude, longitude: s.longitude, occupied: s.occupied });
  for (const l of lines) {
    for (const s of [...l.stations, ...l.offLine]) {
      const had = by.get(s.station);
      by.set(s.station, {
        name: s.station,
        latitude: had?.latitude ?? s.latitude,
        longitude: had?.longitude ?? s.longitude,
        occupied: true,
      });
    }
  }
  return [...by.values()];
}

export interface LinesMapProps {
  cruiseName: string;
  stations: MapStation[];
  lines: readonly Line[];
  selectedLineId: string | null;
  onSelectLine: (id: string) => void;
  mode: MapMode;
  picked: readonly string[];
  onPick: (names: string[], how: 'toggle' | 'add') => void;
  drawn: readonly [number, number][];
  onDrawPoint: (lonLat: [number, number]) => void;
}

/**
 * The cruise desk map of lines: every line in its own style (the selected one on top), stations
 * hollow when only planned, filled when occupied, off-line stations of the default line as crosses,
 * picked stations ringed. In pick mode a click toggles a station and a drag draws a lasso; in draw mode
 * each click adds a vertex of a polyline. Labels are placed so that none overlaps another.
 */
export function LinesMap(props: LinesMapProps) {
  const { stations, lines, selectedLineId, mode, picked, drawn } = props;
  const frame = useMemo(() => fitStationFrame(stations, WIDTH, HEIGHT, MARGIN), [stations]);
  const land = useQuery({ queryKey: landQueryKey, queryFn: loadLand, staleTime: Infinity, gcTime: Infinity });
  const path = useMemo(() => geoPath(frame.projection), [frame]);
  const landPath = useMemo(() => (land.data ? (path(land.data) ?? '') : ''), [land.data, path]);
  const graticulePath = useMemo(() => {
    const g = geoGraticule()
      .step([frame.step, frame.step])
      .extent([
        [frame.west - frame.step, Math.max(-89.9, frame.south - frame.step)],
        [frame.east + frame.step, Math.min(89.9, frame.north + frame.step)],
      ]);
    return path(g()) ?? '';
  }, [frame, path]);
  const svgRef = useRef<SVGSVGElement>(null);
  const [lasso, setLasso] = useState<[number, number][] | null>(null);
  const [hovered, setHovered] = useState<string | null>(null);

  const pts = useMemo(
    () =>
      stations
        .map((s) => {
          const xy = frame.projection([s.longitude, s.latitude]);
          return xy ? { s, x: xy[0], y: xy[1] } : null;
        })
        .filter((p): p is { s: MapStation; x: number; y: number } => p !== null),
    [stations, frame],
  );
  const offLine = new Set(lines.find((l) => l.isDefault)?.offLine.map((o) => o.station) ?? []);
  const selected = lines.find((l) => l.id === selectedLineId) ?? null;
  const pickedSet = new Set(picked);

  // Labels: the selected line's stations first (its ends first of all), then the others.
  const labels = useMemo(() => {
    const order: string[] = [];
    if (selected && selected.stations.length) {
      const names = selected.stations.map((s) => s.station);
      order.push(names[0], names[names.length - 1], ...names.slice(1, -1));
    }
    for (const p of pts) if (!order.includes(p.s.name)) order.push(p.s.name);
    const at = new Map(pts.map((p) => [p.s.name, p]));
    return placeLabels(
      order
        .map((n) => at.get(n))
        .filter((p): p is NonNullable<typeof p> => !!p)
        .map((p) => ({ id: p.s.name, x: p.x, y: p.y, text: p.s.name })),
      { width: WIDTH, heightLimit: HEIGHT - 16 },
    );
  }, [pts, selected]);

  const toSvg = (e: { clientX: number; clientY: number }): [number, number] => {
    const svg = svgRef.current!;
    const m = svg.getScreenCTM();
    if (!m) return [0, 0];
    const p = new DOMPoint(e.clientX, e.clientY).matrixTransform(m.inverse());
    return [p.x, p.y];
  };
  const onDown = (e: ReactPointerEvent<SVGSVGElement>) => {
    if (mode !== 'pick' || (e.target as Element).closest('[data-station]')) return;
    (e.currentTarget as Element).setPointerCapture?.(e.pointerId);
    setLasso([toSvg(e)]);
  };
  const onMove = (e: ReactPointerEvent<SVGSVGElement>) => {
    if (lasso) setLasso([...lasso, toSvg(e)]);
  };
  const onUp = () => {
    if (!lasso) return;
    if (lasso.length > 4) {
      const inside = pts.filter((p) => insidePolygon(p.x, p.y, lasso)).map((p) => p.s.name);
      if (inside.length) props.onPick(inside, 'add');
    }
    setLasso(null);
  };
  const onClick = (e: React.MouseEvent<SVGSVGElement>) => {
    if (mode !== 'draw') return;
    const xy = toSvg(e);
    const ll = frame.projection.invert?.(xy);
    if (ll) props.onDrawPoint([Number(ll[0].toFixed(4)), Number(ll[1].toFixed(4))]);
  };

  const lineD = (l: Line) =>
    l.stations.length > 1
      ? (path({ type: 'LineString', coordinates: l.stations.map((s) => [s.longitude, s.latitude]) }) ?? '')
      : '';
  const drawnD =
    drawn.length > 1 ? (path({ type: 'LineString', coordinates: drawn.map((p) => [p[0], p[1]]) }) ?? '') : '';
  const drawnPts = drawn.map((p) => frame.projection([p[0], p[1]])).filter((p): p is [number, number] => !!p);
  const ordered = [...lines.map((l, i) => ({ l, i }))].sort(
    (a, b) => Number(a.l.id === selectedLineId) - Number(b.l.id === selectedLineId),
  );
  const xOf = (lon: number) => frame.projection([lon, (frame.south + frame.north) / 2])?.[0] ?? 0;
  const yOf = (lat: number) => frame.projection([(frame.west + frame.east) / 2, lat])?.[1] ?? 0;
  const hover = pts.find((p) => p.s.name === hovered);

  return (
    <figure className="relative m-0">
      <svg
        ref={svgRef}
        viewBox={`0 0 ${WIDTH} ${HEIGHT}`}
        className={`block h-auto w-full touch-none select-none bg-sea font-sans ${mode === 'view' ? '' : 'cursor-crosshair'}`}
        role="img"
        aria-label={`Map of the lines of ${props.cruiseName}: ${lines.length} lines, ${stations.length} stations`}
        data-testid="lines-map"
        data-mode={mode}
        onPointerDown={onDown}
        onPointerMove={onMove}
        onPointerUp={onUp}
        onClick={onClick}
      >
        <defs>
          <clipPath id="lines-map-frame">
            <rect x={0} y={0} width={WIDTH} height={HEIGHT} />
          </clipPath>
        </defs>
        <g clipPath="url(#lines-map-frame)">
          <path d={graticulePath} fill="none" className="stroke-ink/15" strokeWidth={0.75} />
          {landPath && (
            <path d={landPath} className="fill-land stroke-ink-soft/60" strokeWidth={0.6} strokeLinejoin="round" />
          )}
          {ordered.map(({ l, i }) => {
            const st = lineStyle(i);
            const sel = l.id === selectedLineId;
            return (
              <path
                key={l.id}
                d={lineD(l)}
                fill="none"
                stroke={st.stroke}
                strokeDasharray={st.dash}
                strokeWidth={sel ? st.width + 1.2 : st.width}
                strokeOpacity={sel || !selectedLineId ? 0.95 : 0.55}
                strokeLinejoin="round"
                data-line={l.name}
                className={mode === 'view' ? 'cursor-pointer' : ''}
                onClick={() => mode === 'view' && props.onSelectLine(l.id)}
              />
            );
          })}
          {drawnD && (
            <path
              d={drawnD}
              fill="none"
              stroke="#b4532a"
              strokeWidth={2}
              strokeDasharray="3 3"
              data-testid="drawn-polyline"
            />
          )}
          {drawnPts.map(([x, y], k) => (
            <rect key={k} x={x - 3} y={y - 3} width={6} height={6} fill="#f1f1ea" stroke="#b4532a" strokeWidth={1.5} />
          ))}
          {pts.map(({ s, x, y }) => {
            const off = offLine.has(s.name);
            const isPicked = pickedSet.has(s.name);
            return (
              <g
                key={s.name}
                transform={`translate(${x.toFixed(1)} ${y.toFixed(1)})`}
                data-station={s.name}
                data-off-line={off ? 'true' : undefined}
                onMouseEnter={() => setHovered(s.name)}
                onMouseLeave={() => setHovered((h) => (h === s.name ? null : h))}
                onClick={(e) => {
                  if (mode === 'pick') {
                    e.stopPropagation();
                    props.onPick([s.name], 'toggle');
                  }
                }}
                className={mode === 'pick' ? 'cursor-pointer' : ''}
              >
                <circle r={9} fill="transparent" />
                {isPicked && <circle r={7.5} fill="none" stroke="#b4532a" strokeWidth={2} />}
                {off ? (
                  <path d="M-4 -4 L4 4 M-4 4 L4 -4" stroke="#8a2f1d" strokeWidth={2} />
                ) : (
                  <circle
                    r={3.8}
                    strokeWidth={1.5}
                    className={s.occupied ? 'fill-ink stroke-ink' : 'fill-paper-raised stroke-ink'}
                  />
                )}
              </g>
            );
          })}
          {labels.map((l) => (
            <text
              key={l.id}
              x={l.lx}
              y={l.ly}
              textAnchor={l.anchor}
              className="pointer-events-none fill-ink-strong font-mono"
              fontSize={10.5}
              paintOrder="stroke"
              stroke="#f1f1ea"
              strokeWidth={3}
              data-label={l.id}
            >
              {l.text}
            </text>
          ))}
          {lasso && lasso.length > 1 && (
            <polygon
              points={lasso.map((p) => p.join(',')).join(' ')}
              fill="#b4532a22"
              stroke="#b4532a"
              strokeDasharray="4 3"
            />
          )}
        </g>
        <rect x={0.5} y={0.5} width={WIDTH - 1} height={HEIGHT - 1} fill="none" className="stroke-ink/40" />
        {frame.meridians.map((lon) => {
          const x = xOf(lon);
          if (x < 24 || x > WIDTH - 24) return null;
          return (
            <text
              key={`m${lon}`}
              x={x}
              y={HEIGHT - 6}
              textAnchor="middle"
              fontSize={10}
              className="fill-ink-soft font-mono"
            >
              {degreeLabel(lon, 'lon')}
            </text>
          );
        })}
        {frame.parallels.map((lat) => {
          const y = yOf(lat);
          if (y < 14 || y > HEIGHT - 22) return null;
          return (
            <text key={`p${lat}`} x={6} y={y + 3.5} fontSize={10} className="fill-ink-soft font-mono">
              {degreeLabel(lat, 'lat')}
            </text>
          );
        })}
      </svg>
      {hover && (
        <div
          role="status"
          className="pointer-events-none absolute right-2 top-2 border border-paper-rule bg-paper-raised/95 px-3 py-1.5 text-xs shadow-sm"
        >
          <span className="font-mono font-semibold text-ink-strong">{hover.s.name}</span>
          <span className="text-ink-muted">
            {' '}
            · {offLine.has(hover.s.name) ? 'off the line' : hover.s.occupied ? 'occupied' : 'planned'}
          </span>
        </div>
      )}
      <figcaption className="flex flex-wrap items-center gap-x-4 gap-y-1 border-t border-paper-rule px-3 py-2 text-xs text-ink-soft">
        {lines.map((l, i) => {
          const st = lineStyle(i);
          return (
            <button
              key={l.id}
              type="button"
              onClick={() => props.onSelectLine(l.id)}
              className={`inline-flex items-center gap-1.5 rounded px-1 ${l.id === selectedLineId ? 'bg-ink-wash font-semibold text-ink-strong' : ''}`}
            >
              <svg width="26" height="10" aria-hidden="true">
                <line
                  x1="1"
                  x2="25"
                  y1="5"
                  y2="5"
                  stroke={st.stroke}
                  strokeDasharray={st.dash}
                  strokeWidth={st.width}
                />
              </svg>
              {l.name}
            </button>
          );
        })}
        <span className="inline-flex items-center gap-1.5">
          <svg width="12" height="12" aria-hidden="true">
            <path d="M2 2 L10 10 M2 10 L10 2" stroke="#8a2f1d" strokeWidth="2" />
          </svg>
          Off the line
        </span>
        <span className="ml-auto text-ink-muted">
          {land.isPending ? 'Loading coastlines…' : 'Coastlines: Natural Earth 1:50m'}
        </span>
      </figcaption>
    </figure>
  );
}
