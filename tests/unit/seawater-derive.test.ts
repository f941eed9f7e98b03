/**
 * deriveCast: every derived column of a cast, checked against the reference library on the
 * first TEOS-10 check cast. source: TEOS-10 GSW check values v3.0, gsw_cv_v3_0.npz in Debian
 * python3-gsw 3.6.16 (fixture fixtures/reference/gsw_cv_v3_0.json), at the file's tolerances.
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';

import * as derive from '../../shared/seawater/derive';

const cv = (
  JSON.parse(readFileSync(new URL('../../fixtures/reference/gsw_cv_v3_0.json', import.meta.url), 'utf8')) as {
    values: Record<string, unknown>;
  }
).values;
const col = (k: string, c = 0) => (cv[k] as (number | null)[][]).map((r) => r[c] ?? NaN);
const num = (k: string) => cv[k] as number;

describe('deriveCast', () => {
  const SP = col('SP_chck_cast'),
    t = col('t_chck_cast'),
    p = col('p_chck_cast');
  const lat = (cv.lat_chck_cast as number[])[0],
    lon = (cv.long_chck_cast as number[])[0];
  it('from SP: SA, CT, pt0, σ0…σ4, rho, spiciness0, N², depth at the check-value tolerances', () => {
    const r = derive.deriveCast({ SP, t, p, lon, lat });
    const worst = (ours: Float64Array, key: string) => Math.max(...col(key).map((e, i) => Math.abs(ours[i] - e)));
    expect(worst(r.SA, 'SA_from_SP')).toBeLessThan(num('SA_from_SP_ca'));
    expect(worst(r.CT, 'CT_from_t')).toBeLessThan(num('CT_from_t_ca'));
    expect(worst(r.pt0, 'pt0_from_t')).toBeLessThan(num('pt0_from_t_ca'));
    for (const k of [0, 1, 2, 3, 4] as const)
      expect(worst(r[`sigma${k}`], `sigma${k}`)).toBeLessThan(num(`sigma${k}_ca`));
    expect(worst(r.rho, 'rho')).toBeLessThan(num('rho_ca'));
    expect(worst(r.spiciness0, 'spiciness0')).toBeLessThan(num('spiciness0_ca'));
    expect(Math.max(...Array.from(r.N2).map((v, i) => Math.abs(v - col('n2')[i])))).toBeLessThan(num('n2_ca'));
    expect(Math.max(...Array.from(r.depth).map((d, i) => Math.abs(-d - col('z_from_p')[i])))).toBeLessThan(
      num('z_from_p_ca'),
    );
    expect(r.notes.filter((n) => n.kind === 'out_of_range')).toEqual([]);
  });
  it("from conductivity (mS/cm and S/m) gives the same SP to the file's SP_from_C tolerance", () => {
    const C = col('C_from_SP');
    const a = derive.deriveCast({ C, t, p, lon, lat });
    const b = derive.deriveCast({ C: C.map((c) => c / 10), conductivityUnit: 'S/m', t, p, lon, lat });
    SP.forEach((e, i) => {
      expect(Math.abs(a.SP[i] - e)).toBeLessThan(num('SP_from_C_ca'));
      expect(Math.abs(b.SP[i] - e)).toBeLessThan(num('SP_from_C_ca'));
    });
  });
  it('out-of-range levels come back NaN with a reason in the notes', () => {
    const tBad = t.slice();
    tBad[3] = 55;
    const r = derive.deriveCast({ SP, t: tBad, p, lon, lat });
    expect(r.CT[3]).toBeNaN();
    expect(r.sigma0[3]).toBeNaN();
    const note = r.notes.find((n) => n.kind === 'out_of_range');
    expect(note?.first).toBe(3);
    expect(note?.message).toMatch(/t = 55/);
  });
  it('a position outside the atlas falls back to SA = SR and says so', () => {
    const r = derive.deriveCast({ SP: SP.slice(0, 5), t: t.slice(0, 5), p: p.slice(0, 5), lon: 20, lat: 10 }); // Sahara: no atlas value
    expect(r.notes.some((n) => n.kind === 'sr_fallback')).toBe(true);
    expect(r.SA[0]).toBeCloseTo(SP[0] * (35.16504 / 35), 12);
  });
  it('rejects a cast with neither SP nor C', () => {
    expect(() => derive.deriveCast({ t, p, lon, lat } as never)).toThrow(/SP or C/);
  });
});
