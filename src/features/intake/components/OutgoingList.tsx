import { Button } from '../../../components/Button';
import { sendFailureText, type Outgoing } from '../api';
import { Bar, formatBytes } from './Bars';
import { UploadFollow } from './UploadFollow';

/** The files sent from this browser in this visit: bytes first, then what the server does with them. */
export function OutgoingList({
  cruiseId,
  outgoing,
  onCancel,
  onClear,
}: {
  cruiseId: string;
  outgoing: readonly Outgoing[];
  onCancel: (key: string) => void;
  onClear: () => void;
}) {
  if (outgoing.length === 0) return null;
  const finished = outgoing.filter((o) => o.phase === 'sent' || o.phase === 'failed').length;
  const sentBytes = outgoing.reduce((n, o) => n + o.loaded, 0);
  const totalBytes = outgoing.reduce((n, o) => n + o.size, 0);
  return (
    <section aria-label="Files being sent" className="border border-paper-rule bg-paper-raised">
      <header className="flex items-center gap-3 border-b border-paper-rule px-4 py-1.5">
        <h2 className="text-xs font-semibold uppercase tracking-[0.12em] text-ink-soft">This batch</h2>
        <span className="font-mono text-xs tabular-nums text-ink-muted">
          {finished}/{outgoing.length} sent · {formatBytes(sentBytes)} of {formatBytes(totalBytes)}
        </span>
        <Button size="sm" variant="quiet" className="ml-auto" onClick={onClear} disabled={finished === 0}>
          Clear finished
        </Button>
      </header>
      <ul className="divide-y divide-paper-rule">
        {outgoing.map((o) => (
          <li key={o.key} className="grid gap-2 px-4 py-2.5 lg:grid-cols-[minmax(14rem,22rem)_1fr]">
            <div className="min-w-0">
              <p className="truncate font-mono text-sm text-ink-strong" title={o.name}>
                {o.name}
              </p>
              <p className="font-mono text-2xs tabular-nums text-ink-muted">{formatBytes(o.size)}</p>
            </div>
            <div className="flex flex-col gap-2">
              {(o.phase === 'waiting' || o.phase === 'sending') && (
                <div className="grid grid-cols-[6.5rem_1fr_auto] items-center gap-3">
                  <span className="text-2xs font-semibold uppercase tracking-[0.08em] text-ink-soft">
                    {o.phase === 'waiting' ? 'Waiting' : 'Sending'}
                  </span>
                  <Bar
                    label={`Sending ${o.name}`}
                    value={o.size > 0 ? o.loaded / o.size : 0}
                    figures={`${formatBytes(o.loaded)} / ${formatBytes(o.size)}`}
                  />
                  <Button
                    size="sm"
                    variant="quiet"
                    onClick={() => onCancel(o.key)}
                    aria-label={`Cancel sending ${o.name}`}
                    disabled={o.phase === 'waiting'}
                  >
                    Cancel
                  </Button>
                </div>
              )}
              {o.phase === 'failed' && (
                <div role="alert" className="border-l-2 border-warn bg-warn-wash/50 px-3 py-1.5 text-sm">
                  <span className="mr-2 font-semibold text-warn-strong">Not sent.</span>
                  <span className="text-ink-strong">{sendFailureText(o.error)}</span>
                </div>
              )}
              {o.phase === 'sent' &&
                o.uploads.map((u) => (
                  <div key={u.id} className={o.uploads.length > 1 ? 'border-l border-paper-rule pl-3' : ''}>
                    {o.uploads.length > 1 && <p className="mb-1 font-mono text-xs text-ink-soft">{u.filename}</p>}
                    <UploadFollow cruiseId={cruiseId} upload={u} canUpload />
                  </div>
                ))}
            </div>
          </li>
        ))}
      </ul>
    </section>
  );
}
