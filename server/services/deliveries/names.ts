// File names of deliveries and exports: `<cruise>_<line>_<kind>_<ref>.<ext>` in safe characters
// (letters, digits, `-`); the cruise is its expocode where the files carry one, else its name. The
// same stem names the tables inside a data package.

/** One safe name part: letters, digits and `-` only; runs of anything else become one `-`. */
export function namePart(s: string, fallback = 'x'): string {
  const t = s
    .normalize('NFKD')
    .replace(/[\u0300-\u036f]/g, '')
    .replace(/[^A-Za-z0-9-]+/g, '-')
    .replace(/-{2,}/g, '-')
    .replace(/^-|-$/g, '');
  return (t || fallback).slice(0, 60);
}

export type StemKind = 'isopycnal' | 'pressure' | 'package' | 'exchange';

/** The stem of a delivery file: cruise, line, kind and its reference (σ reference, bin size, exchange variant). */
export function deliveryStem(
  cruise: string,
  line: string,
  kind: StemKind,
  ref: { sigmaRef?: number; bin?: number },
): string {
  const r =
    kind === 'pressure'
      ? `${String(ref.bin ?? 2).replace('.', 'p')}dbar`
      : kind === 'exchange'
        ? 'ct1'
        : `sigma${(ref.sigmaRef ?? 0) / 1000}`;
  return [namePart(cruise, 'cruise'), namePart(line, 'line'), kind, r].join('_');
}
