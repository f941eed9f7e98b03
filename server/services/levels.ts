// The levels a request uses: the asked-for specification, validated, or the one default policy of
// shared/api/levels.ts over the cruise's σ range. The section, the exports, geostrophy and the
// deliveries all come through here, so the same choices give the same levels everywhere.
import { defaultLayerBoundaries, defaultLevels, safeParseLevels } from '../../shared/api/levels';
import { sigma_batch } from '../../shared/seawater/index';
import { badRequest } from '../lib/errors';
import { applyFlags, type CruiseCast } from './cruiseData';

/** Flags whose values set the default range (the acceptance default of every view). */
const RANGE_FLAGS = [1, 2];

/** [min, max] σ at `ref` (kg/m³) over the casts' levels flagged 1 or 2; null when there are none. */
export function sigmaRange(casts: readonly CruiseCast[], ref: number): [number, number] | null {
  let min = Infinity;
  let max = -Infinity;
  for (const c of casts) {
    const cols = applyFlags(c, RANGE_FLAGS);
    if (!cols.SA || !cols.CT) continue;
    const s = sigma_batch(cols.SA, cols.CT, ref);
    for (let i = 0; i < s.length; i++) {
      const v = s[i];
      if (v < min) min = v;
      if (v > max) max = v;
    }
  }
  return Number.isFinite(min) && Number.isFinite(max) ? [min, max] : null;
}

/** The levels of a specification, or a 400 naming what is wrong. */
export function levelsOrError(spec: string): Float64Array {
  const r = safeParseLevels(spec);
  if (!r.ok) {
    throw badRequest(
      `The levels "${spec.slice(0, 80)}" are not valid: ${r.errors.join('; ')}`,
      r.errors.map((m) => ({ field: 'levels', message: m })),
    );
  }
  return r.levels;
}

export type ResolvedLevels = { text: string; levels: Float64Array; isDefault: boolean };

/** The asked-for levels, or the default levels of `ref` over these casts. */
export function resolveLevels(casts: readonly CruiseCast[], ref: number, asked?: string | null): ResolvedLevels {
  const text = asked ?? defaultLevels(ref, sigmaRange(casts, ref));
  return { text, levels: levelsOrError(text), isDefault: asked == null };
}

/** Geostrophy's layer boundaries: asked for, or the thinned default levels. */
export function resolveLayerBoundaries(
  casts: readonly CruiseCast[],
  ref: number,
  asked?: string | null,
): ResolvedLevels {
  const text = asked ?? defaultLayerBoundaries(ref, sigmaRange(casts, ref));
  return { text, levels: levelsOrError(text), isDefault: asked == null };
}
