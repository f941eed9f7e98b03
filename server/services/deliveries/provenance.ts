// Provenance of a delivery: the method behind every number, carried into every file we write
// (CSV comment lines, the spreadsheet's Provenance sheet, NetCDF global attributes, the package README).
import { z } from 'zod';

export const ProvenanceSchema = z.object({
  software: z.string().min(1),
  version: z.string().min(1),
  equationOfState: z.string().min(1),
  functions: z.array(z.string()),
  saarSource: z.string(),
  referencePressure: z.number().finite().nullable(),
  layerSet: z.string().nullable(),
  inversionHandling: z.string().nullable(),
  interpolation: z.string().nullable(),
  flagsIncluded: z.array(z.number().int()),
  exportedBy: z.string(),
  exportedAt: z.string(),
  cruise: z.object({ id: z.string(), name: z.string(), ship: z.string() }),
  notes: z.array(z.string()).optional(),
  /** The line the table covers and the cruise's expocode where the files carry one. */
  line: z.string().nullable().optional(),
  expocode: z.string().nullable().optional(),
  /** How values are rounded, and how flags per value are made (stated in every file). */
  precision: z.string().optional(),
  flagRule: z.string().optional(),
  /** The technicians' flag edits, summarised (who set which flag on how many levels). */
  flagHistory: z.array(z.string()).optional(),
});

export type Provenance = z.infer<typeof ProvenanceSchema>;

/** The caution that goes with every delivery (README, CSV comments, spreadsheet, NetCDF). */
export const DATA_CAUTION =
  "Provisional research data; not for navigation or safety-of-life use; follow the ship's and institution's operating rules.";

/** One labelled provenance item: `key` is machine-friendly (snake_case), `label` is for people. */
export interface ProvenanceEntry {
  key: string;
  label: string;
  value: string;
}

function orNone(v: string | null | undefined): string {
  return v === null || v === undefined || v === '' ? 'none' : v;
}

/** Provenance as an ordered list of entries; the same order in every format. */
export function provenanceEntries(p: Provenance): ProvenanceEntry[] {
  const entries: ProvenanceEntry[] = [
    { key: 'software', label: 'Software', value: `${p.software} ${p.version}` },
    { key: 'equation_of_state', label: 'Equation of state', value: p.equationOfState },
    { key: 'functions', label: 'Functions used', value: p.functions.length ? p.functions.join(', ') : 'none' },
    { key: 'saar_source', label: 'SAAR source', value: orNone(p.saarSource) },
    {
      key: 'reference_pressure',
      label: 'Reference pressure',
      value: p.referencePressure === null ? 'none' : `${p.referencePressure} dbar`,
    },
    { key: 'layer_set', label: 'Layer set', value: orNone(p.layerSet) },
    { key: 'inversion_handling', label: 'Inversion handling', value: orNone(p.inversionHandling) },
    { key: 'interpolation', label: 'Interpolation', value: orNone(p.interpolation) },
    {
      key: 'flags_included',
      label: 'Quality flags included',
      value: p.flagsIncluded.length ? p.flagsIncluded.join(', ') : 'none',
    },
    { key: 'cruise', label: 'Cruise', value: `${p.cruise.name} (ship ${p.cruise.ship}; id ${p.cruise.id})` },
    ...(p.expocode ? [{ key: 'expocode', label: 'Expocode', value: p.expocode }] : []),
    ...(p.line ? [{ key: 'line', label: 'Line', value: p.line }] : []),
    ...(p.precision ? [{ key: 'precision', label: 'Precision', value: p.precision }] : []),
    ...(p.flagRule ? [{ key: 'flag_rule', label: 'Flags per value', value: p.flagRule }] : []),
    ...(p.flagHistory ?? []).map((h) => ({ key: 'flag_history', label: 'Flag history', value: h })),
    { key: 'exported_by', label: 'Exported by', value: orNone(p.exportedBy) },
    { key: 'exported_at', label: 'Exported at', value: orNone(p.exportedAt) },
  ];
  for (const note of p.notes ?? []) entries.push({ key: 'note', label: 'Note', value: note });
  return entries;
}

/** Collapse line breaks and control characters so a value fits on one line. */
export function oneLine(s: string): string {
  // eslint-disable-next-line no-control-regex
  return s.replace(/[\r\n\u0000-\u0008\u000b\u000c\u000e-\u001f\u007f\u2028\u2029]+/g, ' ').trim();
}

/** Plain-text provenance block for README files. */
export function formatProvenanceText(p: Provenance): string {
  const entries = provenanceEntries(p);
  const width = Math.max(...entries.map((e) => e.label.length));
  return entries.map((e) => `${(e.label + ':').padEnd(width + 2)}${oneLine(e.value)}`).join('\n');
}

/**
 * Provenance as NetCDF global attributes: one descriptive snake_case name per field; text except
 * the reference pressure (a number, in dbar).
 */
export function provenanceAttributes(p: Provenance): Record<string, string | number | number[]> {
  const attrs: Record<string, string | number | number[]> = {
    software: p.software,
    software_version: p.version,
    equation_of_state: p.equationOfState,
    functions_used: p.functions.join(', '),
    saar_source: p.saarSource,
    layer_set: orNone(p.layerSet),
    inversion_handling: orNone(p.inversionHandling),
    interpolation: orNone(p.interpolation),
    cruise_id: p.cruise.id,
    cruise_name: p.cruise.name,
    ship: p.cruise.ship,
    exported_by: p.exportedBy,
    exported_at: p.exportedAt,
  };
  if (p.expocode) attrs.expocode = p.expocode;
  if (p.line) attrs.line = p.line;
  if (p.precision) attrs.precision = p.precision;
  if (p.flagRule) attrs.flag_rule = p.flagRule;
  if (p.flagHistory?.length) attrs.flag_history = p.flagHistory.join('\n');
  attrs.processing_choices = [
    p.referencePressure === null ? null : `reference pressure ${p.referencePressure} dbar`,
    p.layerSet ? `levels ${p.layerSet}` : null,
    p.inversionHandling ? `inversions ${p.inversionHandling}` : null,
    p.interpolation ? `interpolation ${p.interpolation}` : null,
    `flags included ${p.flagsIncluded.join(' ') || 'none'}`,
  ]
    .filter(Boolean)
    .join('; ');
  attrs.quality_flags_included = p.flagsIncluded.length ? p.flagsIncluded.join(' ') : 'none';
  if (p.notes && p.notes.length) attrs.processing_notes = p.notes.join('\n');
  return attrs;
}
