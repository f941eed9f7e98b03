export { castKeys } from './keys';
export {
  castQuery,
  useCast,
  useSetFlag,
  useCastQc,
  useFlagLog,
  useNeighbours,
  usePendingProposals,
  useDecideProposals,
  useUndoFlagChange,
  useReopenProposals,
  useCastHistory,
} from './api';
export { CastHistoryPanel } from './components/CastHistoryPanel';
export type { Decision } from './api';
export {
  REFERENCE_PRESSURES,
  INVERSION_THRESHOLD,
  sigmaProfile,
  inversionsAt,
  flaggedLevels,
  FLAG_CHOICES,
  FLAG_VARIABLE_LABELS,
  levelsInRange,
  validateFlagForm,
  inversionHandling,
} from './profiles';
export type { FlagFormValues, FlagFormResult, InversionSet, InversionHandling } from './profiles';
export { rangeOfSelection, snapToLevels, spanOfSelection, flaggedRuns } from './picking';
export type { Pick } from './picking';
export { measuredPanels, derivedPanels, overlayCasts, earlierDate } from './panels';
export { ProfileFigure, NEIGHBOUR_STYLE, PROPOSAL_COLOR } from './components/ProfileFigure';
export type { PanelSpec, OverlaySeries } from './components/ProfileFigure';
export { TsPanel } from './components/TsPanel';
export { InversionTable } from './components/InversionTable';
export { FitnessTable } from './components/FitnessTable';
export { CastMeta } from './components/CastMeta';
export { FlagForm } from './components/FlagForm';
export { CastStepper } from './components/CastStepper';
export { ProposalList } from './components/ProposalList';
export { FlagLog } from './components/FlagLog';
export { useQcKeys, typingInField } from './keyboard';
export { castDetailSchema, inversionSchema, FLAG_VARIABLES } from './types';
export type {
  CastDetail,
  CastInversion,
  FitnessEntry,
  FlagEdit,
  FlagVariable,
  Proposal,
  CastQc,
  FlagLogEntry,
  Neighbour,
  QcTestId,
  EarlierOccupation,
  OverlayCast,
} from './types';
