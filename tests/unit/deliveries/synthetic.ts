// Seeded synthetic delivery tables for the writer tests and the benchmark. The numbers are random
// (not invented "real" data): they exercise the writers, not the science.
import {
  buildIsopycnalTable,
  buildPressureTable,
  type DeliveryTable,
  type IsopycnalFlag,
  type IsopycnalRow,
  type PressureRow,
  type Provenance,
} from '../../../server/services/deliveries/table';
import { mulberry32 } from '../../../scripts/lib/prng';

export const rng = mulberry32;

export function provenance(overrides: Partial<Provenance> = {}): Provenance {
  return {
    software: 'Sigmaline',
    version: '0.1.0-test',
    equationOfState: 'TEOS-10, 75-term polynomial (Roquet et al. 2015)',
    functions: ['SA_from_SP', 'CT_from_t', 'sigma0', 'z_from_p'],
    saarSource: 'SAAR atlas (McDougall et al. 2012), test build',
    referencePressure: 0,
    layerSet: 'synthetic layer set',
    inversionHandling: 'sort',
    interpolation: 'linear in sigma',
    flagsIncluded: [2, 3],
    exportedBy: 'pi@sigmaline.test',
    exportedAt: '2026-03-04T05:06:07.000Z',
    cruise: { id: 'c-test', name: 'Synthetic cruise', ship: 'RV Test' },
    ...overrides,
  };
}

const TRICKY = [
  'K-07',
  '12A',
  '=1+2',
  '+44',
  '-3',
  '@SUM',
  '\tTab',
  'a,b',
  'say "hi"',
  'line\nbreak',
  'Ünïcødé',
  ' spaced ',
];

export interface SyntheticOptions {
  seed: number;
  casts: number;
  levels: number;
  /** Use tricky station names (formula starts, commas, quotes, newlines). */
  tricky?: boolean;
  /** Two reference pressures (sigma0 then sigma2) instead of one. */
  twoRefs?: boolean;
  extras?: boolean;
}

/** A random number spread over many orders of magnitude and signs. */
function wild(r: () => number): number {
  const k = r();
  if (k < 0.05) return 0;
  const mag = Math.pow(10, Math.floor(r() * 24) - 12);
  return (r() < 0.5 ? -1 : 1) * r() * mag;
}

export function syntheticIsopycnalRows(o: SyntheticOptions): IsopycnalRow[] {
  const r = rng(o.seed);
  const rows: IsopycnalRow[] = [];
  for (let c = 0; c < o.casts; c++) {
    const station = o.tricky ? `${TRICKY[c % TRICKY.length]}${c >= TRICKY.length ? c : ''}` : `S${c + 1}`;
    const cast = String(1 + Math.floor(r() * 3));
    const latitude = -80 + 160 * r();
    const longitude = -180 + 360 * r();
    const time = new Date(Date.UTC(2026, 2, 4) + Math.floor(r() * 86400 * 20) * 1000).toISOString();
    const top = Math.floor(r() * Math.min(5, o.levels));
    const bottom = o.levels - Math.floor(r() * Math.min(5, o.levels));
    for (let l = 0; l < o.levels; l++) {
      const ref = o.twoRefs && l >= o.levels / 2 ? 2000 : 0;
      const sigma_level = (ref === 0 ? 24 : 35) + l * 0.0125 + (o.twoRefs ? 0 : 0);
      const exists = l >= top && l < bottom;
      const flags: IsopycnalFlag[] = [];
      if (l < top) flags.push('outcrop');
      if (l >= bottom) flags.push('below_bottom');
      const crossings = exists ? (r() < 0.1 ? 3 : 1) : 0;
      if (crossings > 1) flags.push('multi_crossing');
      if (exists && r() < 0.1) flags.push('in_inversion');
      const p = exists ? 5 + l * 20 + r() * 10 : null;
      rows.push({
        station,
        cast,
        latitude,
        longitude,
        sigma_ref: ref,
        sigma_level,
        pressure: p,
        depth: p === null ? null : p * (0.99 + 0.001 * r()),
        CT: exists ? -2 + 32 * r() : null,
        SA: exists ? (r() < 0.05 ? wild(r) : 30 + 8 * r()) : null,
        thickness: exists && l < bottom - 1 ? 10 * r() : null,
        crossings: exists ? crossings : null,
        flags,
        extras: o.extras
          ? {
              time,
              oxygen: exists ? wild(r) : null,
              note: exists && r() < 0.2 ? TRICKY[Math.floor(r() * TRICKY.length)] : null,
            }
          : undefined,
      });
    }
  }
  return rows;
}

export function syntheticIsopycnalTable(o: SyntheticOptions, prov: Provenance = provenance()): DeliveryTable {
  return buildIsopycnalTable(
    syntheticIsopycnalRows(o),
    prov,
    o.extras
      ? {
          extraColumns: [
            { name: 'time', unit: 'ISO 8601 UTC', type: 'string', long_name: 'Time of the cast' },
            { name: 'oxygen', unit: 'umol/kg', type: 'number', long_name: 'Dissolved oxygen' },
            { name: 'note', unit: null, type: 'string', long_name: 'Analyst note' },
          ],
        }
      : {},
  );
}

export function syntheticPressureTable(
  o: { seed: number; casts: number; bins: number; binSize?: number },
  prov: Provenance = provenance(),
): DeliveryTable {
  const r = rng(o.seed);
  const rows: PressureRow[] = [];
  const bin = o.binSize ?? 2;
  for (let c = 0; c < o.casts; c++) {
    const latitude = -80 + 160 * r();
    const longitude = -180 + 360 * r();
    const deepest = o.bins - Math.floor(r() * o.bins * 0.3);
    for (let b = 0; b < o.bins; b++) {
      const has = b < deepest;
      rows.push({
        station: `S${c + 1}`,
        cast: '1',
        latitude,
        longitude,
        pressure: bin * b + bin / 2,
        count: has ? 1 + Math.floor(r() * 48) : 0,
        CT: has ? -2 + 32 * r() : null,
        SA: has ? 30 + 8 * r() : null,
        sigma0: has ? 20 + 8 * r() : null,
        depth: has ? (bin * b + bin / 2) * 0.99 : null,
        t: has ? -2 + 32 * r() : null,
        SP: has ? 30 + 8 * r() : null,
      });
    }
  }
  return buildPressureTable(rows, { ...prov, referencePressure: 0, layerSet: null });
}
