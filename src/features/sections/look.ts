import { useMemo } from 'react';
import { PALETTES, type ColorScale, type PaletteName } from '../../components/plot';
import { meanLatitude, niceStep, xScale, yScale } from './axes';
import { gridRange, rangeExtensions } from './frame';
import type { FrameLook } from './components/SectionFrame';
import type { Section } from './types';
import type { SectionViewState } from './viewState';

/** The palette a property gets when the view leaves it automatic. */
export function autoPalette(property: string): PaletteName {
  if (/^(CT|temperature|pt0|theta)$/i.test(property) || /temp/i.test(property)) return 'hearth';
  if (/anom|vel|diff|delta|change|^d[A-Z]/i.test(property)) return 'cleft';
  return 'brine';
}

export interface FramesLook {
  pressure: FrameLook;
  density: FrameLook;
  /** The colour range each frame uses (fixed, or its own automatic one). */
  pressureRange: { min: number; max: number } | null;
  densityRange: { min: number; max: number } | null;
  autoPressure: { min: number; max: number } | null;
  autoDensity: { min: number; max: number } | null;
  paletteName: PaletteName;
  /** The automatic palette's name for the property, for the palette control. */
  autoPaletteLabel: string;
  /** The horizontal axis in words (the density frame has no vertical choice). */
  xAxisWords: string;
  /** The choices in words, for the captions (each ends without a full stop). */
  words: {
    palette: string;
    contours: (frame: 'pressure' | 'density') => string;
    axes: string;
    range: (frame: 'pressure' | 'density') => string;
  };
}

/**
 * Everything about how the two frames are drawn that follows from the view and the data: the
 * palette, each frame's own colour range (a fixed range where the view has one), the contour
 * interval, the axes, and the colour-range extensions.
 */
export function useFramesLook(
  view: SectionViewState,
  pressure: Section | undefined,
  density: Section | undefined,
): FramesLook {
  const densityShowsDepth = view.densityShows === 'depth';
  const autoPressure = useMemo(() => gridRange(pressure?.grid), [pressure?.grid]);
  const autoDensity = useMemo(() => gridRange(density?.grid), [density?.grid]);
  const { range: fixedP, densityRange: fixedD } = view;
  const paletteName: PaletteName = view.palette === 'auto' ? autoPalette(view.property) : view.palette;
  // A diverging palette is centred on zero: its automatic range is symmetric about 0.
  const diverging = PALETTES[paletteName].kind === 'diverging';
  const centred = (r: { min: number; max: number } | null) => {
    if (!r || !diverging) return r;
    const m = Math.max(Math.abs(r.min), Math.abs(r.max)) || 1;
    return { min: -m, max: m };
  };
  const pressureRange = useMemo(
    () => fixedP ?? centred(autoPressure),
    // eslint-disable-next-line react-hooks/exhaustive-deps
    [fixedP?.min, fixedP?.max, autoPressure, diverging],
  );
  const densityRange = useMemo(
    () => fixedD ?? (view.densityShows === 'depth' ? autoDensity : centred(autoDensity)),
    // eslint-disable-next-line react-hooks/exhaustive-deps
    [fixedD?.min, fixedD?.max, autoDensity, diverging, view.densityShows],
  );
  const stations = pressure?.stations ?? density?.stations;

  return useMemo(() => {
    const palette: ColorScale = PALETTES[paletteName].scale;
    const depthPalette: ColorScale = view.palette === 'auto' ? PALETTES.brine.scale : palette;
    const step = (r: { min: number; max: number } | null) =>
      view.contours === 'off'
        ? null
        : view.contours === 'auto'
          ? r
            ? niceStep(r.max - r.min, 10)
            : null
          : view.contours;
    let pMax = pressure?.grid.y[pressure.grid.y.length - 1] ?? 0;
    for (const b of pressure?.bottom ?? []) if (b.p > pMax) pMax = b.p;
    const ys = pressure ? yScale(view.yAxis, view.stretch, pMax * 1.02, meanLatitude(pressure.stations)) : null;
    const xs = stations ? xScale(view.xAxis, stations) : null;
    const pStep = step(pressureRange);
    // The density frame showing the pressure of the isopycnals gets pressure contours too.
    const dStep = densityShowsDepth
      ? view.contours === 'off'
        ? null
        : niceStep((densityRange?.max ?? 1) - (densityRange?.min ?? 0), 10)
      : step(densityRange);
    const pLook: FrameLook = {
      palette,
      contourStep: pStep,
      yScale: ys,
      xScale: xs,
      extensions: view.range ? rangeExtensions(pressure?.grid, view.range) : { below: 0, above: 0 },
    };
    const dLook: FrameLook = {
      palette: densityShowsDepth ? depthPalette : palette,
      contourStep: dStep,
      yScale: null,
      xScale: xs,
      extensions: view.densityRange ? rangeExtensions(density?.grid, view.densityRange) : { below: 0, above: 0 },
    };
    const fmt = (v: number) => String(Number(v.toPrecision(4)));
    const ext = (l: FrameLook) =>
      l.extensions.above || l.extensions.below
        ? `, values beyond it drawn in the end colours (${[l.extensions.below ? `${l.extensions.below} cells below` : '', l.extensions.above ? `${l.extensions.above} above` : ''].filter(Boolean).join(', ')}; triangles on the bar)`
        : '';
    return {
      pressure: pLook,
      density: dLook,
      pressureRange,
      densityRange,
      autoPressure,
      autoDensity,
      paletteName,
      autoPaletteLabel: PALETTES[autoPalette(view.property)].label.split(' —')[0],
      xAxisWords: xs?.caption ?? '',
      words: {
        palette: `palette ${PALETTES[paletteName].label.split(' —')[0]}${view.palette === 'auto' ? ' (automatic for the property)' : ''}`,
        contours: (frame) => {
          const s = frame === 'pressure' ? pStep : dStep;
          return s ? `contours every ${fmt(s)}${view.contours === 'auto' ? ' (automatic)' : ''}` : 'no contours';
        },
        axes: [ys?.caption, xs?.caption].filter(Boolean).join('; '),
        range: (frame) => {
          const fixed = frame === 'pressure' ? view.range : view.densityRange;
          const r = frame === 'pressure' ? pressureRange : densityRange;
          if (!r) return 'colour range automatic';
          return fixed
            ? `colour range fixed at ${fmt(r.min)} to ${fmt(r.max)}${ext(frame === 'pressure' ? pLook : dLook)}`
            : `colour range ${fmt(r.min)} to ${fmt(r.max)} (this frame's own${diverging ? ', centred on 0' : ''})`;
        },
      },
    };
  }, [
    diverging,
    paletteName,
    view.property,
    view.palette,
    view.contours,
    view.yAxis,
    view.stretch,
    view.xAxis,
    view.range,
    view.densityRange,
    pressure,
    density,
    stations,
    pressureRange,
    densityRange,
    autoPressure,
    autoDensity,
    densityShowsDepth,
  ]);
}

/** Caption text: the parts joined, ending with exactly one full stop. */
export function sentence(...parts: (string | null | undefined | false)[]): string {
  const text = parts
    .filter(Boolean)
    .join('; ')
    .replace(/\s+/g, ' ')
    .trim()
    .replace(/[.;,\s]+$/, '');
  return text ? `${text.charAt(0).toUpperCase()}${text.slice(1)}.` : '';
}
