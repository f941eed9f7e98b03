/**
 * Layer sets: the target isopycnal levels of a remap. The rules (parsing, validation, defaults)
 * live in one module, shared/api/levels.ts; the remap engine re-exports what it reads.
 */
export {
  REFERENCE_PRESSURES,
  MAX_LEVELS,
  levelSpecSchema,
  referencePressureSchema,
  layerSetSchema,
  parseLevels,
  safeParseLevels,
  type ReferencePressure,
  type LayerSet,
} from '../api/levels';
