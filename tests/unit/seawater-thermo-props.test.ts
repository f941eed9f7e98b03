// Properties of the temperature conversions that hold by construction of TEOS-10 (IOC et al.
// 2010): each inverse undoes its function, and potential temperature is path independent.
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { CT_from_pt, CT_from_t, pt0_from_t, pt_from_CT, pt_from_t, t_from_CT } from '../../shared/seawater/conversions';
import { C_from_SP, SP_from_C } from '../../shared/seawater/pss78';

const SA = fc.double({ min: 0, max: 42, noNaN: true });
const t = fc.double({ min: -2, max: 35, noNaN: true });
const p = fc.double({ min: 0, max: 6500, noNaN: true });

describe('round trips of the TEOS-10 temperature conversions', () => {
  it('t_from_CT(SA, CT_from_t(SA, t, p), p) returns t within 1e-10 °C', () => {
    fc.assert(
      fc.property(SA, t, p, (s, tt, pp) => {
        expect(Math.abs(t_from_CT(s, CT_from_t(s, tt, pp), pp) - tt)).toBeLessThanOrEqual(1e-10);
      }),
      { numRuns: 2000 },
    );
  });
  it('pt_from_CT undoes CT_from_pt within 1e-10 °C', () => {
    fc.assert(
      fc.property(SA, t, (s, pt) => {
        expect(Math.abs(pt_from_CT(s, CT_from_pt(s, pt)) - pt)).toBeLessThanOrEqual(1e-10);
      }),
      { numRuns: 2000 },
    );
  });
  it('potential temperature is path independent: p → p_mid → 0 equals p → 0', () => {
    fc.assert(
      fc.property(SA, t, p, fc.double({ min: 0, max: 1, noNaN: true }), (s, tt, pp, f) => {
        const mid = pt_from_t(s, tt, pp, f * pp);
        expect(Math.abs(pt_from_t(s, mid, f * pp, 0) - pt0_from_t(s, tt, pp))).toBeLessThanOrEqual(1e-10);
      }),
      { numRuns: 1000 },
    );
  });
});

describe('round trip of PSS-78', () => {
  it('SP_from_C(C_from_SP(SP, t, p), t, p) returns SP within 1e-10, Hill range included', () => {
    fc.assert(
      fc.property(fc.double({ min: 0.005, max: 42, noNaN: true }), t, p, (sp, tt, pp) => {
        expect(Math.abs(SP_from_C(C_from_SP(sp, tt, pp), tt, pp) - sp)).toBeLessThanOrEqual(1e-10);
      }),
      { numRuns: 1000 },
    );
  });
});
