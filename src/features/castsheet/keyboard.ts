import { useEffect, useRef } from 'react';

/** Is the key meant for a field being typed in? */
export const typingInField = (el: EventTarget | null) =>
  el instanceof HTMLElement && (el.isContentEditable || ['INPUT', 'SELECT', 'TEXTAREA'].includes(el.tagName));

export interface QcKeyHandlers {
  nextProposal: () => void;
  previousProposal: () => void;
  /** J / K: next and previous proposal whatever its status (to reach a decided one) */
  nextAnyProposal?: () => void;
  previousAnyProposal?: () => void;
  accept?: () => void;
  reject?: () => void;
  /** reopen the current rejected proposal, or undo the current accepted one's flag */
  reopen?: () => void;
  nextPendingCast?: () => void;
  previousPendingCast?: () => void;
}

/**
 * The QC desk's keys (not while typing in a field, not with a modifier): j / k next and previous proposal,
 * a / r accept and reject the current one, u reopen it (a rejected one; an accepted one is undone through its
 * flag-log entry), { and } the previous and next cast with pending proposals.
 * ([ and ] step casts in CastStepper.)
 */
export function useQcKeys(handlers: QcKeyHandlers) {
  const ref = useRef(handlers);
  useEffect(() => {
    ref.current = handlers;
  });
  useEffect(() => {
    const onKey = (e: KeyboardEvent) => {
      if (e.altKey || e.ctrlKey || e.metaKey || typingInField(e.target)) return;
      const h = ref.current;
      const action = {
        j: h.nextProposal,
        k: h.previousProposal,
        J: h.nextAnyProposal,
        K: h.previousAnyProposal,
        a: h.accept,
        r: h.reject,
        u: h.reopen,
        '}': h.nextPendingCast,
        '{': h.previousPendingCast,
      }[e.key];
      if (!action) return;
      e.preventDefault();
      action();
    };
    window.addEventListener('keydown', onKey);
    return () => window.removeEventListener('keydown', onKey);
  }, []);
}
