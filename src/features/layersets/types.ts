import { REFERENCE_PRESSURES, safeParseLevels } from '../../../shared/api/levels';

export { REFERENCE_PRESSURES };

export {
  layerSetResponseSchema as layerSetSchema,
  layerSetListResponseSchema as layerSetListSchema,
  type LayerSetResponse as LayerSet,
} from '../../../shared/api/resources';

export interface LayerSetInput {
  name: string;
  referencePressure: number;
  levels: string;
}

export type LevelsFeedback =
  | { state: 'empty' }
  | { state: 'ok'; count: number; first: number; last: number; step: number | null }
  | { state: 'error'; messages: string[] };

/**
 * What the levels field says as it is typed, from the same parser the server uses
 * (shared/api/levels.ts): how many levels, the first and the last, or what is wrong.
 */
export function levelsFeedback(spec: string): LevelsFeedback {
  if (spec.trim() === '') return { state: 'empty' };
  const r = safeParseLevels(spec);
  if (!r.ok) return { state: 'error', messages: [...new Set(r.errors)] };
  const lv = r.levels;
  const steps = new Set<string>();
  for (let i = 1; i < lv.length; i++) steps.add((lv[i] - lv[i - 1]).toFixed(6));
  const step = steps.size === 1 ? Number([...steps][0]) : null;
  return { state: 'ok', count: lv.length, first: lv[0], last: lv[lv.length - 1], step };
}

/** Decimals to show for a level: as many as the spec was written with, at least two. */
export function levelDigits(spec: string): number {
  let most = 2;
  for (const m of spec.matchAll(/\.(\d+)/g)) most = Math.max(most, m[1].length);
  return Math.min(most, 4);
}

export function validateLayerSet(input: LayerSetInput): Partial<Record<keyof LayerSetInput, string>> {
  const errors: Partial<Record<keyof LayerSetInput, string>> = {};
  const name = input.name.trim();
  if (!name) errors.name = 'Name the layer set.';
  else if (name.length > 100) errors.name = 'At most 100 characters.';
  if (!(REFERENCE_PRESSURES as readonly number[]).includes(input.referencePressure))
    errors.referencePressure = 'Choose a reference pressure.';
  const fb = levelsFeedback(input.levels);
  if (fb.state === 'empty') errors.levels = 'Enter the levels, as start:step:end or a comma list.';
  else if (fb.state === 'error') errors.levels = fb.messages.join('; ');
  return errors;
}
