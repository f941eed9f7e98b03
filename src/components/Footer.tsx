export const CAUTION =
  "Provisional research data — not for navigation or safety-of-life use. Follow the ship's and your institution's operating rules.";

/** The caution that stands at the foot of every page. */
export function Footer() {
  return (
    <footer className="mt-auto border-t border-paper-rule bg-paper">
      <div className="mx-auto flex max-w-[1840px] flex-wrap items-center justify-between gap-2 px-6 py-3 text-xs text-ink-muted">
        <p role="note" aria-label="Caution">
          <span className="mr-1.5 font-semibold uppercase tracking-[0.1em] text-ink-soft">Caution</span>
          {CAUTION}
        </p>
        <p className="font-mono">Sigmaline · TEOS-10</p>
      </div>
    </footer>
  );
}
