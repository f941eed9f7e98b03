import { Fragment, useState } from 'react';
import { EmptyState } from '../../../components/Panel';
import { formatUtc } from '../../../lib/format';
import type { Upload } from '../types';
import { formatBytes, StatusBadge } from './Bars';
import { UploadFollow } from './UploadFollow';

/** Every upload of the cruise, newest first; a row opens to its errors, mapping step and retry. */
export function UploadHistory({
  cruiseId,
  uploads,
  canUpload,
}: {
  cruiseId: string;
  uploads: readonly Upload[];
  canUpload: boolean;
}) {
  const [open, setOpen] = useState<string | null>(null);
  if (uploads.length === 0) {
    return (
      <EmptyState title="Nothing uploaded yet">
        Every file sent to this cruise is listed here with its status, the casts it made and any errors.
      </EmptyState>
    );
  }
  const failed = uploads.filter((u) => u.status === 'failed').length;
  return (
    <div>
      <p className="border-b border-paper-rule px-4 py-1.5 text-xs text-ink-muted">
        <span className="font-mono tabular-nums">{uploads.length}</span> files ·{' '}
        <span className={`font-mono tabular-nums ${failed > 0 ? 'font-semibold text-warn' : ''}`}>{failed}</span> failed
      </p>
      <div className="max-h-[32rem] overflow-auto">
        <table className="w-full border-collapse text-sm" aria-label="Upload history">
          <thead className="sticky top-0 z-10 bg-paper-raised">
            <tr className="border-b border-paper-rule text-xs uppercase tracking-[0.08em] text-ink-muted">
              <th scope="col" className="px-3 py-1.5 text-left font-semibold">
                File
              </th>
              <th scope="col" className="px-3 py-1.5 text-left font-semibold">
                Received (UTC)
              </th>
              <th scope="col" className="px-3 py-1.5 text-right font-semibold">
                Size
              </th>
              <th scope="col" className="px-3 py-1.5 text-left font-semibold">
                Status
              </th>
              <th scope="col" className="px-3 py-1.5 text-right font-semibold">
                Casts
              </th>
              <th scope="col" className="px-3 py-1.5 text-right font-semibold">
                Errors
              </th>
              <th scope="col" className="px-3 py-1.5">
                <span className="sr-only">Details</span>
              </th>
            </tr>
          </thead>
          <tbody className="font-mono text-[0.8rem] tabular-nums">
            {uploads.map((u) => {
              const isOpen = open === u.id;
              return (
                <Fragment key={u.id}>
                  <tr className={`border-b border-paper-rule/70 ${u.status === 'failed' ? 'bg-warn-wash/25' : ''}`}>
                    <td className="max-w-[22rem] truncate px-3 py-1 text-ink-strong" title={u.filename}>
                      {u.filename}
                    </td>
                    <td className="px-3 py-1">{formatUtc(u.createdAt)}</td>
                    <td className="px-3 py-1 text-right">{formatBytes(u.size)}</td>
                    <td className="px-3 py-1 font-sans">
                      <StatusBadge status={u.status} />
                    </td>
                    <td className="px-3 py-1 text-right">{u.castIds.length}</td>
                    <td
                      className={`px-3 py-1 text-right ${u.errors.length > 0 ? 'font-semibold text-warn' : 'text-ink-faint'}`}
                    >
                      {u.errors.length}
                    </td>
                    <td className="px-3 py-1 text-right font-sans">
                      <button
                        type="button"
                        aria-expanded={isOpen}
                        aria-label={`${isOpen ? 'Hide' : 'Show'} details of ${u.filename}`}
                        onClick={() => setOpen(isOpen ? null : u.id)}
                        className="rounded px-1.5 text-xs text-ink underline decoration-ink/30 hover:decoration-ink"
                      >
                        {isOpen ? 'Hide' : 'Details'}
                      </button>
                    </td>
                  </tr>
                  {isOpen && (
                    <tr className="border-b border-paper-rule bg-paper">
                      <td colSpan={7} className="px-4 py-3 font-sans">
                        <UploadFollow cruiseId={cruiseId} upload={u} canUpload={canUpload} />
                      </td>
                    </tr>
                  )}
                </Fragment>
              );
            })}
          </tbody>
        </table>
      </div>
    </div>
  );
}
