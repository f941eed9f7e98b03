// Bounds of the costly numeric parameters, one place for each (docs/security.md). What the science
// needs sets them, so a request can neither ask for a grid of millions of rows nor for nothing.
import { z } from 'zod';

/** Smallest and largest pressure bin, dbar. Common practice: CTD data are delivered in 1 or 2 dbar
 * bins; 0.5 dbar leaves room for shallow shelf casts. 500 dbar is a coarse overview of a full-depth
 * section. A 0.5 dbar bin over 11 000 dbar is 22 000 rows a cast: the most a request can cost. */
export const BIN_MIN_DBAR = 0.5;
export const BIN_MAX_DBAR = 500;
const binMessage = `the pressure bin is between ${BIN_MIN_DBAR} and ${BIN_MAX_DBAR} dbar`;

/** A pressure bin from a query string (text), with its default. */
export const binQuery = (defaultDbar: number) =>
  z.coerce.number().min(BIN_MIN_DBAR, binMessage).max(BIN_MAX_DBAR, binMessage).default(defaultDbar);
/** A pressure bin from a JSON body. */
export const binBody = (defaultDbar: number) =>
  z.number().min(BIN_MIN_DBAR, binMessage).max(BIN_MAX_DBAR, binMessage).default(defaultDbar);
