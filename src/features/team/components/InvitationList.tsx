import { EmptyState } from '../../../components/Panel';
import { formatUtc } from '../../../lib/format';
import { roleLabel } from '../../auth';
import type { Invitation } from '../types';

function statusOf(inv: Invitation, now: number): 'accepted' | 'expired' | 'pending' {
  if (inv.acceptedAt) return 'accepted';
  if (inv.expiresAt && Date.parse(inv.expiresAt) < now) return 'expired';
  return 'pending';
}

/** Invitations sent for this cruise, pending ones first. */
export function InvitationList({ invitations }: { invitations: readonly Invitation[] }) {
  const now = Date.now();
  const rows = invitations
    .map((inv) => ({ inv, status: statusOf(inv, now) }))
    .sort(
      (a, b) =>
        (a.status === 'pending' ? 0 : 1) - (b.status === 'pending' ? 0 : 1) ||
        b.inv.createdAt.localeCompare(a.inv.createdAt),
    );
  const pending = rows.filter((r) => r.status === 'pending').length;

  if (rows.length === 0) return <EmptyState title="No invitations sent yet" />;

  return (
    <table className="w-full border-collapse text-sm" aria-label="Invitations">
      <caption className="px-4 py-2 text-left text-xs text-ink-muted">
        <span className="font-mono tabular-nums">{pending}</span> pending
      </caption>
      <thead>
        <tr className="border-b border-paper-rule text-left text-xs uppercase tracking-[0.08em] text-ink-muted">
          <th scope="col" className="px-4 py-1.5 font-semibold">
            E-mail
          </th>
          <th scope="col" className="px-4 py-1.5 font-semibold">
            Role
          </th>
          <th scope="col" className="px-4 py-1.5 font-semibold">
            Sent
          </th>
          <th scope="col" className="px-4 py-1.5 font-semibold">
            Status
          </th>
        </tr>
      </thead>
      <tbody>
        {rows.map(({ inv, status }) => (
          <tr key={inv.id} className="border-b border-paper-rule/70 last:border-0">
            <td className="px-4 py-1.5 font-mono text-[0.8rem] text-ink-strong">{inv.email}</td>
            <td className="px-4 py-1.5">{roleLabel(inv.role)}</td>
            <td className="px-4 py-1.5 whitespace-nowrap font-mono text-[0.8rem] tabular-nums text-ink-soft">
              {formatUtc(inv.createdAt)}
            </td>
            <td className="px-4 py-1.5">
              {status === 'pending' && (
                <span className="text-ink">
                  Pending
                  {inv.expiresAt && (
                    <span className="text-ink-muted">
                      {' '}
                      · until{' '}
                      <span className="whitespace-nowrap font-mono text-[0.8rem]">
                        {formatUtc(inv.expiresAt).slice(0, 10)}
                      </span>
                    </span>
                  )}
                </span>
              )}
              {status === 'accepted' && <span className="text-ink-muted">Accepted</span>}
              {status === 'expired' && (
                <span className="text-ink-muted line-through decoration-ink-faint">Expired</span>
              )}
            </td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}
