export { LazyPlot, PlotLoading, preloadPlotly } from './LazyPlot';
export type { LazyPlotProps, PlotProps } from './LazyPlot';
export { DEPTHS, BALANCE, COLOR_SCALES, reversed, toPlotly, colorAt } from './colormaps';
export type { ColorScale, ColorScaleName } from './colormaps';
export {
  PLOT_COLORS, SERIES, PLOT_FONT, MONO_FONT, valueAxis, pressureAxis, densityAxis, sigmaLabel, baseLayout, plotConfig, colorBar,
} from './theme';
