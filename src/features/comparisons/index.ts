export { useComparison, useLines, useMyCruises, useOccupations, useLinkLine, comparisonKeys } from './api';
export { GridFrame, MeanProfiles, TsBoth, scaled, magnitudeQuantile, valueRange } from './frames';
export {
  parseView,
  serialiseView,
  comparisonBody,
  exportHref,
  lineText,
  parseLineText,
  DEFAULT_VIEW,
  type ComparisonView,
} from './view';
export type { Comparison, OccupationOffer } from './types';
