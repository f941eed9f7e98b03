import { useId, useRef, useState, type DragEvent } from 'react';

/**
 * Where files are dropped: one, many, or a zip. The visible button opens the file picker; the
 * whole zone also takes a drop. Keyboard users reach the button; the zone itself is not a control.
 */
export function DropZone({
  onFiles,
  disabled = false,
  maxBytes,
}: {
  onFiles: (files: File[]) => void;
  disabled?: boolean;
  maxBytes?: number;
}) {
  const [over, setOver] = useState(false);
  const input = useRef<HTMLInputElement>(null);
  const hintId = useId();

  const take = (list: FileList | null) => {
    const files = list ? Array.from(list) : [];
    if (files.length > 0) onFiles(files);
  };

  const onDrop = (e: DragEvent<HTMLDivElement>) => {
    e.preventDefault();
    setOver(false);
    if (!disabled) take(e.dataTransfer.files);
  };

  return (
    <div
      data-testid="drop-zone"
      onDragOver={(e) => {
        e.preventDefault();
        if (!disabled) setOver(true);
      }}
      onDragLeave={() => setOver(false)}
      onDrop={onDrop}
      className={`flex flex-col items-center justify-center gap-2.5 border-2 border-dashed px-6 py-6 text-center transition-colors ${
        over ? 'border-ink bg-ink-wash/70' : 'border-ink/25 bg-paper-raised'
      } ${disabled ? 'opacity-60' : ''}`}
    >
      <svg width="40" height="32" viewBox="0 0 40 32" aria-hidden="true" className="text-ink-soft">
        <path
          d="M4 8 C12 3 18 13 26 8 S36 6 36 6 M4 15 C12 10 18 20 26 15 S36 13 36 13"
          fill="none"
          stroke="currentColor"
          strokeWidth="1.6"
        />
        <path d="M20 31 V19 M15 24 L20 19 L25 24" fill="none" stroke="currentColor" strokeWidth="1.8" />
      </svg>
      <p className="text-[0.95rem] font-semibold text-ink-strong">Drop cast files here</p>
      <p id={hintId} className="max-w-[60ch] text-sm text-ink-muted">
        Delimited text (CSV, TSV) with a header row, the hydrographic exchange format, a station table, or a zip of any
        of these. Each file is sent on its own with its own progress bar
        {maxBytes ? (
          <>
            ; at most <span className="font-mono">{Math.round(maxBytes / 1048576)} MB</span> a file
          </>
        ) : null}
        .
      </p>
      <input
        ref={input}
        type="file"
        multiple
        hidden
        aria-label="Cast files to upload"
        accept=".csv,.tsv,.txt,.dat,.cnv,.csv.txt,.zip,text/csv,text/plain,application/zip"
        onChange={(e) => {
          take(e.target.files);
          e.target.value = '';
        }}
      />
      <button
        type="button"
        disabled={disabled}
        aria-describedby={hintId}
        onClick={() => input.current?.click()}
        className="h-9 rounded border border-ink bg-ink px-3.5 text-[0.95rem] font-medium text-paper-raised hover:bg-ink-strong focus-visible:outline-2 focus-visible:outline-offset-2 focus-visible:outline-ink disabled:cursor-not-allowed disabled:border-ink-faint disabled:bg-ink-faint"
      >
        Choose files…
      </button>
    </div>
  );
}
