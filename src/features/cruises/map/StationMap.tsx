import { useMemo, useState } from 'react';
import { useQuery } from '@tanstack/react-query';
import { geoGraticule, geoPath } from 'd3-geo';
import { formatLatitude, formatLongitude } from '../../../lib/format';
import type { Station } from '../types';
import { degreeLabel, fitStationFrame } from './projection';
import { landQueryKey, loadLand } from './land';

const WIDTH = 800;
const HEIGHT = 460;
const MARGIN = 30;

/**
 * The cruise's stations on a coastline map: planned stations hollow, occupied (a cast exists)
 * filled, the section line through them in plan order. Drawn entirely from bundled data.
 */
export function StationMap({ stations, cruiseName }: { stations: readonly Station[]; cruiseName: string }) {
  const ordered = useMemo(() => [...stations].sort((a, b) => a.order - b.order), [stations]);
  const frame = useMemo(() => fitStationFrame(ordered, WIDTH, HEIGHT, MARGIN), [ordered]);
  const land = useQuery({ queryKey: landQueryKey, queryFn: loadLand, staleTime: Infinity, gcTime: Infinity });
  const [hovered, setHovered] = useState<string | null>(null);

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

  const points = ordered
    .map((s) => {
      const xy = frame.projection([s.longitude, s.latitude]);
      return xy ? { station: s, x: xy[0], y: xy[1] } : null;
    })
    .filter((p): p is { station: Station; x: number; y: number } => p !== null);

  const sectionLine = useMemo(
    () =>
      ordered.length > 1
        ? (path({ type: 'LineString', coordinates: ordered.map((s) => [s.longitude, s.latitude]) }) ?? '')
        : '',
    [ordered, path],
  );

  const occupied = ordered.filter((s) => s.occupied).length;
  const labelEvery = Math.max(1, Math.ceil(points.length / 24));
  const hover = points.find((p) => p.station.id === hovered) ?? null;

  const xOf = (lon: number) => frame.projection([lon, (frame.south + frame.north) / 2])?.[0] ?? 0;
  const yOf = (lat: number) => frame.projection([(frame.west + frame.east) / 2, lat])?.[1] ?? 0;

  return (
    <figure className="relative m-0">
      <svg
        viewBox={`0 0 ${WIDTH} ${HEIGHT}`}
        className="block h-auto w-full bg-sea font-sans"
        role="img"
        aria-label={`Station map of ${cruiseName}: ${ordered.length} planned stations, ${occupied} occupied`}
      >
        <defs>
          <clipPath id="station-map-frame">
            <rect x={0} y={0} width={WIDTH} height={HEIGHT} />
          </clipPath>
        </defs>
        <g clipPath="url(#station-map-frame)">
          <path d={graticulePath} fill="none" className="stroke-ink/15" strokeWidth={0.75} />
          {landPath && (
            <path d={landPath} className="fill-land stroke-ink-soft/60" strokeWidth={0.6} strokeLinejoin="round" />
          )}
          {sectionLine && (
            <path d={sectionLine} fill="none" className="stroke-ink" strokeWidth={1.25} strokeOpacity={0.7} />
          )}
          {points.map(({ station, x, y }, i) => {
            const active = hovered === station.id;
            const showLabel = active || i % labelEvery === 0 || i === points.length - 1;
            return (
              <g
                key={station.id}
                transform={`translate(${x.toFixed(1)} ${y.toFixed(1)})`}
                tabIndex={0}
                role="button"
                aria-label={`Station ${station.name}, ${station.occupied ? 'occupied' : 'planned'}, ${formatLatitude(station.latitude)} ${formatLongitude(station.longitude)}`}
                onMouseEnter={() => setHovered(station.id)}
                onMouseLeave={() => setHovered((h) => (h === station.id ? null : h))}
                onFocus={() => setHovered(station.id)}
                onBlur={() => setHovered((h) => (h === station.id ? null : h))}
                className="cursor-default outline-none"
                data-occupied={station.occupied ? 'true' : 'false'}
              >
                <circle r={9} fill="transparent" />
                <circle
                  r={active ? 5.5 : 4}
                  strokeWidth={1.5}
                  className={station.occupied ? 'fill-ink stroke-ink' : 'fill-paper-raised stroke-ink'}
                />
                {showLabel && (
                  <text
                    x={7}
                    y={-7}
                    className={`fill-ink-strong font-mono ${active ? 'font-semibold' : ''}`}
                    fontSize={10.5}
                    paintOrder="stroke"
                    stroke="#f1f1ea"
                    strokeWidth={3}
                  >
                    {station.name}
                  </text>
                )}
              </g>
            );
          })}
        </g>

        {/* Frame and degree labels at the edges. */}
        <rect x={0.5} y={0.5} width={WIDTH - 1} height={HEIGHT - 1} fill="none" className="stroke-ink/40" />
        {frame.meridians.map((lon) => {
          const x = xOf(lon);
          if (x < 24 || x > WIDTH - 24) return null;
          return (
            <g key={`m${lon}`}>
              <line x1={x} x2={x} y1={HEIGHT} y2={HEIGHT - 5} className="stroke-ink/60" />
              <text x={x} y={HEIGHT - 8} textAnchor="middle" fontSize={10} className="fill-ink-soft font-mono">
                {degreeLabel(lon, 'lon')}
              </text>
            </g>
          );
        })}
        {frame.parallels.map((lat) => {
          const y = yOf(lat);
          if (y < 14 || y > HEIGHT - 22) return null;
          return (
            <g key={`p${lat}`}>
              <line x1={0} x2={5} y1={y} y2={y} className="stroke-ink/60" />
              <text x={8} y={y + 3.5} fontSize={10} className="fill-ink-soft font-mono">
                {degreeLabel(lat, 'lat')}
              </text>
            </g>
          );
        })}
      </svg>

      {hover && (
        <div
          role="status"
          className="pointer-events-none absolute right-2 top-2 min-w-44 border border-paper-rule bg-paper-raised/95 px-3 py-2 text-xs shadow-sm"
        >
          <p className="font-mono text-sm font-semibold text-ink-strong">{hover.station.name}</p>
          <p className="font-mono tabular-nums text-ink-soft">
            {formatLatitude(hover.station.latitude)} · {formatLongitude(hover.station.longitude)}
          </p>
          <p className="text-ink-muted">
            {hover.station.occupied ? 'Occupied' : 'Planned'}
            {hover.station.plannedDepth != null && (
              <>
                {' '}
                · planned depth <span className="font-mono tabular-nums">{hover.station.plannedDepth} m</span>
              </>
            )}
          </p>
        </div>
      )}

      <figcaption className="flex flex-wrap items-center gap-x-5 gap-y-1 border-t border-paper-rule px-3 py-2 text-xs text-ink-soft">
        <span className="inline-flex items-center gap-1.5">
          <svg width="12" height="12" aria-hidden="true">
            <circle cx="6" cy="6" r="4" className="fill-paper-raised stroke-ink" strokeWidth="1.5" />
          </svg>
          Planned
        </span>
        <span className="inline-flex items-center gap-1.5">
          <svg width="12" height="12" aria-hidden="true">
            <circle cx="6" cy="6" r="4" className="fill-ink stroke-ink" strokeWidth="1.5" />
          </svg>
          Occupied (cast received)
        </span>
        <span className="inline-flex items-center gap-1.5">
          <svg width="18" height="12" aria-hidden="true">
            <line x1="1" x2="17" y1="6" y2="6" className="stroke-ink" strokeWidth="1.25" />
          </svg>
          Section line, in plan order
        </span>
        <span className="ml-auto text-ink-muted">
          {land.isPending
            ? 'Loading coastlines…'
            : land.isError
              ? 'Coastlines unavailable'
              : 'Coastlines: Natural Earth 1:50m'}{' '}
          · graticule {degreeLabel(frame.step, 'lat').replace(/[NS]$/, '')}
        </span>
      </figcaption>
    </figure>
  );
}
