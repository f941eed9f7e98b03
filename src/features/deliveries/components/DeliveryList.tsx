import { useState } from 'react';
import { Button } from '../../../components/Button';
import { ErrorNotice, Progress } from '../../../components/Notice';
import { Num } from '../../../components/Num';
import { EmptyState } from '../../../components/Panel';
import { formatUtc } from '../../../lib/format';
import { useMembers } from '../../team';
import { downloadUrl, useDeleteDelivery, useReleaseDelivery } from '../api';
import { canDeliver, type LayerSetChoice } from '../form';
import { FLAG_MEANINGS, FORMAT_TEXT, KIND_TEXT, type Delivery, type DeliveryFormat } from '../types';

function formatSize(bytes: number): string {
  if (bytes < 1024) return `${bytes} B`;
  if (bytes < 1024 ** 2) return `${(bytes / 1024).toFixed(1)} kB`;
  return `${(bytes / 1024 ** 2).toFixed(1)} MB`;
}

const str = (v: unknown): string | null => (typeof v === 'string' && v ? v : typeof v === 'number' ? String(v) : null);

/** How a delivery was made, from its stored parameters: every choice its numbers depend on. */
export function provenanceOf(
  d: Delivery,
  layerSets: readonly LayerSetChoice[],
  nameOf: (user: string | null) => string = (u) => u ?? '—',
): { term: string; value: string }[] {
  const p = d.params ?? {};
  const rows: { term: string; value: string }[] = [];
  const ref = typeof p.ref === 'number' ? p.ref : null;
  if (d.kind !== 'pressure') {
    rows.push({
      term: 'Reference pressure',
      value: ref === null ? 'σ0 · 0 dbar (default)' : `σ${ref / 1000} · ${ref} dbar`,
    });
    const levels = str(p.levels);
    const named =
      str(p.layerSet) ?? layerSets.find((s) => s.levels === levels && s.referencePressure === (ref ?? 0))?.name ?? null;
    rows.push({
      term: 'Layer set',
      value: named ? `${named}${levels ? ` (${levels})` : ''}` : levels ? levels : 'default levels',
    });
    rows.push({ term: 'Inversion handling', value: str(p.inversions) ?? 'sort' });
    rows.push({ term: 'Interpolation', value: str(p.interpolation) === 'pchip' ? 'monotone cubic' : 'linear' });
  }
  if (d.kind !== 'isopycnal') rows.push({ term: 'Pressure bin', value: `${str(p.bin) ?? '2'} dbar` });
  const flags = Array.isArray(p.flags)
    ? (p.flags as unknown[]).filter((f): f is number => typeof f === 'number')
    : null;
  rows.push({
    term: 'Flags included',
    value: flags
      ? flags.map((f) => `${f} ${(FLAG_MEANINGS as Record<number, string>)[f] ?? ''}`.trim()).join(', ')
      : '—',
  });
  rows.push({ term: 'Built by', value: `${nameOf(d.createdBy)}, ${formatUtc(d.createdAt)}` });
  if (d.released) rows.push({ term: 'Released by', value: `${nameOf(d.releasedBy)}, ${formatUtc(d.releasedAt)}` });
  return rows;
}

export function DeliveryList({
  cruiseId,
  deliveries,
  role,
  layerSets,
}: {
  cruiseId: string;
  deliveries: readonly Delivery[];
  role: string | null;
  layerSets: readonly LayerSetChoice[];
}) {
  const members = useMembers(cruiseId);
  // The API names people by user id (or e-mail); show the member's name where we know it.
  const nameOf = (user: string | null) => {
    if (!user) return '—';
    const m = members.data?.find((x) => x.userId === user || x.email === user);
    return m ? `${m.name} (${m.email})` : user;
  };
  if (deliveries.length === 0) {
    return (
      <EmptyState title="No deliveries yet">
        A delivery is a regridded table or a data package, built from the choices you make and kept with them.
      </EmptyState>
    );
  }
  return (
    <ul className="flex flex-col">
      {deliveries.map((d) => (
        <DeliveryItem key={d.id} cruiseId={cruiseId} delivery={d} role={role} layerSets={layerSets} nameOf={nameOf} />
      ))}
    </ul>
  );
}

function DeliveryItem({
  cruiseId,
  delivery: d,
  role,
  layerSets,
  nameOf,
}: {
  cruiseId: string;
  delivery: Delivery;
  role: string | null;
  layerSets: readonly LayerSetChoice[];
  nameOf: (user: string | null) => string;
}) {
  const release = useReleaseDelivery(cruiseId);
  const remove = useDeleteDelivery(cruiseId);
  const [confirming, setConfirming] = useState(false);
  const [confirmingDelete, setConfirmingDelete] = useState(false);
  const building = d.status === 'queued' || d.status === 'building';
  const titleId = `delivery-${d.id}`;

  return (
    <li
      aria-labelledby={titleId}
      className={`border-b border-paper-rule px-4 py-3 last:border-b-0 ${d.released ? 'bg-ink-wash/40' : ''}`}
    >
      <div className="flex flex-wrap items-baseline gap-x-3 gap-y-1">
        <h3 id={titleId} className="font-semibold text-ink-strong">
          {d.released && <LockMark />}
          {KIND_TEXT[d.kind].label}
        </h3>
        <span className="font-mono text-xs text-ink-muted">{formatUtc(d.createdAt)}</span>
        <StatusTag delivery={d} />
        <div className="ml-auto flex items-center gap-2">
          {canDeliver.release(role) && !d.released && d.status === 'ready' && !confirming && (
            <Button size="sm" variant="primary" onClick={() => setConfirming(true)}>
              Release…
            </Button>
          )}
          {canDeliver.remove(role) && !d.released && (
            <Button
              size="sm"
              variant="danger"
              onClick={() => setConfirmingDelete(true)}
              aria-label={`Delete this ${KIND_TEXT[d.kind].label.toLowerCase()}…`}
            >
              Delete…
            </Button>
          )}
        </div>
      </div>

      {building && (
        <div className="-mx-4">
          <Progress
            label={`${d.status === 'queued' ? 'Waiting to build' : 'Building'} the ${KIND_TEXT[d.kind].label.toLowerCase()}…`}
            value={d.progress ?? undefined}
          />
        </div>
      )}
      {d.status === 'failed' && (
        <div role="alert" className="mt-2 border-l-2 border-warn bg-warn-wash/60 px-3 py-1.5 text-sm text-warn-strong">
          The build failed{d.error ? `: ${d.error}` : '.'}
        </div>
      )}

      <div className="mt-2 grid gap-3 md:grid-cols-[minmax(0,1fr)_minmax(0,1fr)]">
        <dl className="grid grid-cols-[auto_1fr] gap-x-3 gap-y-0.5 text-sm" aria-label="Provenance">
          {provenanceOf(d, layerSets, nameOf).map((row) => (
            <div key={row.term} className="contents">
              <dt className="text-ink-muted">{row.term}</dt>
              <dd className="text-ink-strong">{row.value}</dd>
            </div>
          ))}
        </dl>
        {d.status === 'ready' && !d.canDownload && (
          <p className="text-sm text-ink-soft">
            Not released yet: until the principal investigator releases it, only the PI, the chief scientist and
            analysts can download it. The release e-mail goes to every member once they can.
          </p>
        )}
        {d.status === 'ready' && d.canDownload && (
          <div>
            <p className="mb-1 text-xs font-semibold uppercase tracking-[0.1em] text-ink-soft">Download</p>
            <ul className="flex flex-col gap-1.5 text-sm">
              {d.files.map((f) => (
                <li key={f.filename}>
                  {/* the format and size on one line, the file name whole on the next (wrapped only if it must) */}
                  <div className="flex items-baseline gap-3">
                    <a href={downloadUrl(d.id, f.format)} download={f.filename} className="whitespace-nowrap">
                      {FORMAT_TEXT[f.format as DeliveryFormat] ?? f.format.toUpperCase()}
                    </a>
                    <Num className="ml-auto whitespace-nowrap text-right text-ink-muted">{formatSize(f.size)}</Num>
                  </div>
                  <Num className="block text-ink-soft [overflow-wrap:anywhere]">
                    <span title={`sha256 ${f.sha256}`}>{f.filename}</span>
                  </Num>
                </li>
              ))}
              {d.kind === 'package' && (
                <li>
                  <a href={downloadUrl(d.id, 'zip')}>Everything as one zip</a>
                </li>
              )}
            </ul>
            <p className="mt-1 text-2xs text-ink-muted">
              Checksums (sha256) are in each file’s tooltip and in the package manifest.
            </p>
          </div>
        )}
      </div>

      {confirming && (
        <div
          role="alertdialog"
          aria-labelledby={`${titleId}-confirm`}
          aria-describedby={`${titleId}-confirm-text`}
          className="mt-3 border border-ink/40 bg-paper-raised p-3"
        >
          <p id={`${titleId}-confirm`} className="font-semibold text-ink-strong">
            Release this delivery to the team?
          </p>
          <p id={`${titleId}-confirm-text`} className="mt-1 text-sm text-ink-soft">
            Every member of the cruise is e-mailed a link to it, and every member may then download it. Once released,
            the delivery is frozen: its files and choices can no longer change and it cannot be deleted.
          </p>
          {release.isError && (
            <div className="mt-2">
              <ErrorNotice error={release.error} title="The delivery was not released" />
            </div>
          )}
          <div className="mt-2 flex gap-2">
            <Button
              variant="primary"
              size="sm"
              busy={release.isPending}
              onClick={() => release.mutate(d.id, { onSuccess: () => setConfirming(false) })}
            >
              Release and e-mail the team
            </Button>
            <Button size="sm" onClick={() => setConfirming(false)}>
              Cancel
            </Button>
          </div>
        </div>
      )}
      {confirmingDelete && (
        <div
          role="alertdialog"
          aria-labelledby={`${titleId}-delete`}
          aria-describedby={`${titleId}-delete-text`}
          className="mt-3 border border-warn/60 bg-paper-raised p-3"
        >
          <p id={`${titleId}-delete`} className="font-semibold text-ink-strong">
            Delete this {KIND_TEXT[d.kind].label.toLowerCase()}?
          </p>
          <p id={`${titleId}-delete-text`} className="mt-1 text-sm text-ink-soft">
            Its files ({d.files.map((f) => f.filename).join(', ') || 'none yet'}) are removed. The deletion is recorded
            in the audit trail with who deleted it and the choices it was built with.
          </p>
          <div className="mt-2 flex gap-2">
            <Button
              variant="danger"
              size="sm"
              busy={remove.isPending}
              onClick={() => remove.mutate(d.id, { onSuccess: () => setConfirmingDelete(false) })}
            >
              Delete it
            </Button>
            <Button size="sm" onClick={() => setConfirmingDelete(false)}>
              Keep it
            </Button>
          </div>
        </div>
      )}
      {remove.isError && (
        <div className="mt-2">
          <ErrorNotice error={remove.error} title="The delivery was not deleted" />
        </div>
      )}
    </li>
  );
}

function StatusTag({ delivery: d }: { delivery: Delivery }) {
  if (d.released) return <span className="border border-ink/40 px-1.5 text-xs text-ink">released · locked</span>;
  const text = {
    queued: 'queued',
    building: `building ${d.progress != null ? `${Math.round(d.progress * 100)} %` : ''}`,
    ready: 'ready',
    failed: 'failed',
  }[d.status];
  return (
    <span
      className={`px-1.5 text-xs ${d.status === 'failed' ? 'border border-warn text-warn-strong' : 'border border-paper-rule text-ink-soft'}`}
    >
      {text}
    </span>
  );
}

/** A padlock: released deliveries are frozen. */
function LockMark() {
  return (
    <svg
      role="img"
      aria-label="Released and locked"
      viewBox="0 0 16 16"
      width="14"
      height="14"
      className="mr-1.5 inline-block align-[-1px] text-ink"
    >
      <title>Released: locked, it can no longer change</title>
      <rect x="3" y="7" width="10" height="7.5" rx="1" fill="currentColor" />
      <path d="M5.2 7V5a2.8 2.8 0 0 1 5.6 0v2" fill="none" stroke="currentColor" strokeWidth="1.6" />
    </svg>
  );
}
