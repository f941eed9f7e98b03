import type { DeliveryFormValues, NewDelivery } from './types';

export interface LayerSetChoice {
  id: string;
  name: string;
  referencePressure: number;
  levels: string;
}

export const DEFAULT_FORM: DeliveryFormValues = {
  kind: 'isopycnal',
  layerSetId: '',
  ref: '0',
  inversions: 'sort',
  interpolation: 'linear',
  bin: '2',
  // "Good" only, unless the PI asks for more.
  flags: [2],
  formats: ['csv'],
};

export type DeliveryFormErrors = Partial<Record<'bin' | 'flags' | 'formats' | 'ref', string>>;

/**
 * Check the build form and turn it into the request body. Only what the kind uses is sent: an
 * isopycnal table takes the layer set's levels and its reference pressure (or the default levels of
 * the chosen one), a pressure table its bin size, a package both tables' defaults.
 */
export function validateDeliveryForm(
  values: DeliveryFormValues,
  layerSets: readonly LayerSetChoice[],
): { ok: true; body: NewDelivery } | { ok: false; errors: DeliveryFormErrors } {
  const errors: DeliveryFormErrors = {};
  const flags = [...new Set(values.flags)].filter((f) => Number.isInteger(f) && f >= 1 && f <= 9).sort((a, b) => a - b);
  if (flags.length === 0) errors.flags = 'Include at least one quality flag.';
  if (values.formats.length === 0) errors.formats = 'Choose at least one format.';
  const body: NewDelivery = { kind: values.kind, flags, formats: [...values.formats] };

  if (values.kind === 'isopycnal' || values.kind === 'package') {
    const set = layerSets.find((s) => s.id === values.layerSetId);
    const ref = set ? set.referencePressure : Number(values.ref);
    if (![0, 1000, 2000, 3000, 4000].includes(ref))
      errors.ref = 'The reference pressure is one of 0, 1000, 2000, 3000, 4000 dbar.';
    body.ref = ref;
    if (set) body.levels = set.levels;
    body.inversions = values.inversions;
    body.interpolation = values.interpolation;
  }
  if (values.kind === 'pressure' || values.kind === 'package') {
    const bin = Number(values.bin);
    if (values.bin.trim() === '' || !Number.isFinite(bin)) errors.bin = 'Give the bin size in dbar.';
    else if (bin <= 0 || bin > 500) errors.bin = 'Bins are more than 0 and at most 500 dbar.';
    else body.bin = bin;
  }
  return Object.keys(errors).length ? { ok: false, errors } : { ok: true, body };
}

/** Who may do what with deliveries (the server enforces the same). */
export const canDeliver = {
  build: (role: string | null | undefined) => role === 'pi' || role === 'chief_scientist' || role === 'analyst',
  release: (role: string | null | undefined) => role === 'pi',
  remove: (role: string | null | undefined) => role === 'pi' || role === 'chief_scientist' || role === 'analyst',
};
