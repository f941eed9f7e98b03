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
  /** the entry in words, written by the server (shared/api/audit.ts) */
  sentence: z.string(),
  before: z.unknown(),
  after: z.unknown(),
});
export type AuditEntry = z.infer<typeof auditEntrySchema>;

/** Who changed what on the cruise, newest first, each entry as a sentence. */
export function useAuditTrail(cruiseId: string) {
  return useQuery({
    queryKey: cruiseKeys.audit(cruiseId),
    queryFn: () => http(`/api/cruises/${encodeURIComponent(cruiseId)}/audit`, { schema: z.array(auditEntrySchema) }),
  });
}

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
              What happened
            </th>
          </tr>
        </thead>
        <tbody>
          {rows.map((e) => (
            <tr key={e.id} className="border-b border-paper-rule/60 align-top last:border-0">
              <td className="whitespace-nowrap px-3 py-1">
                <Num>{e.at.slice(0, 16).replace('T', ' ')}Z</Num>
              </td>
              <td className="px-3 py-1">{e.sentence}</td>
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
