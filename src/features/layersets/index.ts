export { layerSetKeys } from './keys';
export { layerSetsQuery, useLayerSets, useCreateLayerSet, useUpdateLayerSet } from './api';
export { LevelsField } from './components/LevelsField';
export { LayerSetForm } from './components/LayerSetForm';
export { LayerSetList } from './components/LayerSetList';
export {
  layerSetSchema,
  layerSetListSchema,
  levelsFeedback,
  levelDigits,
  validateLayerSet,
  REFERENCE_PRESSURES,
} from './types';
export type { LayerSet, LayerSetInput, LevelsFeedback } from './types';
