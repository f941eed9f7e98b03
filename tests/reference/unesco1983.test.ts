// Check values of UNESCO (1983), "Algorithms for computation of fundamental properties of
// seawater", Unesco Technical Papers in Marine Science 44 (Fofonoff & Millard), for PSS-78 and
// EOS-80. The report was not at hand while this was written: every value below is quoted
// from memory and marked so. The PSS-78 ones are confirmed against the reference library
// (python3-gsw 3.6.16, Debian) in the same test; the library has no EOS-80, so the EOS-80 ones
// rest on the report alone, and on their agreeing with our implementation to the last digit
// printed (which a wrong recollection would hardly do across eleven values).
import { execFileSync } from 'node:child_process';
import { GSW_PYTHON } from './python';
import { describe, expect, it } from 'vitest';
import { C3515, SP_from_C, t90_from_t68 } from '../../shared/seawater/pss78';
import {
  adiabatic_lapse_rate_eos80,
  pt_eos80_t68,
  rho_eos80_t68,
  secant_bulk_modulus_eos80,
} from '../../shared/seawater/eos80';

/** Digits of a printed check value: agree to half a unit in its last place. */
const halfUlp = (printed: string) => 0.5 * 10 ** -(printed.split('.')[1] ?? '').length;

describe('PSS-78 (source: UNESCO 1983 Tech. Pap. Mar. Sci. 44, from memory, confirmed against python3-gsw)', () => {
  // [conductivity ratio R = C/C(35,15,0), t68 °C, p dbar, SP as printed]
  const cases: [number, number, number, string][] = [
    [1, 15, 0, '35.0000'], // the definition of the scale
    [1.888091, 40, 10000, '40.0000'], // UNESCO 1983 check value (from memory)
  ];
  const gsw = JSON.parse(
    execFileSync(
      GSW_PYTHON,
      [
        '-c',
        `
import json, sys, gsw
cases = json.load(sys.stdin)
print(json.dumps([float(gsw.SP_from_C(R * ${C3515}, t68 / 1.00024, p)) for R, t68, p in cases]))
`,
      ],
      { input: JSON.stringify(cases.map(([R, t68, p]) => [R, t68, p])), encoding: 'utf8' },
    ),
  ) as number[];

  it.each(cases.map((c, i) => [...c, i] as const))(
    'R = %s, t68 = %s °C, p = %s dbar gives SP = %s',
    (R, t68, p, printed, i) => {
      const sp = SP_from_C(R * C3515, t90_from_t68(t68), p);
      expect(Math.abs(sp - Number(printed))).toBeLessThanOrEqual(halfUlp(printed));
      // Confirmation by the reference library (python3-gsw 3.6.16).
      expect(Math.abs(sp - gsw[i])).toBeLessThan(1e-9);
    },
  );
});

describe('EOS-80 (source: UNESCO 1983 Tech. Pap. Mar. Sci. 44, from memory; no library to confirm)', () => {
  // In-situ density, kg/m³: [SP, t68 °C, p dbar, ρ as printed]
  const densities: [number, number, number, string][] = [
    [0, 5, 0, '999.96675'],
    [0, 5, 10000, '1044.12802'],
    [0, 25, 0, '997.04796'],
    [0, 25, 10000, '1037.90204'],
    [35, 5, 0, '1027.67547'],
    [35, 5, 10000, '1069.48914'],
    [35, 25, 0, '1023.34306'],
    [35, 25, 10000, '1062.53817'],
  ];
  it.each(densities)('ρ(%s, %s °C, %s dbar) = %s kg/m³', (S, t68, p, printed) => {
    expect(Math.abs(rho_eos80_t68(S, t68, p) - Number(printed))).toBeLessThanOrEqual(halfUlp(printed));
  });

  // Secant bulk modulus, bar: [SP, t68 °C, p dbar, K as printed]
  const moduli: [number, number, number, string][] = [
    [0, 5, 0, '20337.80375'],
    [35, 5, 0, '22185.93358'],
    [35, 25, 10000, '27108.94504'],
  ];
  it.each(moduli)('K(%s, %s °C, %s dbar) = %s bar', (S, t68, p, printed) => {
    expect(Math.abs(secant_bulk_modulus_eos80(S, t68, p) - Number(printed))).toBeLessThanOrEqual(halfUlp(printed));
  });

  it('adiabatic lapse rate Γ(40, 40 °C, 10000 dbar) = 3.255976e-4 °C/dbar', () => {
    expect(Math.abs(adiabatic_lapse_rate_eos80(40, 40, 10000) - 3.255976e-4)).toBeLessThanOrEqual(0.5e-10);
  });

  it('potential temperature θ(40, 40 °C, 10000 dbar; ref. 0 dbar) = 36.89073 °C', () => {
    expect(Math.abs(pt_eos80_t68(40, 40, 10000, 0) - 36.89073)).toBeLessThanOrEqual(0.5e-5);
  });
});
