import { useState } from 'react';
import { z } from 'zod';
import { useQuery } from '@tanstack/react-query';
import { http } from '../../../lib/http';
import { cruiseKeys } from '../keys';
import { Num } from '../../../components/Num';

const auditEntrySchema = z.object({
  id: z.union([z.string(), z.number()]).transform(String),
  at: z.string(),
  actor: z.object({ id: z.string(), name: z.string() }).nullable(),
  action: z.string(),
  entity: z.string(),
  entityId: z.string().nullable(),
  before: z.unknown(),
  after: z.unknown(),
});
export type AuditEntry = z.infer<typeof auditEntrySchema>;

/** Who changed what on the cruise, newest first, with the value before and after. */
export function useAuditTrail(cruiseId: string) {
  return useQuery({
    queryKey: cruiseKeys.audit(cruiseId),
    queryFn: () => http(`/api/cruises/${encodeURIComponent(cruiseId)}/audit`, { schema: z.array(auditEntrySchema) }),
  });
}

const WORDS: Record<string, string> = {
  create: 'created',
  update: 'edited',
  lock: 'locked',
  unlock: 'unlocked',
  invite: 'invited',
  accept_invitation: 'joined',
  change_role: 'changed the role of',
  remove_member: 'removed',
  upload: 'uploaded',
  ingest: 'processed',
  reprocess: 'reprocessed',
  reprocess_requested: 'asked to reprocess',
  retry: 'retried',
  set_flag: 'set quality flags on',
  column_mapping: 'mapped columns of',
  release: 'released',
  delete: 'deleted',
};
const brief = (v: unknown) => (v === null || v === undefined ? '—' : JSON.stringify(v).slice(0, 160));

export function AuditTrail({ cruiseId }: { cruiseId: string }) {
  const trail = useAuditTrail(cruiseId);
  const [all, setAll] = useState(false);
  if (trail.isPending) return <p className="px-4 py-3 text-sm text-ink-muted">Loading the trail…</p>;
  if (trail.isError) return <p className="px-4 py-3 text-sm text-warn-strong">The audit trail could not be loaded.</p>;
  const rows = all ? trail.data : trail.data.slice(0, 12);
  return (
    <div>
      <table className="w-full border-collapse text-sm" aria-label="Audit trail">
        <thead>
          <tr className="border-b border-paper-rule text-2xs uppercase tracking-[0.08em] text-ink-muted">
            <th scope="col" className="px-3 py-1.5 text-left font-semibold">
              When (UTC)
            </th>
            <th scope="col" className="px-3 py-1.5 text-left font-semibold">
              Who
            </th>
            <th scope="col" className="px-3 py-1.5 text-left font-semibold">
              What
            </th>
            <th scope="col" className="px-3 py-1.5 text-left font-semibold">
              Before
            </th>
            <th scope="col" className="px-3 py-1.5 text-left font-semibold">
              After
            </th>
          </tr>
        </thead>
        <tbody>
          {rows.map((e) => (
            <tr key={e.id} className="border-b border-paper-rule/60 align-top last:border-0">
              <td className="whitespace-nowrap px-3 py-1">
                <Num>{e.at.slice(0, 16).replace('T', ' ')}Z</Num>
              </td>
              <td className="px-3 py-1">{e.actor?.name ?? 'system'}</td>
              <td className="px-3 py-1">
                {WORDS[e.action] ?? e.action} {e.entity.replace('_', ' ')}
              </td>
              <td
                className="max-w-[22rem] truncate px-3 py-1 font-mono text-2xs text-ink-muted"
                title={brief(e.before)}
              >
                {brief(e.before)}
              </td>
              <td className="max-w-[22rem] truncate px-3 py-1 font-mono text-2xs text-ink-soft" title={brief(e.after)}>
                {brief(e.after)}
              </td>
            </tr>
          ))}
        </tbody>
      </table>
      {trail.data.length > 12 && (
        <button
          type="button"
          className="px-3 py-2 text-xs text-ink-soft underline decoration-dotted"
          onClick={() => setAll((v) => !v)}
        >
          {all ? 'Show the latest only' : `Show all ${trail.data.length} entries`}
        </button>
      )}
    </div>
  );
}
