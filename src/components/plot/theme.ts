import type { Config, Layout, LayoutAxis } from 'plotly.js';

/**
 * The look every Sigmaline plot shares: the paper and ink of tailwind.config.ts, the shipped fonts,
 * quiet grids, and the vertical axes of the trade — pressure and density increase downward.
 * Only types are imported from plotly.js here, so this module costs nothing before a plot loads.
 */

export const PLOT_COLORS = {
  paper: '#fcfaf5',
  plot: '#fcfaf5',
  ink: '#123f44',
  inkStrong: '#0b2e32',
  inkSoft: '#3f6468',
  inkMuted: '#6d8587',
  inkFaint: '#a9b8b6',
  grid: '#e6e1d4',
  rule: '#d9d2c2',
  /** The warning accent: inversions, bad levels. Nothing else may use it. */
  warn: '#c2461b',
  warnStrong: '#9c3510',
  warnWash: 'rgba(194, 70, 27, 0.16)',
  /** Questionable levels (flag 3): a muted amber that is not the warning accent. */
  questionable: '#8a6d1f',
} as const;

/** Series colours for lines drawn together (profiles of several casts, several properties). */
export const SERIES = ['#123f44', '#3f7f8c', '#7a5c99', '#5b7a2e', '#2f5d8a', '#8a6d1f'] as const;

export const PLOT_FONT = {
  family: '"Source Sans 3", system-ui, sans-serif',
  size: 12,
  color: PLOT_COLORS.inkSoft,
} as const;

export const MONO_FONT = '"JetBrains Mono", ui-monospace, monospace';

/** A value axis: ruled, monospaced tick labels, no zero line shouting. */
export function valueAxis(title: string, extra: Partial<LayoutAxis> = {}): Partial<LayoutAxis> {
  return {
    title: { text: title, font: { size: 12, color: PLOT_COLORS.inkSoft }, standoff: 6 },
    color: PLOT_COLORS.inkMuted,
    gridcolor: PLOT_COLORS.grid,
    linecolor: PLOT_COLORS.rule,
    showline: true,
    mirror: true,
    ticks: 'outside',
    ticklen: 3,
    tickcolor: PLOT_COLORS.rule,
    tickfont: { family: MONO_FONT, size: 10.5, color: PLOT_COLORS.inkSoft },
    zeroline: false,
    automargin: true,
    ...extra,
  };
}

/** A pressure axis (dbar), increasing downward. */
export function pressureAxis(extra: Partial<LayoutAxis> = {}): Partial<LayoutAxis> {
  return valueAxis('Pressure (dbar)', { autorange: 'reversed', ...extra });
}

/** A potential-density axis σ at a reference pressure, increasing downward. */
export function densityAxis(refDbar: number, extra: Partial<LayoutAxis> = {}): Partial<LayoutAxis> {
  return valueAxis(`${sigmaLabel(refDbar)} (kg/m³)`, { autorange: 'reversed', ...extra });
}

/** σ0 … σ4 for the reference pressures TEOS-10 names; σ at other pressures spelled out. */
export function sigmaLabel(refDbar: number): string {
  const named: Record<number, string> = { 0: 'σ₀', 1000: 'σ₁', 2000: 'σ₂', 3000: 'σ₃', 4000: 'σ₄' };
  return named[refDbar] ?? `σ(${refDbar} dbar)`;
}

/** The base layout; pass what differs. Axes passed in `extra` replace the defaults whole. */
export function baseLayout(extra: Partial<Layout> = {}): Partial<Layout> {
  return {
    paper_bgcolor: PLOT_COLORS.paper,
    plot_bgcolor: PLOT_COLORS.plot,
    font: PLOT_FONT,
    margin: { l: 56, r: 16, t: 28, b: 44 },
    showlegend: false,
    hovermode: 'closest',
    hoverlabel: {
      bgcolor: PLOT_COLORS.paper,
      bordercolor: PLOT_COLORS.ink,
      font: { family: MONO_FONT, size: 11, color: PLOT_COLORS.inkStrong },
    },
    dragmode: 'zoom',
    ...extra,
  };
}

/**
 * The options that keep a figure on the ship, laid over any config (callers cannot turn them back
 * on): no library logo linking to its maker, no "edit / send to the cloud" buttons, no on-graph
 * link, no data in a link, no server to send figures to, no map or formula resources fetched from
 * a content network. Nothing is exported except by our own export buttons and the modebar's
 * "save as image", which writes a file in the browser.
 */
export const NO_CLOUD = {
  displaylogo: false,
  showLink: false,
  sendData: false,
  linkText: '',
  showSendToCloud: false,
  showEditInChartStudio: false,
  plotlyServerURL: '',
  topojsonURL: '',
  mapboxAccessToken: '',
  typesetMath: false,
} as const satisfies Partial<Config> & Record<string, unknown>;

/** A config with NO_CLOUD laid over it. */
export function withoutCloud(config: Partial<Config> | undefined): Partial<Config> {
  return { ...(config ?? {}), ...(NO_CLOUD as Partial<Config>) };
}

/** The modebar Sigmaline keeps: zoom, pan, select, reset, save as image; no logo, no cloud. */
export function plotConfig(extra: Partial<Config> = {}): Partial<Config> {
  return withoutCloud({
    responsive: true,
    scrollZoom: false,
    modeBarButtonsToRemove: [
      'lasso2d',
      'autoScale2d',
      'toggleSpikelines',
      'hoverClosestCartesian',
      'hoverCompareCartesian',
    ],
    toImageButtonOptions: { format: 'png', scale: 2 },
    ...extra,
  });
}

/** A colour bar styled like the axes. */
export function colorBar(title: string): Record<string, unknown> {
  return {
    title: { text: title, side: 'right', font: { size: 11, color: PLOT_COLORS.inkSoft } },
    thickness: 12,
    outlinewidth: 0,
    tickfont: { family: MONO_FONT, size: 10, color: PLOT_COLORS.inkSoft },
    len: 0.9,
  };
}
