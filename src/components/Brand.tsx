/** The Sigmaline mark: three stacked isopycnals. */
export function Brand({ size = 22 }: { size?: number }) {
  return (
    <span className="inline-flex items-center gap-2 text-ink-strong">
      <svg width={size} height={size} viewBox="0 0 32 32" aria-hidden="true">
        <rect x="0.5" y="0.5" width="31" height="31" rx="3" className="fill-paper-raised stroke-ink/40" />
        <path
          d="M4 10 C10 6 14 14 20 10 S28 8 28 8 M4 17 C10 13 14 21 20 17 S28 15 28 15 M4 24 C10 20 14 28 20 24 S28 22 28 22"
          fill="none"
          className="stroke-ink"
          strokeWidth="2"
        />
      </svg>
      <span className="text-[1.05rem] font-semibold tracking-[0.02em]">Sigmaline</span>
    </span>
  );
}
