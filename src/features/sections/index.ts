export { sectionKeys } from './keys';
export {
  sectionQuery,
  fileVariablesQuery,
  useSection,
  useTsPoints,
  useGeostrophy,
  useSavedViews,
  useSaveView,
  useDeleteView,
  useEditView,
} from './api';
export { useSectionView } from './useSectionView';
export {
  DEFAULT_VIEW,
  PARAM,
  parseViewState,
  serialiseViewState,
  sectionQueryString,
  geostrophyQueryString,
  sigmaName,
  INVERSION_HANDLING_TEXT,
  INTERPOLATION_TEXT,
} from './viewState';
export type { SectionViewState } from './viewState';
export { SECTION_PROPERTIES, propertyLabel } from './properties';
export { sigmaGrid, tsExtent, contourStep } from './tsGrid';
export type { SigmaGrid, TsExtent } from './tsGrid';
export { nearestIndex, sampleGrid, nearestStation, stepStation, gridRange, digitsFor, formatValue } from './frame';
export { SectionControls } from './components/SectionControls';
export { SectionFrame } from './components/SectionFrame';
export type { FrameHover } from './components/SectionFrame';
export { Readout } from './components/Readout';
export type { ReadoutValue } from './components/Readout';
export { InversionList } from './components/InversionList';
export { SavedViews } from './components/SavedViews';
export { TsPanel } from './components/TsPanel';
export { GeostrophyPanel } from './components/GeostrophyPanel';
export * from './types';
export { createHoverStore, useHover } from './hoverStore';
export type { HoverStore } from './hoverStore';
export { useFramesLook, autoPalette, sentence } from './look';
export type { FramesLook } from './look';
export {
  SectionFigureBar,
  FrameExportMenu,
  provenanceLine,
  figureFileName,
  compositeWords,
} from './components/SectionFigureBar';
export type { FrameExport } from './components/SectionFigureBar';
export { ExportMenu } from './components/ExportMenu';
export { composeSvg, fileNameFor, wrap } from './export/compose';
export { writePdf, toWinAnsi } from './export/pdf';
export { X_AXES, Y_AXES, yScale, xScale, stretchMap, niceStep } from './axes';
export { rangeExtensions, placeLineLabels } from './frame';
export { PALETTE_CHOICES, FRAME_CHOICES } from './viewState';
export type { PaletteChoice, FrameChoice } from './viewState';
export { prefetchSection } from './prefetch';
