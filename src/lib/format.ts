/** Display formats. Dates stay ISO (YYYY-MM-DD) and times UTC: a cruise crosses time zones. */

export function formatLatitude(lat: number, digits = 3): string {
  const hemi = lat < 0 ? 'S' : 'N';
  return `${Math.abs(lat).toFixed(digits)}° ${hemi}`;
}

export function formatLongitude(lon: number, digits = 3): string {
  const hemi = lon < 0 ? 'W' : 'E';
  return `${Math.abs(lon).toFixed(digits)}° ${hemi}`;
}

/** `2026-03-04T05:06:00Z` → `2026-03-04 05:06Z`; anything unparseable is shown as given. */
export function formatUtc(iso: string | null | undefined): string {
  if (!iso) return '—';
  const d = new Date(iso);
  if (Number.isNaN(d.getTime())) return iso;
  return `${d.toISOString().slice(0, 10)} ${d.toISOString().slice(11, 16)}Z`;
}

export function formatDateRange(start: string | null | undefined, end: string | null | undefined): string {
  if (!start && !end) return '—';
  return `${start ?? '…'} – ${end ?? '…'}`;
}

/** Whole days from start to end inclusive, or null if either is missing. */
export function cruiseDays(start: string | null | undefined, end: string | null | undefined): number | null {
  if (!start || !end) return null;
  const a = Date.parse(`${start}T00:00:00Z`);
  const b = Date.parse(`${end}T00:00:00Z`);
  if (Number.isNaN(a) || Number.isNaN(b)) return null;
  return Math.round((b - a) / 86_400_000) + 1;
}

export function plural(n: number, one: string, many = `${one}s`): string {
  return `${n} ${n === 1 ? one : many}`;
}
