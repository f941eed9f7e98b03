// The quality flags of water-column data: the WOCE CTD flag scale (an open standard of the trade), with
// their meanings in our words. Intake, the cast sheet, the section engine and every delivery read them
// here; NetCDF writes `flag_values` and `flag_meanings` from the same table.

export const WOCE_FLAGS = [1, 2, 3, 4, 5, 6, 7, 8, 9] as const;
export type WoceFlag = (typeof WOCE_FLAGS)[number];

/** Meaning of each flag, as a screen shows it. */
export const FLAG_MEANINGS: Readonly<Record<WoceFlag, string>> = {
  1: 'not calibrated',
  2: 'good',
  3: 'questionable',
  4: 'bad',
  5: 'not reported',
  6: 'interpolated over a gap',
  7: 'despiked',
  8: 'not used for CTD data',
  9: 'missing',
};

/** The same meanings as CF `flag_meanings` words (blank-separated, no spaces inside a word). */
export const FLAG_MEANING_WORDS: Readonly<Record<WoceFlag, string>> = {
  1: 'not_calibrated',
  2: 'good',
  3: 'questionable',
  4: 'bad',
  5: 'not_reported',
  6: 'interpolated_over_gap',
  7: 'despiked',
  8: 'not_used',
  9: 'missing',
};

/** Flags whose levels sections and regridded tables keep unless the request names others. */
export const INCLUDED_BY_DEFAULT: readonly WoceFlag[] = [1, 2];

export function isWoceFlag(v: unknown): v is WoceFlag {
  return typeof v === 'number' && (WOCE_FLAGS as readonly number[]).includes(v);
}
