import { useState } from 'react';
import { Button } from '../../../components/Button';
import { ErrorNotice } from '../../../components/Notice';
import { EmptyState } from '../../../components/Panel';
import { ROLE_ORDER, roleLabel, roleSchema } from '../../auth';
import { useChangeRole, useRemoveMember } from '../api';
import type { Member } from '../types';

/**
 * The cruise's members. A chief scientist sees a role picker and a remove action on every row
 * but their own (handing over the cruise is done by promoting someone else first).
 */
export function MemberList({
  cruiseId,
  members,
  canManage,
  currentUserId,
}: {
  cruiseId: string;
  members: readonly Member[];
  canManage: boolean;
  currentUserId: string | undefined;
}) {
  const changeRole = useChangeRole(cruiseId);
  const remove = useRemoveMember(cruiseId);
  const [confirming, setConfirming] = useState<string | null>(null);

  if (members.length === 0) return <EmptyState title="No members" />;

  const sorted = [...members].sort(
    (a, b) => ROLE_ORDER.indexOf(a.role) - ROLE_ORDER.indexOf(b.role) || a.name.localeCompare(b.name),
  );

  return (
    <div>
      <table className="w-full border-collapse text-sm" aria-label="Members">
        <thead>
          <tr className="border-b border-paper-rule text-left text-xs uppercase tracking-[0.08em] text-ink-muted">
            <th scope="col" className="px-4 py-1.5 font-semibold">
              Name
            </th>
            <th scope="col" className="px-4 py-1.5 font-semibold">
              E-mail
            </th>
            <th scope="col" className="px-4 py-1.5 font-semibold">
              Role
            </th>
            {canManage && (
              <th scope="col" className="px-4 py-1.5 text-right font-semibold">
                <span className="sr-only">Actions</span>
              </th>
            )}
          </tr>
        </thead>
        <tbody>
          {sorted.map((m) => {
            const self = m.userId === currentUserId;
            return (
              <tr key={m.userId} className="border-b border-paper-rule/70 last:border-0">
                <td className="px-4 py-2 font-semibold text-ink-strong">
                  {m.name}
                  {self && <span className="ml-2 text-xs font-normal text-ink-muted">(you)</span>}
                </td>
                <td className="px-4 py-2 font-mono text-[0.8rem] text-ink-soft">{m.email}</td>
                <td className="px-4 py-2">
                  {canManage && !self ? (
                    <select
                      aria-label={`Role of ${m.name}`}
                      value={m.role}
                      disabled={changeRole.isPending}
                      onChange={(e) => {
                        const role = roleSchema.parse(e.target.value);
                        changeRole.mutate({ userId: m.userId, role });
                      }}
                      className="h-8 rounded border border-paper-rule bg-paper-raised px-2 text-sm text-ink-strong focus:outline-2 focus:outline-ink/70"
                    >
                      {ROLE_ORDER.map((r) => (
                        <option key={r} value={r}>
                          {roleLabel(r)}
                        </option>
                      ))}
                    </select>
                  ) : (
                    <span className="text-ink">{roleLabel(m.role)}</span>
                  )}
                </td>
                {canManage && (
                  <td className="px-4 py-2 text-right">
                    {!self &&
                      (confirming === m.userId ? (
                        <span className="inline-flex items-center gap-2">
                          <span className="text-xs text-ink-soft">Remove {m.name} from the cruise?</span>
                          <Button
                            size="sm"
                            variant="danger"
                            busy={remove.isPending}
                            onClick={() => remove.mutate(m.userId, { onSuccess: () => setConfirming(null) })}
                          >
                            Confirm removal
                          </Button>
                          <Button size="sm" variant="quiet" onClick={() => setConfirming(null)}>
                            Keep
                          </Button>
                        </span>
                      ) : (
                        <Button
                          size="sm"
                          variant="quiet"
                          aria-label={`Remove ${m.name}`}
                          onClick={() => setConfirming(m.userId)}
                        >
                          Remove
                        </Button>
                      ))}
                  </td>
                )}
              </tr>
            );
          })}
        </tbody>
      </table>
      {(changeRole.error || remove.error) && (
        <div className="p-4">
          <ErrorNotice error={changeRole.error ?? remove.error} title="The team was not changed" />
        </div>
      )}
    </div>
  );
}
