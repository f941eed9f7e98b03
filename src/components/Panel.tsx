import type { ReactNode } from 'react';

/** A ruled section of a screen: a small caps title, optional actions, then content. */
export function Panel({
  title,
  actions,
  children,
  className = '',
  bodyClassName = '',
  titleId,
}: {
  title: ReactNode;
  actions?: ReactNode;
  children: ReactNode;
  className?: string;
  bodyClassName?: string;
  titleId?: string;
}) {
  return (
    <section aria-labelledby={titleId} className={`border border-paper-rule bg-paper-raised ${className}`}>
      <header className="flex min-h-10 items-center justify-between gap-3 border-b border-paper-rule px-4 py-1.5">
        <h2 id={titleId} className="text-xs font-semibold uppercase tracking-[0.12em] text-ink-soft">
          {title}
        </h2>
        {actions && <div className="flex items-center gap-2">{actions}</div>}
      </header>
      <div className={bodyClassName}>{children}</div>
    </section>
  );
}

export function PageHeader({
  kicker,
  title,
  meta,
  actions,
}: {
  kicker?: ReactNode;
  title: ReactNode;
  meta?: ReactNode;
  actions?: ReactNode;
}) {
  return (
    <div className="flex flex-wrap items-end justify-between gap-4 border-b border-ink/15 pb-4">
      <div className="min-w-0">
        {kicker && <p className="mb-1 text-xs font-semibold uppercase tracking-[0.14em] text-ink-muted">{kicker}</p>}
        <h1 className="text-[1.7rem] font-semibold leading-tight tracking-[-0.01em] text-ink-strong">{title}</h1>
        {meta && <div className="mt-1.5 text-sm text-ink-soft">{meta}</div>}
      </div>
      {actions && <div className="flex items-center gap-2">{actions}</div>}
    </div>
  );
}

export function EmptyState({ title, children }: { title: string; children?: ReactNode }) {
  return (
    <div className="flex flex-col items-start gap-1 px-4 py-8">
      <p className="font-semibold text-ink">{title}</p>
      {children && <div className="max-w-prose text-sm text-ink-muted">{children}</div>}
    </div>
  );
}
