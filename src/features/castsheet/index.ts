export { castKeys } from './keys';
export { castQuery, useCast, useSetFlag } from './api';
export {
  REFERENCE_PRESSURES, INVERSION_THRESHOLD, sigmaProfile, inversionsAt, flaggedLevels, FLAG_CHOICES, FLAG_VARIABLE_LABELS,
  levelsInRange, validateFlagForm,
} from './profiles';
export type { FlagFormValues, FlagFormResult, InversionSet } from './profiles';
export { ProfilePanels, rangeOfSelection } from './components/ProfilePanels';
export { InversionTable } from './components/InversionTable';
export { FitnessTable } from './components/FitnessTable';
export { CastMeta } from './components/CastMeta';
export { FlagForm } from './components/FlagForm';
export { CastStepper } from './components/CastStepper';
export { castDetailSchema, inversionSchema, FLAG_VARIABLES } from './types';
export type { CastDetail, CastInversion, FitnessEntry, FlagEdit, FlagVariable } from './types';
