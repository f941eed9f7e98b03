import type { FileProblem } from '../types';

/** Where a problem is, as `file:line:column` reads in an editor. */
export function problemPlace(p: FileProblem, fallbackFile?: string): string {
  const file = p.file ?? fallbackFile ?? '';
  const parts = [file];
  if (p.line != null) parts.push(`line ${p.line}`);
  if (p.column != null) parts.push(typeof p.column === 'number' ? `column ${p.column}` : `column “${p.column}”`);
  return parts.filter(Boolean).join(', ');
}

/**
 * A file's errors (warm accent: they are why it failed) or warnings (ink), each with file, line and
 * column, in a compact list a technician can take to the file.
 */
export function FileProblems({
  problems,
  kind,
  filename,
  limit = 50,
}: {
  problems: readonly FileProblem[];
  kind: 'error' | 'warning';
  filename: string;
  limit?: number;
}) {
  if (problems.length === 0) return null;
  const shown = problems.slice(0, limit);
  const isError = kind === 'error';
  return (
    <div
      className={`border-l-2 ${isError ? 'border-warn bg-warn-wash/50' : 'border-ink-faint bg-paper-sunk/60'} px-3 py-2`}
    >
      <p
        className={`mb-1 text-xs font-semibold uppercase tracking-[0.08em] ${isError ? 'text-warn-strong' : 'text-ink-soft'}`}
      >
        {problems.length}{' '}
        {isError ? (problems.length === 1 ? 'error' : 'errors') : problems.length === 1 ? 'warning' : 'warnings'} in{' '}
        {filename}
      </p>
      <ol aria-label={`${isError ? 'Errors' : 'Warnings'} in ${filename}`} className="flex flex-col gap-0.5 text-sm">
        {shown.map((p, i) => (
          <li key={i} className="grid grid-cols-[15rem_1fr] gap-3">
            <span
              className={`font-mono text-xs tabular-nums leading-5 ${isError ? 'text-warn-strong' : 'text-ink-soft'}`}
            >
              {problemPlace(p, filename)}
            </span>
            <span className="text-ink-strong">
              {p.message}
              {p.code && <span className="ml-2 font-mono text-2xs text-ink-muted">{p.code}</span>}
            </span>
          </li>
        ))}
      </ol>
      {problems.length > shown.length && (
        <p className="mt-1 text-xs text-ink-muted">and {problems.length - shown.length} more of the same file.</p>
      )}
    </div>
  );
}
