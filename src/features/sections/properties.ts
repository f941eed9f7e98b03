/** The cast columns a section can show, with how they read and their units. N² is left out: it lives on mid-points. */
export const SECTION_PROPERTIES: readonly { name: string; label: string; unit: string }[] = [
  { name: 'CT', label: 'Conservative Temperature', unit: '°C' },
  { name: 'SA', label: 'Absolute Salinity', unit: 'g/kg' },
  { name: 'SP', label: 'Practical Salinity', unit: '' },
  { name: 'temperature', label: 'In-situ temperature (ITS-90)', unit: '°C' },
  { name: 'pt0', label: 'Potential temperature θ', unit: '°C' },
  { name: 'sigma0', label: 'σ0 potential density anomaly', unit: 'kg/m³' },
  { name: 'sigma1', label: 'σ1 potential density anomaly', unit: 'kg/m³' },
  { name: 'sigma2', label: 'σ2 potential density anomaly', unit: 'kg/m³' },
  { name: 'sigma3', label: 'σ3 potential density anomaly', unit: 'kg/m³' },
  { name: 'sigma4', label: 'σ4 potential density anomaly', unit: 'kg/m³' },
  { name: 'spiciness0', label: 'Spiciness (0 dbar)', unit: 'kg/m³' },
  { name: 'oxygen', label: 'Dissolved oxygen', unit: 'µmol/kg' },
];

export function propertyLabel(
  name: string,
  derived: readonly { name: string; unit: string | null }[] = [],
): { label: string; unit: string } {
  const known = SECTION_PROPERTIES.find((p) => p.name === name);
  if (known) return { label: known.label, unit: known.unit };
  const d = derived.find((v) => v.name === name);
  return { label: d ? `${d.name} (derived)` : name, unit: d?.unit ?? '' };
}
