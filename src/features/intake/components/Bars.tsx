import type { UploadStatus } from '../types';

export function formatBytes(n: number | null | undefined): string {
  if (n == null || !Number.isFinite(n)) return '—';
  if (n < 1024) return `${n} B`;
  if (n < 1024 * 1024) return `${(n / 1024).toFixed(1)} kB`;
  return `${(n / (1024 * 1024)).toFixed(1)} MB`;
}

/** A determinate bar with its figures beside it. `tone` warn only for failure. */
export function Bar({
  label,
  value,
  tone = 'ink',
  figures,
}: {
  label: string;
  value: number;
  tone?: 'ink' | 'warn' | 'muted';
  figures?: string;
}) {
  const v = Math.max(0, Math.min(1, Number.isFinite(value) ? value : 0));
  const fill = tone === 'warn' ? 'bg-warn' : tone === 'muted' ? 'bg-ink-faint' : 'bg-ink';
  return (
    <div className="flex items-center gap-2">
      <div
        role="progressbar"
        aria-label={label}
        aria-valuemin={0}
        aria-valuemax={100}
        aria-valuenow={Math.round(v * 100)}
        aria-valuetext={figures}
        className="relative h-1.5 w-full min-w-24 overflow-hidden rounded-sm bg-ink-wash"
      >
        <div className={`h-full ${fill} transition-[width] duration-150`} style={{ width: `${v * 100}%` }} />
      </div>
      {figures && <span className="shrink-0 font-mono text-2xs tabular-nums text-ink-muted">{figures}</span>}
    </div>
  );
}

const STATUS_TEXT: Record<UploadStatus, string> = {
  queued: 'Queued',
  processing: 'Processing',
  ready: 'Ready',
  failed: 'Failed',
  awaiting_decision: 'Your call',
};

export function StatusBadge({ status }: { status: UploadStatus }) {
  const look =
    status === 'failed'
      ? 'border-warn/60 bg-warn-wash text-warn-strong'
      : status === 'ready'
        ? 'border-ink/40 bg-ink-wash text-ink-strong'
        : 'border-paper-rule bg-paper-sunk text-ink-soft';
  return (
    <span
      className={`inline-flex items-center gap-1 rounded-sm border px-1.5 py-px text-2xs font-semibold uppercase tracking-[0.08em] ${look}`}
    >
      {status === 'failed' && <span aria-hidden>▲</span>}
      {STATUS_TEXT[status]}
    </span>
  );
}
