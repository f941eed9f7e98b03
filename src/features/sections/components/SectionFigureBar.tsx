import { useState } from 'react';
import { Button } from '../../../components/Button';
import { SOFTWARE } from '../../../lib/version';
import type { FigureText } from '../export/compose';
import { fileNameFor } from '../export/compose';
import type { ExportSource } from '../export/exportFigure';
import { FRAME_CHOICES, type FrameChoice } from '../viewState';
import { ExportMenu } from './ExportMenu';

/** The graph of a drawn frame on screen, by its frame ('pressure' | 'density'). */
function frameGraph(frame: 'pressure' | 'density'): HTMLElement | null {
  return document.querySelector<HTMLElement>(`figure[data-frame="${frame}"] .js-plotly-plot`);
}

export interface FrameExport {
  text: FigureText;
  fileName: string;
  caption: string;
  frame: 'pressure' | 'density';
}

/** The export menu of one frame. */
export function FrameExportMenu({ what, text, fileName, caption, frame }: FrameExport & { what: string }) {
  return (
    <ExportMenu
      what={what}
      text={text}
      fileName={fileName}
      sources={() => {
        const graph = frameGraph(frame);
        return graph ? [{ graph, caption }] : [];
      }}
    />
  );
}

const FRAME_WORDS: Record<FrameChoice, string> = {
  both: 'Both frames',
  pressure: 'By pressure',
  density: 'By density',
};

/**
 * Above the frames: which frames to show (both, or one at a time), copy a link to this view,
 * print, and export the whole section view.
 */
export function SectionFigureBar({
  frames,
  onFrames,
  exportProps,
}: {
  frames: FrameChoice;
  onFrames: (frames: FrameChoice) => void;
  exportProps: { text: FigureText; fileName: string; captions: { pressure: string; density: string } };
}) {
  const [copied, setCopied] = useState<'yes' | 'failed' | null>(null);
  const copy = async () => {
    try {
      await navigator.clipboard.writeText(window.location.href);
      setCopied('yes');
    } catch {
      setCopied('failed');
    }
    setTimeout(() => setCopied(null), 4000);
  };
  return (
    <div className="flex flex-wrap items-center gap-2 print:hidden" role="toolbar" aria-label="Section figure">
      <div
        role="radiogroup"
        aria-label="Frames shown"
        className="flex overflow-hidden rounded border border-paper-rule text-sm"
      >
        {FRAME_CHOICES.map((f) => (
          <button
            key={f}
            type="button"
            role="radio"
            aria-checked={frames === f}
            onClick={() => onFrames(f)}
            className={`px-2.5 py-1 ${frames === f ? 'bg-ink text-paper' : 'bg-paper-raised text-ink hover:bg-ink-wash'}`}
          >
            {FRAME_WORDS[f]}
          </button>
        ))}
      </div>
      <span className="flex-1" />
      <Button size="sm" variant="quiet" onClick={() => void copy()} aria-label="Copy a link to this view">
        {copied === 'yes' ? 'Link copied' : copied === 'failed' ? 'Copy failed: use the address bar' : 'Copy link'}
      </Button>
      <Button size="sm" variant="quiet" onClick={() => window.print()}>
        Print
      </Button>
      <ExportMenu
        what="the section view"
        text={exportProps.text}
        fileName={exportProps.fileName}
        sources={() => {
          const out: ExportSource[] = [];
          for (const frame of ['pressure', 'density'] as const) {
            const graph = frameGraph(frame);
            if (graph) out.push({ graph, caption: exportProps.captions[frame] });
          }
          return out;
        }}
      />
    </div>
  );
}

/** The provenance line of a figure: cruise, line, software version, date (UTC). */
export function provenanceLine(
  cruise: { name: string; ship?: string | null },
  lineName: string | null,
  now = new Date(),
  composites: string | null = null,
): string {
  const line = lineName ? `line ${lineName}` : 'default line (deepest cast per station, in plan order)';
  return `Cruise ${cruise.name}${cruise.ship ? ` (${cruise.ship})` : ''} · ${line}${composites ? ` · ${composites}` : ''} · ${SOFTWARE} · drawn ${now.toISOString().slice(0, 16).replace('T', ' ')} UTC · provisional research data, not for navigation`;
}

/** A figure's file name after cruise, line and property. */
export function figureFileName(cruise: string, lineName: string | null, property: string): string {
  return fileNameFor(cruise, lineName ?? 'default-line', property);
}

/** The joins of a line's composite casts, for a caption and a provenance line; null when there are none. */
export function compositeWords(
  stations: { station: string; composite?: { shallowCast: string; deepCast: string; joinPressure: number } | null }[],
): string | null {
  const joins = stations.flatMap((s) =>
    s.composite
      ? [
          `${s.station} (cast ${s.composite.shallowCast} above ${s.composite.joinPressure} dbar, cast ${s.composite.deepCast} from it down)`,
        ]
      : [],
  );
  return joins.length ? `composite ${joins.length === 1 ? 'cast' : 'casts'} at ${joins.join(', ')}` : null;
}
