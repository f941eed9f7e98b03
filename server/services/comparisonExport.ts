// Files of a comparison of two occupations: a CSV table (one frame: pressure or σ) and a NetCDF-CF
// file with every grid, both carrying provenance that names both cruises and both lines. Written
// with the project's shared writers (CSV cells and the NetCDF encoder of services/deliveries).
import {
  formatRow,
  CSV_EOL,
  writeNetcdf,
  oneLine,
  DATA_CAUTION,
  CF_CONVENTIONS,
  type NcVariable,
} from './deliveries/index';
import { EOS, SAAR_SOURCE } from './deliveryTables';
import { VERSION } from '../version';
import type { ComparisonAnswer } from './comparisons';

type Grid = (number | null)[][];

/** The provenance lines of a comparison (the same text in the CSV comments and the NetCDF attributes). */
export function comparisonProvenance(c: ComparisonAnswer, who: string): [string, string][] {
  const occ = (k: 'A' | 'B') => {
    const o = c.occupations[k];
    return `${o.cruise} (ship ${o.ship}; cruise id ${o.cruiseId}), line "${o.line}" (id ${o.lineId}), ${o.casts} casts, ${o.firstCast ?? '?'} to ${o.lastCast ?? '?'}`;
  };
  const ch = c.choices;
  return [
    ['software', `Sigmaline ${VERSION}`],
    ['equation_of_state', EOS],
    ['saar_source', SAAR_SOURCE],
    ['occupation_A', `earlier: ${occ('A')}`],
    ['occupation_B', `later: ${occ('B')}`],
    ['years_between', c.years === null ? 'unknown' : c.years.toFixed(3)],
    ['property', `${ch.property}${c.unit ? ` (${c.unit})` : ''}`],
    ['reference_pressure', `${ch.ref} dbar (${ch.sigma})`],
    ['levels', ch.levels],
    ['pressure_levels', ch.pressureLevels],
    ['inversion_handling', ch.inversions],
    ['interpolation', ch.interpolation],
    ['flags_included', ch.flags.join(', ')],
    [
      'positions',
      `${ch.positions}${ch.positions === 'regular' && ch.spacingKm ? ` every ${ch.spacingKm} km` : ''} along ${ch.line ? `a drawn line (${ch.line.map(([lon, lat]) => `${lon} ${lat}`).join('; ')})` : 'line A'}; pairing distance ${ch.pairDistanceKm} km`,
    ],
    [
      'left_out',
      `${c.excluded.length} stations (${c.excluded.map((e) => `${e.line}:${e.station}`).join(' ') || 'none'}); ` +
        `flagged levels A ${c.counts.flaggedLevels.A}, B ${c.counts.flaggedLevels.B}; cells left out ${c.counts.leftOut.pressure} on pressure, ${c.counts.leftOut.density} on isopycnals`,
    ],
    [
      'method',
      'differences B − A; heave = p_B − p_A on each isopycnal (positive when it deepened); decomposition after Bindoff & McDougall (1994, J. Phys. Oceanogr. 24, 1137–1152): ΔC|p = ΔC|σ − (∂C/∂p)·Δp|σ + residual, at the σ of A at each pressure, ∂C/∂p of A',
    ],
    ['exported_by', who],
    ['exported_at', new Date().toISOString()],
    ['caution', DATA_CAUTION],
  ];
}

const safe = (s: string) => s.replace(/[^A-Za-z0-9_]/g, '_');

/** CSV of one frame: a row per position and level, `#` provenance lines above the header. */
export function comparisonCsv(c: ComparisonAnswer, frame: 'pressure' | 'density', who: string): string {
  const prop = safe(c.choices.property);
  const lines = comparisonProvenance(c, who).map(([k, v]) => `# ${k}: ${oneLine(v)}`);
  const pairAt = (j: number) => c.pairs.find((p) => Math.abs(p.x - (c.x[j] ?? NaN)) < 1e-6);
  const head =
    frame === 'pressure'
      ? [
          'position_km',
          'latitude',
          'longitude',
          'station_A',
          'station_B',
          'pressure',
          `${prop}_A`,
          `${prop}_B`,
          `${prop}_diff`,
          'water_mass_term',
          'heave_term',
          'residual',
          'heave',
        ]
      : [
          'position_km',
          'latitude',
          'longitude',
          'station_A',
          'station_B',
          `sigma${c.choices.ref / 1000}`,
          'pressure_A',
          'pressure_B',
          'heave',
          `${prop}_A`,
          `${prop}_B`,
          `${prop}_diff`,
        ];
  const out = [...lines, formatRow(head)];
  const ys = frame === 'pressure' ? c.pressure : c.sigma;
  const grids: Grid[] =
    frame === 'pressure'
      ? [
          c.onPressure.A,
          c.onPressure.B,
          c.onPressure.diff,
          c.decomposition.waterMassTerm,
          c.decomposition.heaveTerm,
          c.decomposition.residual,
          c.decomposition.heave,
        ]
      : [c.onDensity.pA, c.onDensity.pB, c.onDensity.heave, c.onDensity.A, c.onDensity.B, c.onDensity.diff];
  c.x.forEach((x, j) => {
    const p = pairAt(j);
    const pos = c.positions[j];
    ys.forEach((y, i) => {
      const vals = grids.map((g) => g[i]?.[j] ?? null);
      if (vals.every((v) => v === null)) return;
      out.push(formatRow([x, pos.latitude, pos.longitude, p?.stationA ?? null, p?.stationB ?? null, y, ...vals]));
    });
  });
  return out.join(CSV_EOL) + CSV_EOL;
}

/** NetCDF-CF (classic) of every grid of the comparison on (pressure|sigma, position). */
export function comparisonNetcdf(c: ComparisonAnswer, who: string): Buffer {
  const nx = c.x.length;
  const flat = (g: Grid) => {
    const out: (number | null)[] = [];
    for (const row of g) for (let j = 0; j < nx; j++) out.push(row[j] ?? null);
    return out;
  };
  const unit =
    c.unit && c.unit !== ''
      ? c.unit
          .replace('°C', 'degree_Celsius')
          .replace('µmol/kg', 'umol kg-1')
          .replace('kg/m³', 'kg m-3')
          .replace('g/kg', 'g kg-1')
      : '1';
  const prop = safe(c.choices.property);
  const gridVar = (name: string, dim: 'pressure' | 'sigma', g: Grid, long: string, units: string): NcVariable => ({
    name,
    type: 'double',
    dimensions: [dim, 'position'],
    attributes: { long_name: long, units, coordinates: 'latitude longitude' },
    data: flat(g),
  });
  const sig = `sigma${c.choices.ref / 1000}`;
  const variables: NcVariable[] = [
    {
      name: 'position',
      type: 'double',
      dimensions: ['position'],
      attributes: { long_name: 'distance along line A', units: 'km' },
      data: c.x,
    },
    {
      name: 'latitude',
      type: 'double',
      dimensions: ['position'],
      attributes: { standard_name: 'latitude', units: 'degrees_north' },
      data: c.positions.map((p) => p.latitude),
    },
    {
      name: 'longitude',
      type: 'double',
      dimensions: ['position'],
      attributes: { standard_name: 'longitude', units: 'degrees_east' },
      data: c.positions.map((p) => p.longitude),
    },
    {
      name: 'pressure',
      type: 'double',
      dimensions: ['pressure'],
      attributes: { standard_name: 'sea_water_pressure', units: 'dbar', positive: 'down', axis: 'Z' },
      data: c.pressure,
    },
    {
      name: 'sigma',
      type: 'double',
      dimensions: ['sigma'],
      attributes: {
        long_name: `potential density anomaly, reference pressure ${c.choices.ref} dbar (${sig})`,
        units: 'kg m-3',
      },
      data: c.sigma,
    },
    gridVar(`${prop}_A`, 'pressure', c.onPressure.A, `${c.choices.property}, occupation A`, unit),
    gridVar(`${prop}_B`, 'pressure', c.onPressure.B, `${c.choices.property}, occupation B`, unit),
    gridVar(
      `${prop}_diff`,
      'pressure',
      c.onPressure.diff,
      `${c.choices.property} B minus A on pressure surfaces`,
      unit,
    ),
    gridVar(
      'water_mass_term',
      'pressure',
      c.decomposition.waterMassTerm,
      'change on the isopycnal of A at this pressure (Bindoff and McDougall 1994)',
      unit,
    ),
    gridVar(
      'heave_term',
      'pressure',
      c.decomposition.heaveTerm,
      'minus vertical gradient of A times heave (Bindoff and McDougall 1994)',
      unit,
    ),
    gridVar(
      'residual',
      'pressure',
      c.decomposition.residual,
      'change on pressure minus water-mass and heave terms',
      unit,
    ),
    gridVar('pressure_A', 'sigma', c.onDensity.pA, 'pressure of the isopycnal, occupation A', 'dbar'),
    gridVar('pressure_B', 'sigma', c.onDensity.pB, 'pressure of the isopycnal, occupation B', 'dbar'),
    gridVar(
      'heave',
      'sigma',
      c.onDensity.heave,
      'pressure B minus A on the isopycnal, positive when it deepened',
      'dbar',
    ),
    gridVar(`${prop}_A_on_sigma`, 'sigma', c.onDensity.A, `${c.choices.property} on the isopycnal, occupation A`, unit),
    gridVar(`${prop}_B_on_sigma`, 'sigma', c.onDensity.B, `${c.choices.property} on the isopycnal, occupation B`, unit),
    gridVar(`${prop}_diff_on_sigma`, 'sigma', c.onDensity.diff, `${c.choices.property} B minus A on isopycnals`, unit),
  ];
  const attrs: Record<string, string> = {
    Conventions: CF_CONVENTIONS,
    title: `Comparison of two occupations: ${c.occupations.A.line} (${c.occupations.A.cruise}) and ${c.occupations.B.line} (${c.occupations.B.cruise})`,
  };
  for (const [k, v] of comparisonProvenance(c, who)) attrs[k] = oneLine(v);
  attrs.history = `${new Date().toISOString()} written by Sigmaline ${VERSION}`;
  return writeNetcdf({
    dimensions: [
      { name: 'position', size: nx },
      { name: 'pressure', size: c.pressure.length },
      { name: 'sigma', size: c.sigma.length },
    ],
    globalAttributes: attrs,
    variables,
  });
}
