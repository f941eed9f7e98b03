import { useQuery } from '@tanstack/react-query';
import { useCallback, useEffect, useMemo, useState, type KeyboardEvent } from 'react';
import { useNavigate } from 'react-router-dom';
import { ErrorNotice, Progress } from '../components/Notice';
import { EmptyState, Panel } from '../components/Panel';
import { Spinner } from '../components/Button';
import { preloadPlotly } from '../components/plot';
import {
  GeostrophyPanel,
  InversionList,
  Readout,
  SavedViews,
  SectionControls,
  SectionFrame,
  TsPanel,
  createHoverStore,
  digitsFor,
  nearestStation,
  SectionFigureBar,
  sentence,
  useFramesLook,
  figureFileName,
  provenanceLine,
  compositeWords,
  propertyLabel,
  sampleGrid,
  sectionQueryString,
  serialiseViewState,
  sigmaName,
  stepStation,
  useSection,
  useSectionView,
  useHover,
  INTERPOLATION_TEXT,
  INVERSION_HANDLING_TEXT,
  type HoverStore,
  type ReadoutValue,
  type Section as SectionData,
  fileVariablesQuery,
} from '../features/sections';
import { useLayerSets } from '../features/layersets';
import { useDerivedVariables } from '../features/derived';
import { useCurrentCruise } from './CruiseLayout';
import { LinePicker } from '../features/lines';
import { FrameExportMenu, type FrameExport } from '../features/sections';

/** Every member may keep saved views of their own (a view is a bookmark, not the cruise's data; the server agrees). */
const canSaveViews = (role: string | null | undefined) => !!role;

export default function Section() {
  const cruise = useCurrentCruise();
  const navigate = useNavigate();
  const [view, setView, currentView] = useSectionView();
  const layerSets = useLayerSets(cruise.id);
  const derived = useDerivedVariables(cruise.id);
  const fileVars = useQuery(fileVariablesQuery(cruise.id));
  const sets = layerSets.data ?? [];
  const layerSet = sets.find((s) => s.id === view.layerSet) ?? null;
  const levels = layerSet?.levels ?? null;
  // A view naming a layer set asks for its frames once the set's levels are known (or cannot be):
  // asking before would compute each frame twice, on the default levels and then on the set's.
  const levelsKnown = !view.layerSet || !layerSets.isPending;

  // Plotly (≈1.4 MB gzip) downloads while the frames are computed, not after.
  useEffect(() => void preloadPlotly().catch(() => undefined), []);

  const byPressure = useSection(cruise.id, sectionQueryString(view, 'pressure', levels), levelsKnown);
  const byDensity = useSection(cruise.id, sectionQueryString(view, 'density', levels), levelsKnown);
  const [hoverStore] = useState(createHoverStore);
  const setHover = hoverStore.set;

  const { label: propLabel, unit: propUnit } = propertyLabel(view.property, [
    ...(derived.data ?? []),
    ...(fileVars.data ?? []),
  ]);
  const unit = byPressure.data?.unit ?? propUnit;
  const densityShowsDepth = view.densityShows === 'depth';
  // Each frame has its own colour range (automatic, or fixed by the view), palette, contours and axes.
  const look = useFramesLook(view, byPressure.data, byDensity.data);
  const range = look.pressureRange;
  const digits = digitsFor(range ? range.max - range.min : NaN);
  const stations = useMemo(
    () => byPressure.data?.stations ?? byDensity.data?.stations ?? [],
    [byPressure.data, byDensity.data],
  );
  const sigma = sigmaName(view.ref);

  const step = useCallback(
    (delta: number) => {
      const next = stepStation(stations, currentView().station, delta);
      if (!next) return;
      setView({ station: next.id }, { replace: true });
      // The readout follows the cursor, at the depth (or σ) last pointed at.
      setHover((h) => {
        const frame = h?.coord === 'density' ? byDensity.data : byPressure.data;
        const y = h?.y ?? frame?.grid.y[Math.floor((frame?.grid.y.length ?? 0) / 3)] ?? 0;
        return { coord: h?.coord ?? 'pressure', x: next.x, y };
      });
    },
    [stations, currentView, setView, setHover, byDensity.data, byPressure.data],
  );

  const onKeyDown = (e: KeyboardEvent<HTMLDivElement>) => {
    if (e.key === 'ArrowRight' || e.key === 'ArrowLeft') {
      e.preventDefault();
      step(e.key === 'ArrowRight' ? 1 : -1);
    } else if (e.key === 'Home' || e.key === 'End') {
      e.preventDefault();
      step(e.key === 'End' ? stations.length : -stations.length);
    }
  };

  const pickStation = useCallback((id: string) => setView({ station: id }, { replace: true }), [setView]);
  // the cast sheet's neighbours follow the line drawn here
  const openCast = (castId: string) =>
    navigate(
      `/cruises/${encodeURIComponent(cruise.id)}/casts/${encodeURIComponent(castId)}${view.line ? `?line=${encodeURIComponent(view.line)}` : ''}`,
    );
  const valueTitle = `${view.property}${unit ? ` (${unit})` : ''}`;
  const levelsText = layerSet
    ? `${layerSet.name} (${layerSet.levels})`
    : `default levels ${byDensity.data?.choices.levels ?? ''}`;
  const handling = INVERSION_HANDLING_TEXT[view.inversions].label.toLowerCase();
  const frameHeight = useFrameHeight(view.frames);
  // Figures leave with a provenance line and a file name of cruise, line and property.
  // the line drawn, by its name (the default line is named by what it is), and its composite joins
  const drawnLine = byPressure.data?.line ?? byDensity.data?.line;
  const lineName = drawnLine && !drawnLine.isDefault ? drawnLine.name : view.line ? (drawnLine?.name ?? null) : null;
  const composites = compositeWords(stations);
  const provenance = provenanceLine(cruise, lineName, undefined, composites);
  const fileBase = figureFileName(cruise.name, lineName, view.property);
  const pressureCaption = sentence(
    `${propLabel}${unit ? ` (${unit})` : ''} by pressure on ${byPressure.data?.choices.bin ?? 10} dbar bins`,
    `isopycnals ${sigma} (reference ${view.ref} dbar, solid, labelled along the lines), inversions ${handling}`,
    look.words.contours('pressure'),
    look.words.palette,
    look.words.range('pressure'),
    look.words.axes,
    `warm marks: inversions of ${sigma} at the cast, from top to bottom of the inverted interval; dark fill: the bottom`,
    composites,
  );
  const densityCaption = sentence(
    `${densityShowsDepth ? 'Pressure (dbar) of the isopycnals' : `${propLabel}${unit ? ` (${unit})` : ''}`} on ${sigma} (reference ${view.ref} dbar)`,
    `inversions ${handling}`,
    `interpolation ${INTERPOLATION_TEXT[view.interpolation].toLowerCase()}`,
    `levels ${levelsText}`,
    look.words.contours('density'),
    densityShowsDepth ? null : look.words.palette,
    look.words.range('density'),
    look.xAxisWords,
    composites,
  );
  const cursor = stations.find((s) => s.id === view.station) ?? null;
  const inversions = byPressure.data?.inversions ?? [];

  const noCasts = byPressure.isSuccess && byPressure.data.stations.length === 0;

  // The T–S and geostrophy panels ask for their data and draw once the first frame is on screen:
  // they share the server and the browser's main thread with the frames, and the frames come first.
  const [framesDrawn, setFramesDrawn] = useState(false);
  const onFirstDrawn = useCallback(() => setFramesDrawn(true), []);
  const pressureSettled = byPressure.isError || noCasts;
  const pressureArrived = byPressure.isSuccess;
  useEffect(() => {
    if (framesDrawn || !pressureArrived) return;
    // Should the plot never report a draw (Plotly failed to load), the panels come anyway.
    const timer = setTimeout(() => setFramesDrawn(true), 4000);
    return () => clearTimeout(timer);
  }, [framesDrawn, pressureArrived]);
  const panelsReady = framesDrawn || pressureSettled;

  return (
    <div className="flex flex-col gap-4">
      <div className="flex flex-wrap items-center gap-3">
        <LinePicker cruiseId={cruise.id} value={view.line} onChange={(line) => setView({ line, station: null })} />
        {byPressure.data?.line?.offLine?.length ? (
          <span className="text-xs text-ink-muted">
            Off the line, not drawn: {byPressure.data.line.offLine.map((o) => o.station).join(', ')}
          </span>
        ) : null}
      </div>
      <SectionControls
        view={view}
        onChange={(patch) => setView(patch)}
        layerSets={sets}
        derived={derived.data ?? []}
        extras={fileVars.data ?? []}
        autoRange={look.autoPressure}
        autoDensityRange={look.autoDensity}
        autoPaletteLabel={look.autoPaletteLabel}
      />
      {(layerSets.isError || derived.isError) && (
        <ErrorNotice
          error={layerSets.error ?? derived.error}
          title="The layer sets or derived variables could not be loaded; the defaults are used"
        />
      )}

      {noCasts ? (
        <Panel title="Section">
          <EmptyState title="No casts yet">
            The section is drawn from the cruise’s processed casts. Upload cast files on the intake first.
          </EmptyState>
        </Panel>
      ) : (
        <div className="grid items-start gap-4 min-[1800px]:grid-cols-[minmax(0,1fr)_20rem]">
          <div className="flex min-w-0 flex-col gap-2">
            <SectionFigureBar
              frames={view.frames}
              onFrames={(frames) => setView({ frames })}
              exportProps={{
                text: { title: `${cruise.name}: ${propLabel} section`, provenance },
                fileName: `${fileBase}_section`,
                captions: { pressure: pressureCaption, density: densityCaption },
              }}
            />
            <div
              tabIndex={0}
              role="application"
              aria-label={`Section frames. Station cursor: ${cursor ? cursor.station : 'none'}. Use the left and right arrow keys to step between stations, Home and End for the ends.`}
              onKeyDown={onKeyDown}
              data-section-frames
              className={`grid gap-3 outline-none focus-visible:ring-2 focus-visible:ring-ink/50 ${view.frames === 'both' ? 'min-[1200px]:grid-cols-2' : ''}`}
            >
              {view.frames !== 'density' && (
                <FrameBox
                  title="By pressure"
                  query={byPressure}
                  exportAs={{
                    text: { title: `${cruise.name}: ${propLabel} by pressure`, provenance },
                    fileName: `${fileBase}_by-pressure`,
                    caption: pressureCaption,
                    frame: 'pressure',
                  }}
                  render={(data) => (
                    <SectionFrame
                      section={data}
                      coord="pressure"
                      valueTitle={valueTitle}
                      range={range}
                      look={look.pressure}
                      fileName={`${fileBase}_by-pressure`}
                      cursorStationId={view.station}
                      height={frameHeight}
                      onHover={setHover}
                      onPickStation={pickStation}
                      onPickInversion={openCast}
                      onDrawn={framesDrawn ? undefined : onFirstDrawn}
                      caption={pressureCaption}
                    />
                  )}
                />
              )}
              {view.frames !== 'pressure' && (
                <FrameBox
                  title={`By density (${sigma})`}
                  query={byDensity}
                  exportAs={{
                    text: {
                      title: `${cruise.name}: ${densityShowsDepth ? 'pressure of the isopycnals' : propLabel} by density (${sigma})`,
                      provenance,
                    },
                    fileName: `${fileBase}_by-density-${sigma}`,
                    caption: densityCaption,
                    frame: 'density',
                  }}
                  render={(data) => (
                    <SectionFrame
                      section={data}
                      coord="density"
                      valueTitle={densityShowsDepth ? 'Pressure (dbar)' : valueTitle}
                      range={look.densityRange}
                      look={look.density}
                      fileName={`${fileBase}_by-density-${sigma}`}
                      cursorStationId={view.station}
                      height={frameHeight}
                      onHover={setHover}
                      onPickStation={pickStation}
                      onPickInversion={openCast}
                      caption={densityCaption}
                    />
                  )}
                />
              )}
            </div>
          </div>
          <aside className="flex flex-col gap-3" aria-label="Section details">
            <LiveReadout
              store={hoverStore}
              byPressure={byPressure.data}
              byDensity={byDensity.data}
              stations={stations}
              unit={unit}
              property={view.property}
              densityShowsDepth={densityShowsDepth}
              sigma={sigma}
              digits={digits}
            />
            <InversionList cruiseId={cruise.id} inversions={inversions} sigma={sigma} line={view.line} />
            <SavedViews cruiseId={cruise.id} query={serialiseViewState(view)} canSave={canSaveViews(cruise.role)} />
          </aside>
        </div>
      )}

      {!noCasts && !panelsReady && (
        <div className="grid gap-4 2xl:grid-cols-2">
          <Panel title="T–S">
            <Progress label="The T–S diagram follows the section…" />
          </Panel>
          <Panel title="Geostrophy">
            <Progress label="Geostrophy follows the section…" />
          </Panel>
        </div>
      )}
      {!noCasts && panelsReady && (
        <div className="grid gap-4 2xl:grid-cols-2">
          <TsPanel
            cruiseId={cruise.id}
            refPressure={view.ref}
            colourBy={view.tsColour}
            selectedCastId={view.station}
            onColourBy={(tsColour) => setView({ tsColour })}
            onSelectCast={(castId) => setView({ station: castId }, { replace: true })}
            line={view.line}
          />
          <GeostrophyPanel
            cruiseId={cruise.id}
            view={view}
            levels={levels}
            layerSetName={layerSet ? layerSet.name : `the default ${sigma} levels`}
            onReference={(pRef) => setView({ pRef })}
          />
        </div>
      )}
    </div>
  );
}

function FrameBox({
  title,
  query,
  render,
  exportAs,
}: {
  title: string;
  query: ReturnType<typeof useSection>;
  render: (data: SectionData) => React.ReactNode;
  exportAs?: FrameExport;
}) {
  return (
    <Panel
      title={title}
      actions={
        <span className="flex items-center gap-2">
          {query.isFetching && query.data && (
            <span className="flex items-center gap-1.5 text-xs text-ink-muted">
              <Spinner label={`Recomputing ${title}`} /> recomputing…
            </span>
          )}
          {exportAs && query.data && <FrameExportMenu what={`the frame ${title.toLowerCase()}`} {...exportAs} />}
        </span>
      }
      className="min-w-0"
    >
      {query.isPending && <Progress label={`Computing the section ${title.toLowerCase()}…`} />}
      {query.isError && !query.data && (
        <div className="p-3">
          <ErrorNotice error={query.error} title={`The section ${title.toLowerCase()} could not be computed`} />
        </div>
      )}
      {query.isError && query.data && (
        <div className="p-3">
          <ErrorNotice error={query.error} title="These choices could not be computed; the last section is shown" />
        </div>
      )}
      {query.data && (
        <div className={query.isPlaceholderData ? 'opacity-60 transition-opacity' : ''}>{render(query.data)}</div>
      )}
    </Panel>
  );
}

/** The readout, the one part of the screen that follows the pointer. */
function LiveReadout({
  store,
  byPressure,
  byDensity,
  stations,
  unit,
  property,
  densityShowsDepth,
  sigma,
  digits,
}: {
  store: HoverStore;
  byPressure: SectionData | undefined;
  byDensity: SectionData | undefined;
  stations: SectionData['stations'];
  unit: string;
  property: string;
  densityShowsDepth: boolean;
  sigma: string;
  digits: number;
}) {
  const readout = toReadout(useHover(store), byPressure, byDensity, stations);
  const depth = readout?.coord === 'density' && densityShowsDepth;
  return (
    <Readout
      readout={readout}
      unit={depth ? 'dbar' : unit}
      valueName={depth ? 'Pressure' : property}
      sigma={sigma}
      digits={depth ? 0 : digits}
    />
  );
}

function toReadout(
  hover: ReturnType<HoverStore['get']>,
  byPressure: SectionData | undefined,
  byDensity: SectionData | undefined,
  stations: SectionData['stations'],
): ReadoutValue | null {
  if (!hover) return null;
  const frame = hover.coord === 'pressure' ? byPressure : byDensity;
  if (!frame) return null;
  return {
    coord: hover.coord,
    x: hover.x,
    y: hover.y,
    value: sampleGrid(frame.grid, hover.x, hover.y),
    station: nearestStation(stations, hover.x)?.station ?? null,
  };
}

/**
 * Frame height from the window: side by side (from 1200 px wide) both frames fit 1280×800 with
 * the controls above; one frame at a time takes more of the height; stacked frames (narrow
 * windows) are shorter.
 */
function useFrameHeight(frames: 'both' | 'pressure' | 'density'): number {
  const pick = () => {
    if (typeof window === 'undefined') return 330;
    const h = window.innerHeight;
    if (frames !== 'both') return Math.min(640, Math.max(320, Math.round(h * 0.55)));
    return window.innerWidth >= 1200 ? Math.min(520, Math.max(280, h - 445)) : 330;
  };
  const [height, setHeight] = useState(pick);
  useEffect(() => {
    const onResize = () => setHeight(pick());
    onResize();
    window.addEventListener('resize', onResize);
    return () => window.removeEventListener('resize', onResize);
  }, [frames]); // eslint-disable-line react-hooks/exhaustive-deps
  return height;
}
