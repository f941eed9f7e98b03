// The section the analyst looks at: one property on a pressure × distance or σ × distance grid,
// with the stations, the bottom, isopycnals to draw over the pressure frame, and the inversion
// warnings where they are. Every choice that made it is returned beside it.
import { z } from 'zod';
import { loadCruiseCasts, applyFlags } from './cruiseData';
import { sigma_batch } from '../../shared/seawater/index';
import { alongTrackDistance, buildPressureSection, buildDensitySection, isopycnalLines, type SectionCast } from '../../shared/section/index';
import { safeParseLevels, detectInversions } from '../../shared/remap/index';
import { badRequest } from '../lib/errors';

const REFS = [0, 1000, 2000, 3000, 4000];
export const SectionQuery = z.object({
  property: z.string().regex(/^[A-Za-z_][\w:]*$/).max(64).default('CT'),
  coord: z.enum(['pressure', 'density']).default('pressure'),
  ref: z.coerce.number().refine((v) => REFS.includes(v), 'the reference pressure is one of 0, 1000, 2000, 3000, 4000 dbar').default(0),
  levels: z.string().max(20000).optional(),
  inversions: z.enum(['sort', 'drop', 'raw']).default('sort'),
  interpolation: z.enum(['linear', 'pchip']).default('linear'),
  bin: z.coerce.number().positive().max(500).default(10),
  gapFactor: z.coerce.number().positive().max(100).default(1.5),
  threshold: z.coerce.number().positive().max(1).default(0.01),
});
export type SectionQuery = z.infer<typeof SectionQuery>;

const DEFAULT_LEVELS: Record<number, string> = { 0: '23.0:0.05:27.9', 1000: '27.5:0.05:32.5', 2000: '32.0:0.05:37.2', 3000: '37.0:0.05:41.6', 4000: '41.0:0.05:46.0' };
const UNITS: Record<string, string> = { CT: '°C', SA: 'g/kg', SP: '', temperature: '°C', pt0: '°C', oxygen: 'µmol/kg', sigma0: 'kg/m³', sigma1: 'kg/m³', sigma2: 'kg/m³', sigma3: 'kg/m³', sigma4: 'kg/m³', spiciness0: 'kg/m³', rho: 'kg/m³' };

export async function buildSectionView(cruiseId: string, q: SectionQuery) {
  const levelsText = q.levels ?? DEFAULT_LEVELS[q.ref];
  const parsed = safeParseLevels(levelsText);
  if (!parsed.ok) throw badRequest(`The levels are not valid: ${parsed.errors.join('; ')}`, parsed.errors.map((m) => ({ field: 'levels', message: m })));
  const targets = parsed.levels;
  const raw = await loadCruiseCasts(cruiseId, [q.property]);
  if (raw.length && !raw.some((c) => c.columns[q.property])) throw badRequest(`No cast has a column named ${q.property}.`, [{ field: 'property', message: 'unknown column' }]);
  const casts: SectionCast[] = raw.map((c) => {
    const cols = applyFlags(c, [1, 2]);
    const sigma = sigma_batch(cols.SA, cols.CT, q.ref);
    return { id: c.id, station: c.station, lon: c.longitude, lat: c.latitude, bottomDepth: c.bottomDepth, p: cols.pressure, z: cols.z, sigma,
      props: { [q.property]: cols[q.property] ?? new Float64Array(cols.pressure.length).fill(NaN) } };
  });
  const x = alongTrackDistance(Float64Array.from(casts.map((c) => c.lon)), Float64Array.from(casts.map((c) => c.lat)));
  const stations = raw.map((c, i) => ({ id: c.id, station: c.station, cast: c.cast, x: x[i], latitude: c.latitude, longitude: c.longitude,
    bottom: c.bottomDepth, deepest: c.columns.pressure.length ? c.columns.pressure[c.columns.pressure.length - 1] : null }));
  // Inversions of the σ this view uses (σ0 ones are stored; other references are found here).
  const inversions = casts.flatMap((c, i) => {
    const found = q.ref === 0 ? raw[i].inversions : detectInversions(c.p, c.sigma, { threshold: q.threshold });
    return found.map((v) => ({ castId: c.id, station: c.station, x: x[i], pTop: v.pTop, pBottom: v.pBottom, deficit: v.deficit, class: v.class,
      sigmaTop: c.sigma[v.iTop], sigmaBottom: c.sigma[v.iBottom] }));
  });
  const choices = { property: q.property, coord: q.coord, ref: q.ref, sigma: `sigma${q.ref / 1000}`, levels: levelsText, inversions: q.inversions, interpolation: q.interpolation,
    bin: q.bin, gapFactor: q.gapFactor, threshold: q.threshold };
  if (!casts.length) return { choices, unit: UNITS[q.property] ?? '', grid: { x: [], y: [], z: [] }, stations, inversions, isopycnals: [] };
  const grid = q.coord === 'pressure'
    ? buildPressureSection(casts, { property: q.property, binSize: q.bin, gapFactor: q.gapFactor })
    : buildDensitySection(casts, { property: q.property, targets, handling: q.inversions, interpolation: q.interpolation, gapFactor: q.gapFactor });
  const lineLevels = targets.filter((_, i) => i % Math.max(1, Math.round(targets.length / 12)) === 0);
  const isopycnals = q.coord === 'pressure' ? isopycnalLines(casts, Float64Array.from(lineLevels), q.inversions) : [];
  return { choices, unit: UNITS[q.property] ?? '', grid, stations, inversions, isopycnals };
}
