/**
 * Binning of a cast to pressure levels (docs/science.md §4): the mean of the samples within bins of a
 * chosen size, with the number of samples kept. Bin k is centred on k·binSize dbar and covers
 * [(k − ½)·binSize, (k + ½)·binSize), the usual layout of a bin-averaged CTD file (2, 4, 6 … dbar
 * for 2-dbar bins); bins run from the one holding pMin (default the shallowest sample, floor 0)
 * to the one holding pMax (default the deepest sample).
 */

export interface PressureBins {
  /** Bin centres, dbar. */
  pressure: Float64Array;
  /** Samples with a finite pressure in each bin. */
  count: Int32Array;
  /** Mean of each property's finite values in each bin (NaN for none). */
  props: Record<string, Float64Array>;
}

export interface BinOptions {
  /** Deepest bin centre wanted, dbar (default the bin of the deepest sample). */
  pMax?: number;
  /** Shallowest bin centre wanted, dbar (default the bin of the shallowest sample, at least 0). */
  pMin?: number;
}

/** Mean of each property within pressure bins of binSize dbar; p dbar, any order. */
export function binToPressure(
  p: Float64Array,
  props: Record<string, Float64Array>,
  binSize: number,
  opts: BinOptions = {},
): PressureBins {
  if (!(binSize > 0) || !Number.isFinite(binSize)) throw new RangeError('binSize must be a positive number of dbar');
  let pLo = Infinity;
  let pHi = -Infinity;
  for (let i = 0; i < p.length; i++) {
    const v = p[i];
    if (v < pLo) pLo = v;
    if (v > pHi) pHi = v;
  }
  const kFirst =
    opts.pMin !== undefined
      ? Math.round(opts.pMin / binSize)
      : Number.isFinite(pLo)
        ? Math.max(0, Math.floor(pLo / binSize + 0.5))
        : 0;
  const kLast =
    opts.pMax !== undefined
      ? Math.round(opts.pMax / binSize)
      : Number.isFinite(pHi)
        ? Math.floor(pHi / binSize + 0.5)
        : kFirst - 1;
  const nb = Math.max(0, kLast - kFirst + 1);
  const pressure = new Float64Array(nb);
  for (let b = 0; b < nb; b++) pressure[b] = (kFirst + b) * binSize;
  const count = new Int32Array(nb);
  const bin = new Int32Array(p.length);
  for (let i = 0; i < p.length; i++) {
    const v = p[i];
    const b = v === v ? Math.floor(v / binSize + 0.5) - kFirst : -1;
    bin[i] = b >= 0 && b < nb ? b : -1;
    if (bin[i] >= 0) count[bin[i]]++;
  }
  const out: Record<string, Float64Array> = {};
  const n = new Int32Array(nb);
  for (const name of Object.keys(props)) {
    const col = props[name];
    const sum = new Float64Array(nb);
    n.fill(0);
    for (let i = 0; i < p.length; i++) {
      const b = bin[i];
      const v = col[i];
      if (b >= 0 && v === v) {
        sum[b] += v;
        n[b]++;
      }
    }
    for (let b = 0; b < nb; b++) sum[b] = n[b] > 0 ? sum[b] / n[b] : NaN;
    out[name] = sum;
  }
  return { pressure, count, props: out };
}
