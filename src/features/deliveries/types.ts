import { z } from 'zod';

const id = z.union([z.string(), z.number()]).transform(String);

export const DELIVERY_KINDS = ['isopycnal', 'pressure', 'package'] as const;
export type DeliveryKind = (typeof DELIVERY_KINDS)[number];
export const DELIVERY_FORMATS = ['csv', 'xlsx', 'nc', 'exchange'] as const;
export type DeliveryFormat = (typeof DELIVERY_FORMATS)[number];

export const KIND_TEXT: Record<DeliveryKind, { label: string; explain: string }> = {
  isopycnal: { label: 'Isopycnal table', explain: 'Every cast remapped to the target σ levels of a layer set.' },
  pressure: {
    label: 'Pressure-binned table',
    explain: 'Every cast averaged in pressure bins of a chosen size, with the count per bin.',
  },
  package: {
    label: 'Full data package',
    explain: 'A zip of the raw files, both tables, a provenance README and a checksum manifest.',
  },
};

export const FORMAT_TEXT: Record<DeliveryFormat, string> = {
  csv: 'CSV',
  xlsx: 'Spreadsheet (.xlsx)',
  nc: 'NetCDF (CF-1.10)',
  exchange: 'CTD exchange files (zip, one per cast)',
};

/** The community 1–9 quality-flag scale for water-column data, in our words (shared/api/flags.ts). */
export { FLAG_MEANINGS } from '../../../shared/api/flags';

export const deliveryFileSchema = z.object({
  format: z.string(),
  filename: z.string(),
  size: z.number().nonnegative(),
  sha256: z.string(),
});
export type DeliveryFile = z.infer<typeof deliveryFileSchema>;

export const deliverySchema = z.object({
  id,
  kind: z.enum(DELIVERY_KINDS),
  params: z.record(z.string(), z.unknown()).nullable().optional().default({}),
  formats: z.array(z.string()),
  status: z.enum(['queued', 'building', 'ready', 'failed']),
  progress: z.number().min(0).max(1).nullable().optional().default(null),
  files: z.array(deliveryFileSchema).optional().default([]),
  released: z.boolean(),
  releasedAt: z.string().nullable().optional().default(null),
  releasedBy: z.string().nullable().optional().default(null),
  createdBy: z.string().nullable().optional().default(null),
  createdAt: z.string(),
  error: z.string().nullable().optional().default(null),
  /** The server's one download rule for the signed-in member (released: every role; before: builders). */
  canDownload: z.boolean().optional().default(false),
});
export type Delivery = z.infer<typeof deliverySchema>;
export const deliveryListSchema = z.array(deliverySchema);

/** What the build form holds (strings and arrays, as the inputs give them). */
export interface DeliveryFormValues {
  kind: DeliveryKind;
  layerSetId: string;
  ref: string;
  inversions: 'sort' | 'drop' | 'raw';
  interpolation: 'linear' | 'pchip';
  bin: string;
  flags: number[];
  formats: DeliveryFormat[];
}

export interface NewDelivery {
  kind: DeliveryKind;
  ref?: number;
  levels?: string;
  inversions?: 'sort' | 'drop' | 'raw';
  interpolation?: 'linear' | 'pchip';
  bin?: number;
  flags: number[];
  formats: DeliveryFormat[];
  /** The line to draw from (docs/lines.md); absent: the default line. */
  line?: string;
}
