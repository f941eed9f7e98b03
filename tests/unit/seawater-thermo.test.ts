// The thermodynamic half of the seawater core against the TEOS-10 check values, and its
// behaviour at the edges (ranges, the Baltic branch, the Reference Salinity fallback).
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { collapse, collapseFromTables } from '../../shared/seawater/gibbs';
import {
  CT_from_pt,
  CT_from_t,
  CT_from_t_batch,
  pt0_from_t,
  pt_from_CT,
  pt_from_t,
  t_from_CT,
} from '../../shared/seawater/conversions';
import { C_from_SP, SP_from_C, SP_from_C_reason, t90_from_t68 } from '../../shared/seawater/pss78';
import {
  SA_from_SP,
  SA_from_SP_batch,
  SA_from_SP_detail,
  SAAR,
  SR_from_SP,
  inBaltic,
} from '../../shared/seawater/saar';
import { sigma_theta_eos80 } from '../../shared/seawater/eos80';
import { checkRange, rangeNotes } from '../../shared/seawater/ranges';
import { sigma0 } from '../../shared/seawater/density';

// Source: TEOS-10 GSW check values v3.0, gsw_cv_v3_0.npz in Debian python3-gsw 3.6.16, turned
// into fixtures/reference/gsw_cv_v3_0.json by scripts/gsw/make_check_values.py.
type Grid = (number | null)[][];
const cv = JSON.parse(readFileSync(new URL('../../fixtures/reference/gsw_cv_v3_0.json', import.meta.url), 'utf8'))
  .values as Record<string, unknown>;
const grid = (key: string) => cv[key] as Grid;
const num = (key: string) => {
  const v = cv[key];
  return (Array.isArray(v) ? v.flat(3)[0] : v) as number;
};
const lon = cv.long_chck_cast as number[];
const lat = cv.lat_chck_cast as number[];

/** Compare f(level, cast) with the check value at every level the file has, at its own tolerance. */
function checkCast(key: string, f: (i: number, c: number) => number) {
  const expected = grid(key);
  const tol = num(`${key}_ca`);
  let compared = 0;
  let worst = 0;
  for (let i = 0; i < expected.length; i++) {
    for (let c = 0; c < expected[i].length; c++) {
      const e = expected[i][c];
      if (e === null) continue;
      const got = f(i, c);
      worst = Math.max(worst, Math.abs(got - e));
      compared++;
    }
  }
  expect(compared).toBeGreaterThan(60);
  expect(worst).toBeLessThan(tol);
}

const SP = grid('SP_chck_cast');
const t = grid('t_chck_cast');
const p = grid('p_chck_cast');
const SA = grid('SA_chck_cast');
const CT = grid('CT_chck_cast');
const pr = num('pr');

describe('TEOS-10 check values v3.0 (source: gsw_cv_v3_0.npz, Debian python3-gsw 3.6.16)', () => {
  it('SP_from_C and C_from_SP (PSS-78)', () => {
    const C = grid('C_from_SP');
    checkCast('SP_from_C', (i, c) => SP_from_C(C[i][c]!, t[i][c]!, p[i][c]!));
    checkCast('C_from_SP', (i, c) => C_from_SP(SP[i][c]!, t[i][c]!, p[i][c]!));
  });
  it('SR_from_SP and SA_from_SP (SAAR atlas, with the Baltic cast)', () => {
    checkCast('SR_from_SP', (i, c) => SR_from_SP(SP[i][c]!));
    checkCast('SA_from_SP', (i, c) => SA_from_SP(SP[i][c]!, p[i][c]!, lon[c], lat[c]));
  });
  it('CT_from_t, pt0_from_t, pt_from_t', () => {
    checkCast('CT_from_t', (i, c) => CT_from_t(SA[i][c]!, t[i][c]!, p[i][c]!));
    checkCast('pt0_from_t', (i, c) => pt0_from_t(SA[i][c]!, t[i][c]!, p[i][c]!));
    checkCast('pt_from_t', (i, c) => pt_from_t(SA[i][c]!, t[i][c]!, p[i][c]!, pr));
  });
  it('t_from_CT, pt_from_CT, CT_from_pt', () => {
    checkCast('t_from_CT', (i, c) => t_from_CT(SA[i][c]!, CT[i][c]!, p[i][c]!));
    checkCast('pt_from_CT', (i, c) => pt_from_CT(SA[i][c]!, CT[i][c]!));
    const ptCT = grid('pt_from_CT');
    checkCast('CT_from_pt', (i, c) => CT_from_pt(SA[i][c]!, ptCT[i][c]!));
  });
  it('t90_from_t68', () => {
    checkCast('t90_from_t68', (i, c) => t90_from_t68(t[i][c]!));
  });
});

describe('the Gibbs function in Horner form equals the coefficient tables', () => {
  it('agrees term for term over the oceanographic range', () => {
    const a = new Float64Array(8),
      b = new Float64Array(8);
    for (const SAv of [0, 0.1, 20, 35.16504, 42]) {
      for (const pv of [0, 1000, 6000, 10000]) {
        collapse(SAv, pv, a);
        collapseFromTables(SAv, pv, b);
        for (let j = 0; j < 8; j++)
          expect(Math.abs(a[j] - b[j])).toBeLessThanOrEqual(1e-9 * Math.max(1, Math.abs(b[j])));
      }
    }
  });
});

describe('ranges: NaN with a reason, never a silent number', () => {
  it('gives NaN outside the range and says which input is at fault', () => {
    expect(CT_from_t(35, 45, 100)).toBeNaN();
    expect(checkRange({ SA: 35, t: 45, p: 100 })).toMatch(/^t = 45 °C is outside/);
    expect(CT_from_t(-1, 10, 100)).toBeNaN();
    expect(checkRange({ SA: -1, t: 10, p: 100 })).toMatch(/^SA = -1 g\/kg/);
    expect(t_from_CT(35, 10, 12000)).toBeNaN();
    expect(checkRange({ SA: 35, CT: 10, p: 12000 })).toMatch(/^p = 12000 dbar/);
    expect(CT_from_t(NaN, 10, 100)).toBeNaN();
    expect(checkRange({ SA: NaN, t: 10, p: 100 })).toBe('SA is missing');
    expect(checkRange({ SA: 35, t: 10, p: 100 })).toBeNull();
  });
  it('PSS-78 ends at SP = 42: a higher salinity is NaN with a reason', () => {
    const C = C_from_SP(41.9, 30, 0);
    expect(SP_from_C(C, 30, 0)).toBeCloseTo(41.9, 10);
    expect(SP_from_C(C * 1.05, 30, 0)).toBeNaN();
    expect(SP_from_C_reason(C * 1.05, 30, 0)).toMatch(/SP = 42/);
    expect(SP_from_C_reason(C, 30, 0)).toBeNull();
  });
  it("groups a cast's unusable levels by input for its notes", () => {
    const notes = rangeNotes({ SA: [35, 35, NaN, 35, 35], t: [10, 50, 10, 55, 10], p: [0, 10, 20, 30, 40] });
    expect(notes).toHaveLength(2);
    const tNote = notes.find((n) => n.input === 't')!;
    expect(tNote).toMatchObject({ count: 2, first: 1, last: 3 });
    expect(notes.find((n) => n.input === 'SA')).toMatchObject({ count: 1, first: 2, reason: 'SA is missing' });
  });
  it('batch forms return NaN at bad points and numbers elsewhere', () => {
    const out = CT_from_t_batch(Float64Array.of(35, 35, 35), Float64Array.of(10, 99, 2), Float64Array.of(0, 0, 4000));
    expect(out[0]).toBeCloseTo(CT_from_t(35, 10, 0), 14);
    expect(out[1]).toBeNaN();
    expect(out[2]).toBeCloseTo(CT_from_t(35, 2, 4000), 14);
  });
});

describe('Absolute Salinity: atlas, Baltic branch, fallback', () => {
  it('uses the Baltic formula of Feistel et al. (2010) inside the Baltic', () => {
    // Source: the Baltic formula as the TEOS-10 manual gives it, SA = (SSO − 0.087)/35·SP + 0.087.
    expect(inBaltic(20, 58)).toBe(true);
    expect(inBaltic(5, 58)).toBe(false); // North Sea
    const d = SA_from_SP_detail(7, 50, 20, 58);
    expect(d.source).toBe('baltic');
    expect(d.SA).toBeCloseTo(((35.16504 - 0.087) / 35) * 7 + 0.087, 12);
  });
  it('falls back to SR where the atlas has no value, and says so', () => {
    // A point in the Sahara: no ocean in any corner of its atlas cell.
    const d = SA_from_SP_detail(35, 10, 10, 22);
    expect(d.source).toBe('reference_salinity_fallback');
    expect(d.SA).toBe(SR_from_SP(35));
    expect(d.note).toMatch(/SA = SR/);
    expect(SAAR(10, 10, 22).inAtlas).toBe(false);
  });
  it('gives SA a little above SR in the deep North Pacific (a fact of the trade: δSA up to ~0.025 g/kg)', () => {
    const d = SA_from_SP_detail(34.68, 4000, 200, 30);
    expect(d.source).toBe('atlas');
    const dSA = d.SA - SR_from_SP(34.68);
    expect(dSA).toBeGreaterThan(0.01);
    expect(dSA).toBeLessThan(0.03);
  });
  it('batch SA_from_SP equals the scalar one, at one position or per level', () => {
    const SPc = Float64Array.of(34, 35, 36),
      pc = Float64Array.of(0, 1000, 3000);
    const one = SA_from_SP_batch(SPc, pc, -30, 40);
    const many = SA_from_SP_batch(SPc, pc, Float64Array.of(-30, -30, -30), Float64Array.of(40, 40, 40));
    for (let i = 0; i < 3; i++) {
      expect(one[i]).toBe(SA_from_SP(SPc[i], pc[i], -30, 40));
      expect(many[i]).toBe(one[i]);
    }
  });
});

describe('EOS-80 σθ against TEOS-10 σ0 (common practice: they differ by a few hundredths of kg/m³)', () => {
  it('stays within 0.05 kg/m³ of TEOS-10 σ0 over open-ocean water', () => {
    for (const [SPv, tv, pv] of [
      [35, 15, 0],
      [34.7, 2, 4000],
      [36.5, 25, 100],
      [33, 0, 500],
    ]) {
      const SAv = SA_from_SP(SPv, pv, -30, 30);
      const s80 = sigma_theta_eos80(SPv, tv, pv);
      const s10 = sigma0(SAv, CT_from_t(SAv, tv, pv));
      expect(Math.abs(s80 - s10)).toBeLessThan(0.05);
    }
  });
});
