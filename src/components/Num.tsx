import type { ReactNode } from 'react';

/** A number, in the monospaced face with tabular figures, so columns of values line up. */
export function Num({ children, className = '' }: { children: ReactNode; className?: string }) {
  return <span className={`font-mono text-[0.85em] tabular-nums ${className}`}>{children}</span>;
}
