// Randomised cross-check of the thermodynamic seawater functions against the TEOS-10 reference
// library itself. Source: python3-gsw live reference — Debian package python3-gsw 3.6.16, run
// by /usr/bin/python3 in one batch call on the same points. Targets from docs/science.md §5:
// |ΔSA| ≤ 5·10⁻⁴ g/kg at ocean points, |ΔCT| ≤ 10⁻⁸ °C (and the same for the other
// temperatures), over SP 2–42, t −2–35 °C, p 0–6500 dbar.
import { execFileSync } from 'node:child_process';
import { GSW_PYTHON } from './python';
import { beforeAll, describe, expect, it } from 'vitest';
import {
  CT_from_pt,
  CT_from_t_batch,
  pt0_from_t_batch,
  pt_from_CT_batch,
  pt_from_t_batch,
  t_from_CT_batch,
} from '../../shared/seawater/conversions';
import { C_from_SP, SP_from_C } from '../../shared/seawater/pss78';
import { SA_from_SP_batch } from '../../shared/seawater/saar';
import { randomOceanPoints } from './oceanPoints';

const N = 12_000;

const points = (n: number) => randomOceanPoints(n, 424242);

const PYTHON = `
import json, sys
import numpy as np
import gsw
d = json.load(sys.stdin)
SP, t, p, lon, lat, SPlow = (np.array(d[k], dtype=float) for k in ("SP", "t", "p", "lon", "lat", "SPlow"))
SA = gsw.SA_from_SP(SP, p, lon, lat)
CT = gsw.CT_from_t(SA, t, p)
out = {
    "version": gsw.__version__,
    "SA": SA, "CT": CT,
    "pt0": gsw.pt0_from_t(SA, t, p),
    "pt1000": gsw.pt_from_t(SA, t, p, 1000.0),
    "CT_from_pt": gsw.CT_from_pt(SA, t),
    "pt_from_CT": gsw.pt_from_CT(SA, t),
    "t_from_CT": gsw.t_from_CT(SA, t, p),
    "C": gsw.C_from_SP(SP, t, p),
    "Clow": gsw.C_from_SP(SPlow, t, p),
}
json.dump({k: (v.tolist() if hasattr(v, "tolist") else v) for k, v in out.items()}, sys.stdout)
`;

type Ref = Record<
  'SA' | 'CT' | 'pt0' | 'pt1000' | 'CT_from_pt' | 'pt_from_CT' | 't_from_CT' | 'C' | 'Clow',
  number[]
> & { version: string };

const { SP, t, p, lon, lat } = points(N);
// Fresh and brackish water for the Hill et al. (1986) extension below SP = 2.
const SPlow = SP.map((v) => 0.01 + ((v - 2) / 40) * 1.99);
let ref: Ref;

function maxAbsDiff(ours: ArrayLike<number>, theirs: number[]): number {
  let worst = 0;
  for (let i = 0; i < theirs.length; i++) {
    const d = Math.abs(ours[i] - theirs[i]);
    if (!(d <= worst)) worst = Number.isNaN(d) ? Infinity : d;
  }
  return worst;
}

beforeAll(() => {
  const input = JSON.stringify({ SP: [...SP], t: [...t], p: [...p], lon: [...lon], lat: [...lat], SPlow: [...SPlow] });
  ref = JSON.parse(execFileSync(GSW_PYTHON, ['-c', PYTHON], { input, maxBuffer: 1 << 28, encoding: 'utf8' })) as Ref;
});

describe(`python3-gsw live reference, ${N} random ocean points`, () => {
  it('runs against gsw 3.6.16', () => {
    expect(ref.version).toBe('3.6.16');
  });
  it('SA_from_SP within 5e-4 g/kg at ocean points', () => {
    expect(maxAbsDiff(SA_from_SP_batch(SP, p, lon, lat), ref.SA)).toBeLessThanOrEqual(5e-4);
  });
  it('CT_from_t within 1e-8 °C', () => {
    const SA = Float64Array.from(ref.SA);
    expect(maxAbsDiff(CT_from_t_batch(SA, t, p), ref.CT)).toBeLessThanOrEqual(1e-8);
  });
  it('pt0_from_t and pt_from_t (p_ref 1000 dbar) within 1e-8 °C', () => {
    const SA = Float64Array.from(ref.SA);
    expect(maxAbsDiff(pt0_from_t_batch(SA, t, p), ref.pt0)).toBeLessThanOrEqual(1e-8);
    expect(maxAbsDiff(pt_from_t_batch(SA, t, p, 1000), ref.pt1000)).toBeLessThanOrEqual(1e-8);
  });
  it('CT_from_pt, pt_from_CT and t_from_CT within 1e-8 °C', () => {
    const SA = Float64Array.from(ref.SA);
    expect(
      maxAbsDiff(
        SA.map((s, i) => CT_from_pt(s, t[i])),
        ref.CT_from_pt,
      ),
    ).toBeLessThanOrEqual(1e-8);
    expect(maxAbsDiff(pt_from_CT_batch(SA, t), ref.pt_from_CT)).toBeLessThanOrEqual(1e-8);
    expect(maxAbsDiff(t_from_CT_batch(SA, t, p), ref.t_from_CT)).toBeLessThanOrEqual(1e-8);
  });
  it('SP_from_C and C_from_SP (PSS-78) within 1e-8, Hill extension included', () => {
    expect(
      maxAbsDiff(
        SP.map((_, i) => SP_from_C(ref.C[i], t[i], p[i])),
        [...SP],
      ),
    ).toBeLessThanOrEqual(1e-8);
    expect(
      maxAbsDiff(
        SP.map((v, i) => C_from_SP(v, t[i], p[i])),
        ref.C,
      ),
    ).toBeLessThanOrEqual(1e-8);
    expect(
      maxAbsDiff(
        SPlow.map((_, i) => SP_from_C(ref.Clow[i], t[i], p[i])),
        [...SPlow],
      ),
    ).toBeLessThanOrEqual(1e-8);
  });
});
