export { LazyPlot, PlotLoading, preloadPlotly, plotlyLibrary } from './LazyPlot';
export type { LazyPlotProps, PlotProps, PlotlyLibrary } from './LazyPlot';
export {
  DEPTHS,
  HEARTH,
  BRINE,
  CLEFT,
  GRAPHITE,
  PALETTES,
  PALETTE_NAMES,
  COLOR_SCALES,
  reversed,
  toPlotly,
  colorAt,
} from './colormaps';
export type { PaletteName } from './colormaps';
export type { ColorScale, ColorScaleName } from './colormaps';
export {
  PLOT_COLORS,
  SERIES,
  PLOT_FONT,
  MONO_FONT,
  NO_CLOUD,
  withoutCloud,
  valueAxis,
  pressureAxis,
  densityAxis,
  sigmaLabel,
  baseLayout,
  plotConfig,
  colorBar,
} from './theme';
