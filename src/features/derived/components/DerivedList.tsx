import { useState } from 'react';
import { Button } from '../../../components/Button';
import { ErrorNotice } from '../../../components/Notice';
import { EmptyState } from '../../../components/Panel';
import { useDeleteDerivedVariable } from '../api';
import type { DerivedVariable } from '../types';

/** The cruise's derived variables; editors can delete one (asked twice). */
export function DerivedList({
  cruiseId,
  variables,
  mayEdit,
}: {
  cruiseId: string;
  variables: readonly DerivedVariable[];
  mayEdit: boolean;
}) {
  const [confirming, setConfirming] = useState<string | null>(null);
  const remove = useDeleteDerivedVariable(cruiseId);
  if (variables.length === 0) {
    return (
      <EmptyState title="No derived variables yet">
        A derived variable is a formula over a cast’s columns (say <span className="font-mono">sigma2 - sigma0</span>),
        computed for every cast and offered as a property in the section.
      </EmptyState>
    );
  }
  return (
    <div>
      {remove.isError && (
        <div className="p-3">
          <ErrorNotice error={remove.error} title="The variable was not deleted" />
        </div>
      )}
      <table className="w-full border-collapse text-sm" aria-label="Derived variables">
        <thead>
          <tr className="border-b border-paper-rule text-xs uppercase tracking-[0.08em] text-ink-muted">
            <th scope="col" className="px-4 py-1.5 text-left font-semibold">
              Name
            </th>
            <th scope="col" className="px-3 py-1.5 text-left font-semibold">
              Formula
            </th>
            <th scope="col" className="px-3 py-1.5 text-left font-semibold">
              Unit
            </th>
            <th scope="col" className="px-3 py-1.5 text-left font-semibold">
              Description
            </th>
            {mayEdit && (
              <th scope="col" className="px-3 py-1.5">
                <span className="sr-only">Delete</span>
              </th>
            )}
          </tr>
        </thead>
        <tbody>
          {variables.map((v) => (
            <tr key={v.id} className="border-b border-paper-rule/70 last:border-0">
              <td className="px-4 py-1.5 font-mono text-[0.8rem] font-semibold text-ink-strong">{v.name}</td>
              <td className="px-3 py-1.5 font-mono text-[0.8rem] text-ink-soft">{v.formula}</td>
              <td className="px-3 py-1.5 font-mono text-[0.8rem]">{v.unit ?? '—'}</td>
              <td className="px-3 py-1.5 text-ink-soft">{v.description ?? ''}</td>
              {mayEdit && (
                <td className="px-3 py-1.5 text-right whitespace-nowrap">
                  {confirming === v.id ? (
                    <span className="inline-flex gap-1">
                      <Button
                        size="sm"
                        variant="danger"
                        busy={remove.isPending}
                        onClick={() => remove.mutate(v.id, { onSettled: () => setConfirming(null) })}
                      >
                        Delete {v.name}
                      </Button>
                      <Button size="sm" variant="quiet" onClick={() => setConfirming(null)}>
                        Keep
                      </Button>
                    </span>
                  ) : (
                    <Button
                      size="sm"
                      variant="quiet"
                      onClick={() => setConfirming(v.id)}
                      aria-label={`Delete derived variable ${v.name}`}
                    >
                      Delete
                    </Button>
                  )}
                </td>
              )}
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
