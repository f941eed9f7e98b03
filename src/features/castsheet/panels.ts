import { sigmaLabel } from '../../components/plot/theme';
import { sigmaProfile } from './profiles';
import type { OverlaySeries, PanelSpec } from './components/ProfileFigure';
import type { CastDetail, EarlierOccupation, Neighbour, OverlayCast } from './types';

/** The neighbours and the chosen earlier occupation's partner as overlays (earlier last, drawn on top). */
export function overlayCasts(neighbours: readonly Neighbour[], earlier: EarlierOccupation | null): OverlayCast[] {
  const out: OverlayCast[] = neighbours.map((n) => ({
    station: n.station,
    role: n.role,
    label: `${n.role} · ${n.station}`,
    columns: n.columns,
    extras: n.extras,
  }));
  if (earlier?.partner)
    out.push({
      station: earlier.partner.station,
      role: 'earlier',
      label: `${earlier.cruise} · ${earlierDate(earlier)} · ${earlier.partner.station}`,
      columns: earlier.partner.columns,
      extras: earlier.partner.extras,
    });
  return out;
}

/** The date of the earlier occupation's partner cast (else the cruise's start), YYYY-MM-DD. */
export const earlierDate = (e: EarlierOccupation) => (e.partner?.time ?? e.startDate).slice(0, 10);

function overlays(
  neighbours: readonly OverlayCast[],
  values: (n: OverlayCast) => readonly (number | null)[] | undefined,
  pressure: (n: OverlayCast) => readonly (number | null)[] | undefined = (n) => n.columns.pressure,
): OverlaySeries[] {
  const out: OverlaySeries[] = [];
  for (const n of neighbours) {
    const v = values(n);
    const p = pressure(n);
    if (v && p) out.push({ name: n.label, role: n.role, p, v });
  }
  return out;
}

/**
 * The measured variables as their own panels: in-situ temperature, practical salinity, conductivity and
 * oxygen where the cast has them, then every extra variable; each with its flags and the overlaid casts
 * (neighbours, the earlier occupation).
 */
export function measuredPanels(cast: CastDetail, neighbours: readonly OverlayCast[]): PanelSpec[] {
  const p = cast.columns.pressure;
  const c = cast.columns;
  const panels: PanelSpec[] = [];
  if (c.temperature) {
    panels.push({
      key: 'temperature',
      title: 't',
      unit: '°C',
      values: c.temperature,
      pressure: p,
      digits: 4,
      flagSources: ['temperature'],
      proposalVariables: ['temperature'],
      overlays: overlays(neighbours, (n) => n.columns.temperature),
      inversionMarks: false,
    });
  }
  if (c.SP) {
    panels.push({
      key: 'SP',
      title: 'SP',
      unit: '',
      values: c.SP,
      pressure: p,
      digits: 4,
      flagSources: ['salinity', 'conductivity'],
      proposalVariables: ['salinity'],
      overlays: overlays(neighbours, (n) => n.columns.SP),
    });
  }
  if (c.conductivity) {
    panels.push({
      key: 'conductivity',
      title: 'C',
      unit: 'mS/cm',
      values: c.conductivity,
      pressure: p,
      digits: 4,
      flagSources: ['conductivity'],
      proposalVariables: ['conductivity'],
      overlays: overlays(neighbours, (n) => n.columns.conductivity),
    });
  }
  if (c.oxygen) {
    const unit = cast.units.oxygen ?? 'µmol/kg';
    panels.push({
      key: 'oxygen',
      title: 'O₂',
      unit: unit.replace(/^umol/i, 'µmol'),
      values: c.oxygen,
      pressure: p,
      digits: 1,
      flagSources: ['oxygen'],
      proposalVariables: ['oxygen'],
      overlays: overlays(neighbours, (n) => n.columns.oxygen),
    });
  }
  for (const [name, e] of Object.entries(cast.extras)) {
    panels.push({
      key: `x:${name}`,
      title: name,
      unit: e.unit ?? '',
      values: e.values,
      pressure: p,
      digits: 3,
      flagSources: [name],
      proposalVariables: [],
      overlays: overlays(neighbours, (n) => n.extras[name]),
    });
  }
  return panels;
}

/** The derived panels as before: CT, SA, σ at the chosen reference and N², with flags and neighbours. */
export function derivedPanels(
  cast: CastDetail,
  sigma: readonly (number | null)[],
  ref: number,
  neighbours: readonly OverlayCast[],
): PanelSpec[] {
  const p = cast.columns.pressure;
  return [
    {
      key: 'CT',
      title: 'CT',
      unit: '°C',
      values: cast.columns.CT ?? [],
      pressure: p,
      digits: 4,
      flagSources: ['temperature'],
      proposalVariables: ['temperature'],
      overlays: overlays(neighbours, (n) => n.columns.CT),
    },
    {
      key: 'SA',
      title: 'SA',
      unit: 'g/kg',
      values: cast.columns.SA ?? [],
      pressure: p,
      digits: 4,
      flagSources: ['salinity', 'conductivity'],
      proposalVariables: ['salinity', 'conductivity'],
      overlays: overlays(neighbours, (n) => n.columns.SA),
    },
    {
      key: 'sigma',
      title: sigmaLabel(ref),
      unit: 'kg/m³',
      values: sigma,
      pressure: p,
      digits: 4,
      flagSources: ['temperature', 'salinity', 'conductivity'],
      proposalVariables: ['temperature', 'salinity', 'conductivity'],
      inversionMarks: true,
      overlays: overlays(neighbours, (n) => sigmaProfile(n.columns.SA, n.columns.CT, ref)),
    },
    {
      key: 'N2',
      title: 'N²',
      unit: 's⁻²',
      values: cast.columns.N2 ?? [],
      pressure: cast.columns.p_mid ?? [],
      digits: 8,
      flagSources: [],
      proposalVariables: [],
      signed: true,
      overlays: overlays(
        neighbours,
        (n) => n.columns.N2,
        (n) => n.columns.p_mid,
      ),
    },
  ];
}
