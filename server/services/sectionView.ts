// The section the analyst looks at: one property on a pressure × distance or σ × distance grid,
// with the stations, the bottom, isopycnals to draw over the pressure frame, and the inversion
// warnings where they are. Every choice that made it is returned beside it.
import { z } from 'zod';
import { binQuery } from '../lib/bounds';
import { applyFlags, type CruiseCast } from './cruiseData';
import { loadLineCasts, lineJson } from './lines';
import { Cast, CastColumn, DerivedVariable } from '../models/index';
import { propertyLabel, variableInfo } from '../../shared/api/variables';
import type { FileVariableResponse } from '../../shared/api/resources';
import { compileFormula } from '../../shared/derived/index';
import { sigma_batch } from '../../shared/seawater/index';
import {
  unwrapLongitudes,
  buildPressureSection,
  buildDensitySection,
  isopycnalLines,
  alongIsopycnalGradient,
  fromRows,
  toRows,
  type SectionCast,
  type DensitySectionGrid,
} from '../../shared/section/index';
import { z_from_p } from '../../shared/seawater/index';
import { resolveLevels } from './levels';
import { referencePressureSchema } from '../../shared/api/levels';
import { badRequest } from '../lib/errors';

export const SectionQuery = z.object({
  property: z
    .string()
    .regex(/^[A-Za-z_][\w:]*$/)
    .max(64)
    .default('CT'),
  coord: z.enum(['pressure', 'density']).default('pressure'),
  ref: referencePressureSchema.default(0),
  levels: z.string().max(20000).optional(),
  inversions: z.enum(['sort', 'drop', 'raw']).default('sort'),
  interpolation: z.enum(['linear', 'pchip']).default('linear'),
  bin: binQuery(10),
  gapFactor: z.coerce.number().positive().max(100).default(1.5),
  threshold: z.coerce.number().positive().max(1).default(0.01),
  /** density frame only: add the isopycnal slope and the along-isopycnal and along-level gradients */
  gradients: z
    .enum(['true', 'false'])
    .default('false')
    .transform((v) => v === 'true'),
  /** significant digits of the grid values (a screen needs 6; exports use full precision) */
  digits: z.coerce.number().int().min(3).max(17).optional(),
  /** the line to draw (docs/lines.md); without it, the cruise's default line */
  line: z.string().max(64).optional(),
  /** the x axis: distance along the line (km), or latitude or longitude where the line runs meridionally or zonally */
  xAxis: z.enum(['distance', 'latitude', 'longitude']).default('distance'),
});
export type SectionQuery = z.infer<typeof SectionQuery>;

/** Display unit of a property: the catalogue's (shared/api/variables.ts), or an extra variable's unit as its files gave it. */
function unitOf(property: string, casts: readonly CruiseCast[]): string {
  const known = variableInfo(property);
  if (known) return known.unit;
  for (const c of casts) {
    const u = c.units[property];
    if (u) return u;
  }
  return '';
}

/** The extra variables (`x:<name>`) the live casts of a cruise carry, with their units and how many casts have each. */
export async function fileVariables(cruiseId: string): Promise<FileVariableResponse[]> {
  const ids = (await Cast.findAll({ where: { cruiseId }, attributes: ['id'] })).map((c) => c.id);
  if (!ids.length) return [];
  const rows = await CastColumn.findAll({
    where: { castId: ids, kind: 'extra' },
    attributes: ['castId', 'name', 'unit'],
  });
  const by = new Map<string, { unit: string; casts: Set<string> }>();
  for (const r of rows) {
    const e = by.get(r.name) ?? { unit: r.unit ?? '', casts: new Set<string>() };
    if (!e.unit && r.unit) e.unit = r.unit;
    e.casts.add(r.castId);
    by.set(r.name, e);
  }
  return [...by.entries()]
    .sort(([a], [b]) => a.localeCompare(b))
    .map(([name, e]) => ({ name, label: propertyLabel(name).label, unit: e.unit, casts: e.casts.size }));
}

/** Columns of each cast for a property: a stored column, or the cruise's derived variable of that name. */
export async function propertyColumns(
  cruiseId: string,
  property: string,
  raw: CruiseCast[],
): Promise<(Float64Array | null)[]> {
  if (raw.some((c) => c.columns[property])) return raw.map((c) => c.columns[property] ?? null);
  const dv = await DerivedVariable.findOne({ where: { cruiseId, name: property } });
  if (!dv)
    throw badRequest(`No cast has a column or derived variable named ${property}.`, [
      { field: 'property', message: 'unknown column' },
    ]);
  return raw.map((c) => {
    const f = compileFormula(dv.formula, Object.keys(c.columns));
    if (!f.ok) return null;
    try {
      return f.evaluate(c.columns);
    } catch {
      return null;
    }
  });
}

/** Grid values to `digits` significant digits (smaller answers for screens; null stays null). */
function roundRows(rows: (number | null)[][], digits: number): (number | null)[][] {
  return rows.map((row) => row.map((v) => (v === null ? null : Number(v.toPrecision(digits)))));
}

const X_UNITS = { distance: 'km', latitude: '°N', longitude: '°E' } as const;

/**
 * x of each station by the chosen axis, keyed by cast id: the distance along the line, or the
 * latitude or the (unwrapped) longitude. A coordinate axis needs the line to run one way in it; a line
 * that runs towards the south (or west) is drawn from its far end so x still increases.
 */
function axisPositions(
  stations: { castId: string; x: number; latitude: number; longitude: number }[],
  axis: SectionQuery['xAxis'],
): Map<string, number> {
  if (axis === 'distance') return new Map(stations.map((st) => [st.castId, st.x]));
  const v =
    axis === 'latitude'
      ? stations.map((st) => st.latitude)
      : Array.from(unwrapLongitudes(stations.map((st) => st.longitude)));
  const up = v.every((x, i) => i === 0 || x > v[i - 1]);
  const down = v.every((x, i) => i === 0 || x < v[i - 1]);
  if (!up && !down) {
    throw badRequest(`The line does not run one way in ${axis}: draw it against distance.`, [
      { field: 'xAxis', message: `${axis} is not monotonic along the line` },
    ]);
  }
  return new Map(stations.map((st, i) => [st.castId, v[i]]));
}

export async function buildSectionView(cruiseId: string, q: SectionQuery) {
  const resolved = await loadLineCasts(
    cruiseId,
    q.line,
    q.property.startsWith('x:') || /^(sigma\d|CT|SA|SP|temperature|pt0|spiciness0|rho|oxygen|depth)$/.test(q.property)
      ? [q.property]
      : undefined,
  );
  const all = resolved.casts;
  const { stations: lineStations, ...lineRest } = lineJson(resolved);
  const line = { ...lineRest, stations: lineStations.map(({ candidates: _c, ...s }) => s) };
  const { text: levelsText, levels: targets } = resolveLevels(all, q.ref, q.levels);
  const choices = {
    property: q.property,
    coord: q.coord,
    ref: q.ref,
    sigma: `sigma${q.ref / 1000}`,
    levels: levelsText,
    inversions: q.inversions,
    interpolation: q.interpolation,
    bin: q.bin,
    gapFactor: q.gapFactor,
    threshold: q.threshold,
    line: resolved.id,
    xAxis: q.xAxis,
    xUnit: X_UNITS[q.xAxis],
  };
  const xById = axisPositions(resolved.stations, q.xAxis);
  const raw = all.filter((c) => c.columns.pressure && c.columns.pressure.length > 1);
  if (!raw.length)
    return {
      choices,
      line,
      unit: unitOf(q.property, all),
      grid: { x: [], y: [], z: [] },
      pressure: null,
      stations: [],
      bottom: [],
      gaps: [],
      inversions: [],
      isopycnals: [],
    };
  // A line that runs south (or west) in the chosen coordinate is drawn from its far end.
  if (raw.length > 1 && xById.get(raw[0].id)! > xById.get(raw[raw.length - 1].id)!) raw.reverse();
  const positions = raw.map((c) => xById.get(c.id)!);
  const values = await propertyColumns(cruiseId, q.property, raw);
  const casts: SectionCast[] = raw.map((c, i) => {
    const v = values[i] ?? new Float64Array(c.columns.pressure.length).fill(NaN);
    const cols = applyFlags({ ...c, columns: { ...c.columns, [q.property]: v } }, [1, 2]);
    const sigma = sigma_batch(cols.SA, cols.CT, q.ref);
    return {
      id: c.id,
      station: c.station,
      lon: c.longitude,
      lat: c.latitude,
      bottomDepth: c.bottomDepth,
      p: cols.pressure,
      z: cols.z,
      sigma,
      props: { [q.property]: cols[q.property] },
    };
  });
  const byId = new Map(raw.map((c) => [c.id, c]));
  const common = { gapFactor: q.gapFactor, inversionThreshold: q.threshold, positions };
  const grid =
    q.coord === 'pressure'
      ? buildPressureSection(casts, { property: q.property, binSize: q.bin, ...common })
      : buildDensitySection(casts, {
          property: q.property,
          targets,
          handling: q.inversions,
          interpolation: q.interpolation,
          ...common,
        });
  const lineInfo = new Map(
    resolved.stations.map((st) => [st.castId, { choice: st.choice, composite: st.composite, note: st.note }]),
  );
  const stations = grid.casts.map((g) => {
    const c = byId.get(g.id)!;
    return {
      id: g.id,
      station: g.station,
      cast: c.cast,
      x: g.x,
      latitude: g.lat,
      longitude: g.lon,
      bottom: g.bottom,
      bottomDepth: g.bottomDepth,
      bottomKnown: g.bottomKnown,
      deepest: c.columns.pressure[c.columns.pressure.length - 1],
      ...lineInfo.get(g.id),
    };
  });
  const sigmaById = new Map(casts.map((c) => [c.id, c]));
  const inversions = grid.casts.flatMap((g) =>
    g.inversions.map((v) => {
      const c = sigmaById.get(g.id)!;
      const at = (p: number) => {
        let k = 0;
        while (k < c.p.length - 1 && c.p[k] < p) k++;
        return c.sigma[k];
      };
      return {
        castId: g.id,
        station: g.station,
        x: g.x,
        pTop: v.pTop,
        pBottom: v.pBottom,
        deficit: v.deficit,
        class: v.class,
        sigmaTop: at(v.pTop),
        sigmaBottom: at(v.pBottom),
      };
    }),
  );
  const lineLevels = Float64Array.from(
    targets.filter((_, i) => i % Math.max(1, Math.round(targets.length / 14)) === 0),
  );
  const lines =
    q.coord === 'pressure' ? isopycnalLines(casts, lineLevels, q.inversions, q.interpolation, { positions }) : null;
  const isopycnals = lines ? lines.sigma.map((sigma, j) => ({ sigma, p: lines.p[j] })) : [];
  const dens = grid as Partial<DensitySectionGrid>;
  let gradients = null;
  if (q.coord === 'density' && q.gradients && dens.depth) {
    // (∂φ/∂x)_σ = (∂φ/∂x)_z + (∂φ/∂z)_x · (∂z/∂x)_σ, on the same distance columns as the level grid.
    const levels = buildPressureSection(casts, { property: q.property, binSize: q.bin, ...common });
    const meanLat = casts.reduce((a, c) => a + c.lat, 0) / casts.length;
    const levelDepth = Float64Array.from(levels.y, (pp) => -z_from_p(pp, meanLat));
    const g = alongIsopycnalGradient(
      Float64Array.from(grid.x),
      levelDepth,
      fromRows(levels.z),
      fromRows(dens.depth),
      grid.y.length,
    );
    const rows = (a: Float64Array) => toRows(a, grid.x.length, grid.y.length);
    gradients = {
      units: { slope: 'm/m (z up)', gradient: `${unitOf(q.property, all) || 'unit'} per m` },
      slope: rows(g.slope),
      alongLevel: rows(g.alongLevel),
      alongIsopycnal: rows(g.alongIsopycnal),
    };
  }
  const r = (rows: (number | null)[][] | null | undefined) =>
    rows && q.digits ? roundRows(rows, q.digits) : (rows ?? null);
  if (gradients && q.digits)
    gradients = {
      ...gradients,
      slope: r(gradients.slope)!,
      alongLevel: r(gradients.alongLevel)!,
      alongIsopycnal: r(gradients.alongIsopycnal)!,
    };
  return {
    choices: { ...choices, digits: q.digits ?? null },
    line,
    unit: unitOf(q.property, all),
    grid: { x: grid.x, y: grid.y, z: r(grid.z)! },
    pressure: r(dens.pressure),
    depth: r(dens.depth),
    stations,
    bottom: grid.bottom,
    gaps: grid.gaps,
    medianSpacingKm: grid.medianSpacingKm,
    inversions,
    isopycnals,
    gradients,
  };
}
