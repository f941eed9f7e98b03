import { useState } from 'react';
import { Button } from '../../../components/Button';
import type { FigureText } from '../export/compose';
import {
  DEFAULT_EXPORT_SIZE,
  EXPORT_FORMATS,
  figureBytes,
  saveBlob,
  type ExportFormat,
  type ExportSize,
  type ExportSource,
} from '../export/exportFigure';

export interface ExportMenuProps {
  /** What is exported, in words ("the frame by pressure", "the section view"). */
  what: string;
  /** The plots to export and their captions, read when a button is pressed. */
  sources: () => ExportSource[];
  text: FigureText;
  /** The file name without extension (cruise, line, property, frame). */
  fileName: string;
}

const LIMITS = { width: [300, 4000], height: [200, 3000], dpi: [72, 600] } as const;

/** Export a figure as SVG, PDF or PNG at a chosen size and resolution; the file is made in the browser. */
export function ExportMenu({ what, sources, text, fileName }: ExportMenuProps) {
  const [size, setSize] = useState<ExportSize>(DEFAULT_EXPORT_SIZE);
  const [busy, setBusy] = useState<ExportFormat | null>(null);
  const [problem, setProblem] = useState<string | null>(null);

  const run = async (format: ExportFormat) => {
    const src = sources();
    if (!src.length) {
      setProblem('The figure is not drawn yet; wait until it is on screen.');
      return;
    }
    for (const k of ['width', 'height', 'dpi'] as const) {
      if (!(size[k] >= LIMITS[k][0] && size[k] <= LIMITS[k][1])) {
        setProblem(`The ${k} must be between ${LIMITS[k][0]} and ${LIMITS[k][1]}.`);
        return;
      }
    }
    setProblem(null);
    setBusy(format);
    try {
      saveBlob(await figureBytes(src, text, format, size), `${fileName}.${format}`);
    } catch (e) {
      setProblem(`The ${format.toUpperCase()} could not be made: ${(e as Error).message}`);
    } finally {
      setBusy(null);
    }
  };

  const field = (k: keyof ExportSize, label: string, unit: string) => (
    <label className="flex items-center gap-1">
      <span className="w-12 text-ink-soft">{label}</span>
      <input
        type="number"
        aria-label={`Export ${label.toLowerCase()} (${unit})`}
        value={size[k]}
        min={LIMITS[k][0]}
        max={LIMITS[k][1]}
        onChange={(e) => setSize((s) => ({ ...s, [k]: Number(e.target.value) }))}
        className="h-7 w-20 rounded border border-paper-rule bg-paper px-1.5 font-mono tabular-nums"
      />
      <span className="text-ink-muted">{unit}</span>
    </label>
  );

  return (
    <details className="relative print:hidden" data-export-menu>
      <summary
        className="cursor-pointer list-none rounded border border-paper-rule px-2 py-0.5 text-xs text-ink hover:bg-ink-wash"
        aria-label={`Export ${what}`}
      >
        Export…
      </summary>
      <div
        className="absolute right-0 z-30 mt-1 flex w-72 flex-col gap-2 border border-ink/30 bg-paper-raised p-3 text-xs shadow-md"
        role="group"
        aria-label={`Export ${what}`}
      >
        <p className="text-ink-strong">
          Export {what} with its title, caption and provenance. The file is made here in the browser.
        </p>
        {field('width', 'Width', 'px')}
        {field('height', 'Height', 'px per plot')}
        {field('dpi', 'DPI', 'PNG, PDF')}
        <div className="flex gap-1.5">
          {EXPORT_FORMATS.map((f) => (
            <Button
              key={f}
              size="sm"
              busy={busy === f}
              disabled={busy !== null}
              onClick={() => void run(f)}
              aria-label={`Save ${what} as ${f.toUpperCase()}`}
            >
              {f.toUpperCase()}
            </Button>
          ))}
        </div>
        <p className="font-mono text-2xs text-ink-muted break-all">{fileName}.…</p>
        {problem && (
          <p role="alert" className="text-warn-strong">
            {problem}
          </p>
        )}
      </div>
    </details>
  );
}
