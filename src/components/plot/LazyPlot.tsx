import {
  Component,
  lazy,
  Suspense,
  useCallback,
  useMemo,
  useRef,
  type ComponentType,
  type CSSProperties,
  type ErrorInfo,
  type ReactNode,
} from 'react';
import type { Config, Data, Layout, PlotMouseEvent, PlotRelayoutEvent, PlotSelectionEvent } from 'plotly.js';
import { Progress } from '../Notice';
import { withoutCloud } from './theme';

/**
 * Plotly, loaded on first use. `react-plotly.js/factory` bound to `plotly.js-dist-min` (the design
 * card's bundle) is a dynamic import, so Vite puts Plotly in its own chunk that only screens with a
 * plot download; the first screen stays light. While it loads, the plot's box keeps its size and
 * shows progress; if the chunk cannot be fetched the box says so.
 *
 * Every figure goes through this wrapper, and the wrapper lays the options that keep a figure on the
 * ship over whatever config a caller passes (see `withoutCloud` in theme.ts): no logo, no link or
 * button that would send a figure or its data to the library maker's cloud service.
 */

export interface PlotProps {
  data: Data[];
  layout?: Partial<Layout>;
  config?: Partial<Config>;
  /** Bump to force a redraw when data arrays are mutated in place (prefer new arrays). */
  revision?: number;
  style?: CSSProperties;
  className?: string;
  useResizeHandler?: boolean;
  onSelected?: (event: PlotSelectionEvent) => void;
  onDeselect?: () => void;
  onClick?: (event: PlotMouseEvent) => void;
  onHover?: (event: PlotMouseEvent) => void;
  onRelayout?: (event: PlotRelayoutEvent) => void;
  onInitialized?: (figure: unknown, graphDiv: HTMLElement) => void;
  onAfterPlot?: () => void;
}

let loading: Promise<{ default: ComponentType<PlotProps> }> | null = null;
let library: PlotlyLibrary | null = null;

/** The parts of the plotting library's API our exports use. */
export interface PlotlyLibrary {
  toImage(
    gd: HTMLElement,
    options: { format: 'svg' | 'png'; width: number; height: number; scale?: number },
  ): Promise<string>;
}

/** The plotting library itself (loading it if need be), for exports. */
export async function plotlyLibrary(): Promise<PlotlyLibrary> {
  await preloadPlotly();
  if (!library) throw new Error('The plotting library did not load.');
  return library;
}

/** Start fetching Plotly (e.g. on hover of a link to a plotting screen); safe to call repeatedly. */
export function preloadPlotly(): Promise<{ default: ComponentType<PlotProps> }> {
  if (!loading) {
    loading = Promise.all([import('react-plotly.js/factory'), import('plotly.js-dist-min')]).then(
      ([factory, plotly]) => {
        const createPlotlyComponent = (factory as { default: (p: object) => ComponentType<unknown> }).default;
        const Plotly = (plotly as { default?: object }).default ?? plotly;
        library = Plotly as unknown as PlotlyLibrary;
        performance.mark?.('plotly loaded');
        return { default: createPlotlyComponent(Plotly) as ComponentType<PlotProps> };
      },
    );
    // A failed fetch (offline, redeploy) must not stick: the next mount tries again.
    loading.catch(() => {
      loading = null;
    });
  }
  return loading;
}

const Plot = lazy(preloadPlotly);

export interface LazyPlotProps extends PlotProps {
  /** What the plot shows, for screen readers (the figure's accessible name). */
  label: string;
  /** Height of the plot box in px; the width follows the container. */
  height?: number;
  /** Text under the plot (the choice that made it, a legend in words). */
  caption?: ReactNode;
  /**
   * A quick picture drawn while the plotting library loads (e.g. the field on a canvas); it calls
   * `drawn` once it is on screen. Without it the box shows progress.
   */
  preview?: (drawn: () => void) => ReactNode;
  /** Extra attributes on the figure element (e.g. data for exports). */
  figureProps?: Record<string, string>;
}

/** A Plotly figure in a labelled box, loading Plotly on first use. */
export function LazyPlot({
  label,
  height = 360,
  caption,
  style,
  className = '',
  useResizeHandler = true,
  config,
  preview,
  figureProps,
  ...plot
}: LazyPlotProps) {
  const figure = useRef<HTMLElement>(null);
  // A new object only when the caller's config changes (react-plotly redraws on a new config).
  const safeConfig = useMemo(() => withoutCloud(config), [config]);
  const { onAfterPlot } = plot;
  // Markers for tests and the browser benchmark, each the page clock (ms since the navigation
  // started) when it first happened: `data-plot-drawn` the first picture of the figure (the quick
  // preview or the library's), `data-plot-interactive` the library's first draw.
  const mark = useCallback((name: string) => {
    if (figure.current && !figure.current.hasAttribute(name))
      figure.current.setAttribute(name, performance.now().toFixed(1));
  }, []);
  const previewDrawn = useCallback(() => {
    mark('data-plot-drawn');
    mark('data-preview-drawn');
    performance.mark?.(`preview drawn: ${label}`);
  }, [mark, label]);
  const afterPlot = useCallback(() => {
    mark('data-plot-drawn');
    mark('data-plot-interactive');
    performance.mark?.(`plot drawn: ${label}`);
    onAfterPlot?.();
  }, [onAfterPlot, label, mark]);
  return (
    <figure ref={figure} aria-label={label} className={`m-0 flex flex-col ${className}`} {...figureProps}>
      <div style={{ height }} className="relative w-full">
        <PlotErrorBoundary>
          <Suspense fallback={preview ? preview(previewDrawn) : <PlotLoading label={label} />}>
            <Plot
              {...plot}
              config={safeConfig}
              onAfterPlot={afterPlot}
              useResizeHandler={useResizeHandler}
              style={{ width: '100%', height: '100%', ...style }}
            />
          </Suspense>
        </PlotErrorBoundary>
      </div>
      {caption && <figcaption className="px-1 pt-1 text-xs text-ink-muted">{caption}</figcaption>}
    </figure>
  );
}

export function PlotLoading({ label }: { label: string }) {
  return (
    <div className="absolute inset-0 flex items-center justify-center border border-dashed border-paper-rule bg-paper-raised">
      <Progress label={`Loading the plotting library for “${label}”…`} />
    </div>
  );
}

class PlotErrorBoundary extends Component<{ children: ReactNode }, { error: Error | null }> {
  override state: { error: Error | null } = { error: null };

  static getDerivedStateFromError(error: Error) {
    return { error };
  }

  override componentDidCatch(error: Error, info: ErrorInfo) {
    console.error('plot failed', error, info.componentStack);
  }

  override render() {
    if (this.state.error) {
      return (
        <div
          role="alert"
          className="absolute inset-0 flex flex-col items-start justify-center gap-2 border border-warn/40 bg-warn-wash/40 px-4 text-sm"
        >
          <p className="font-semibold text-warn-strong">The plot could not be drawn.</p>
          <p className="text-ink-strong">{this.state.error.message}</p>
          <button type="button" className="text-ink underline" onClick={() => this.setState({ error: null })}>
            Try again
          </button>
        </div>
      );
    }
    return this.props.children;
  }
}
