import { Button } from '../../../components/Button';
import { ErrorNotice } from '../../../components/Notice';
import type { CastQc, Proposal, QcTestId } from '../types';

const VARIABLE: Record<string, string> = {
  temperature: 'temperature',
  salinity: 'salinity',
  conductivity: 'conductivity',
  oxygen: 'oxygen',
  all: 'all sensors',
};

export interface ProposalListProps {
  qc: CastQc;
  /** the proposal the keyboard is on */
  currentId: string | null;
  mayDecide: boolean;
  busy: boolean;
  error: unknown;
  onPick: (p: Proposal) => void;
  onDecide: (d: { ids?: string[]; test?: QcTestId; decision: 'accept' | 'reject' }) => void;
  /** reopen a rejected proposal, or undo an accepted one's flag (it is pending again) */
  onReopen?: (p: Proposal) => void;
}

/**
 * What the automatic tests propose for this cast, grouped by test, with the test's source. Pending ones can be
 * accepted (the flag is set, and can be undone in the flag log) or rejected, one by one or all of a test. A
 * rejected one can be reopened; an accepted one is undone (its flag-log entry), which makes it pending again.
 */
export function ProposalList({ qc, currentId, mayDecide, busy, error, onPick, onDecide, onReopen }: ProposalListProps) {
  const pending = qc.proposals.filter((p) => p.status === 'pending').length;
  const byTest = qc.tests.map((t) => ({ ...t, items: qc.proposals.filter((p) => p.test === t.id) }));
  return (
    <div>
      <p className="border-b border-paper-rule px-4 py-1.5 text-xs text-ink-muted" data-testid="proposal-summary">
        {qc.proposals.length === 0
          ? 'The automatic tests propose nothing for this cast.'
          : `${pending} pending, ${qc.proposals.length - pending} decided. Proposals are not flags until accepted.`}
      </p>
      <ul className="flex flex-col">
        {byTest.map((t) => {
          const pendingOfTest = t.items.filter((p) => p.status === 'pending');
          return (
            <li key={t.id} className="border-b border-paper-rule/70 last:border-0">
              <div className="flex items-center justify-between gap-2 px-4 py-1">
                <span className="text-sm">
                  <span className="font-semibold text-ink-strong">{t.label}</span>{' '}
                  <span className="text-2xs text-ink-muted">{t.source}</span>
                </span>
                <span className="flex items-center gap-1.5">
                  <span className="font-mono text-xs tabular-nums text-ink-soft">{t.items.length || '—'}</span>
                  {mayDecide && pendingOfTest.length > 1 && (
                    <>
                      <Button
                        size="sm"
                        variant="secondary"
                        disabled={busy}
                        onClick={() => onDecide({ test: t.id, decision: 'accept' })}
                      >
                        Accept all
                      </Button>
                      <Button
                        size="sm"
                        variant="secondary"
                        disabled={busy}
                        onClick={() => onDecide({ test: t.id, decision: 'reject' })}
                      >
                        Reject all
                      </Button>
                    </>
                  )}
                </span>
              </div>
              {t.items.length > 0 && (
                <ul className="pb-1">
                  {t.items.map((p) => (
                    <li
                      key={p.id}
                      data-proposal={p.id}
                      aria-current={p.id === currentId ? 'true' : undefined}
                      className={`mx-2 flex items-center gap-2 rounded px-2 py-0.5 text-xs ${p.id === currentId ? 'bg-ink-wash ring-1 ring-ink/30' : ''}`}
                    >
                      <button
                        type="button"
                        className="min-w-0 flex-1 text-left hover:underline"
                        onClick={() => onPick(p)}
                        title="Fill the flag form with this range"
                      >
                        <span className="font-mono tabular-nums">
                          {p.pFrom}–{p.pTo}
                        </span>{' '}
                        dbar · {VARIABLE[p.variable]} → <span className="font-mono">{p.flag}</span>
                        <span className="block truncate text-ink-muted">{p.detail}</span>
                      </button>
                      {p.status === 'pending' ? (
                        mayDecide && (
                          <span className="flex shrink-0 gap-1">
                            <Button
                              size="sm"
                              variant="primary"
                              disabled={busy}
                              onClick={() => onDecide({ ids: [p.id], decision: 'accept' })}
                              aria-label={`Accept ${t.label} at ${p.pFrom} dbar`}
                            >
                              Accept
                            </Button>
                            <Button
                              size="sm"
                              variant="secondary"
                              disabled={busy}
                              onClick={() => onDecide({ ids: [p.id], decision: 'reject' })}
                              aria-label={`Reject ${t.label} at ${p.pFrom} dbar`}
                            >
                              Reject
                            </Button>
                          </span>
                        )
                      ) : (
                        <span className="flex shrink-0 items-center gap-1.5">
                          <span
                            className={`text-2xs uppercase tracking-[0.08em] ${p.status === 'accepted' ? 'text-ink' : 'text-ink-muted'}`}
                          >
                            {p.status}
                          </span>
                          {mayDecide && onReopen && (p.status === 'rejected' || p.flagChangeId) && (
                            <Button
                              size="sm"
                              variant="secondary"
                              disabled={busy}
                              onClick={() => onReopen(p)}
                              aria-label={`${p.status === 'rejected' ? 'Reopen' : 'Undo'} ${t.label} at ${p.pFrom} dbar`}
                              title={
                                p.status === 'rejected'
                                  ? 'Back to pending (the decision is taken back, audited)'
                                  : `Undo its flag (flag-log entry #${p.flagChangeId}); the proposal is pending again`
                              }
                            >
                              {p.status === 'rejected' ? 'Reopen' : 'Undo'}
                            </Button>
                          )}
                        </span>
                      )}
                    </li>
                  ))}
                </ul>
              )}
            </li>
          );
        })}
      </ul>
      {error != null && <ErrorNotice error={error} title="The decision was not recorded" />}
      <p className="border-t border-paper-rule px-4 py-1.5 text-2xs text-ink-muted" data-testid="qc-keys">
        Keys: <kbd className="font-mono">j</kbd>/<kbd className="font-mono">k</kbd> next / previous pending proposal (
        <kbd className="font-mono">J</kbd>/<kbd className="font-mono">K</kbd> any) ·{' '}
        {mayDecide && (
          <>
            <kbd className="font-mono">a</kbd> accept · <kbd className="font-mono">r</kbd> reject ·{' '}
            <kbd className="font-mono">u</kbd> reopen / undo ·{' '}
          </>
        )}
        <kbd className="font-mono">[</kbd>/<kbd className="font-mono">]</kbd> previous / next cast ·{' '}
        <kbd className="font-mono">{'{'}</kbd>/<kbd className="font-mono">{'}'}</kbd> previous / next cast with pending
        proposals
      </p>
    </div>
  );
}
