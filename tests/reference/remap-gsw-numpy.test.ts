/**
 * The isopycnal table of random stable casts against an independent reference computed in this
 * test: python3-gsw 3.6.16 (SA_from_SP, CT_from_t, sigma0, sigma2) and numpy 1.24 numpy.interp
 * (linear interpolation of pressure and properties at each target σ), all in /usr/bin/python3.
 * Ours: σ from the seawater core's sigma_batch on the same SA and CT, then remapToIsopycnals.
 * Criterion (issue 5): python's σ, interpolated at our reported pressure, equals the target within
 * 1e-5 kg/m³; outcrop / below-bottom levels agree with numpy's left/right NaN.
 */
import { describe, expect, it } from 'vitest';
import { execFileSync } from 'node:child_process';
import { GSW_PYTHON } from './python';
import { sigma_batch } from '../../shared/seawater/density';
import { remapToIsopycnals } from '../../shared/remap';

const PY = `
import sys, json, numpy as np, gsw
req = json.load(sys.stdin)
rng = np.random.default_rng(req['seed'])
casts = []
while len(casts) < req['n']:
    pmax = rng.uniform(800, 5500)
    dp = rng.uniform(0.5, 4)
    p = np.arange(rng.uniform(0, 5), pmax, dp)
    lon, lat = rng.uniform(-60, 20), rng.uniform(-50, 50)
    t = rng.uniform(1.5, 3) + rng.uniform(10, 26) * np.exp(-p / rng.uniform(200, 900)) + 0.05 * np.sin(p / rng.uniform(30, 90))
    SP = 34.7 + rng.uniform(-0.8, 1.2) * np.exp(-p / rng.uniform(300, 1500)) + 0.01 * np.sin(p / rng.uniform(40, 80))
    SA = gsw.SA_from_SP(SP, p, lon, lat)
    CT = gsw.CT_from_t(SA, t, p)
    out = {'p': p.tolist(), 'SA': SA.tolist(), 'CT': CT.tolist()}
    ok = True
    for ref, targets in req['targets'].items():
        s = gsw.sigma0(SA, CT) if ref == '0' else gsw.sigma2(SA, CT)
        if not np.all(np.diff(s) > 0):
            ok = False
            break
        tg = np.array(targets)
        out['sigma' + ref] = s.tolist()
        out['p_ref' + ref] = np.interp(tg, s, p, left=np.nan, right=np.nan).tolist()
        out['CT_ref' + ref] = np.interp(tg, s, CT, left=np.nan, right=np.nan).tolist()
    if ok:
        casts.append(out)
print(json.dumps(casts).replace('NaN', 'null'))
`;

const range = (a: number, step: number, n: number) =>
  Array.from({ length: n }, (_, i) => Number((a + i * step).toFixed(4)));
const targets: Record<string, number[]> = { '0': range(23.0, 0.05, 100), '2000': range(33.0, 0.05, 86) };

interface PyCast {
  p: number[];
  SA: number[];
  CT: number[];
  [k: string]: (number | null)[];
}
const casts = JSON.parse(
  execFileSync(GSW_PYTHON, ['-c', PY], {
    input: JSON.stringify({ seed: 20260305, n: 24, targets }),
    maxBuffer: 1 << 28,
  }).toString(),
) as PyCast[];

/** Python's σ column linearly interpolated at pressure q (the test's own evaluation step). */
function pySigmaAt(p: number[], s: number[], q: number): number {
  let k = 0;
  while (k < p.length - 2 && p[k + 1] < q) k++;
  return s[k] + ((q - p[k]) / (p[k + 1] - p[k])) * (s[k + 1] - s[k]);
}

describe('isopycnal table vs python3-gsw + numpy.interp (source: python3-gsw 3.6.16 live reference and numpy.interp)', () => {
  for (const ref of ['0', '2000']) {
    it(`σ referenced to ${ref} dbar: 24 random stable casts`, () => {
      let checked = 0;
      let worstSigma = 0;
      let worstP = 0;
      for (const c of casts) {
        const p = Float64Array.from(c.p);
        const SA = Float64Array.from(c.SA);
        const CT = Float64Array.from(c.CT);
        const sigma = sigma_batch(SA, CT, Number(ref));
        const tg = Float64Array.from(targets[ref]);
        const r = remapToIsopycnals({ p, sigma, props: { SA, CT } }, tg, { handling: 'sort', interpolation: 'linear' });
        const pyS = c[`sigma${ref}`] as number[];
        const pRef = c[`p_ref${ref}`];
        const ctRef = c[`CT_ref${ref}`];
        for (let j = 0; j < tg.length; j++) {
          if (pRef[j] === null) {
            // numpy: outside the cast. Ours must be empty too unless the target sits within
            // 1e-5 kg/m³ of the cast's end (our σ and gsw's differ by ~1e-8).
            if (Number.isFinite(r.pressure[j])) {
              const edge = Math.min(Math.abs(tg[j] - pyS[0]), Math.abs(tg[j] - pyS[pyS.length - 1]));
              expect(edge).toBeLessThan(1e-5);
            } else expect(r.flags[j] & 3).not.toBe(0);
            continue;
          }
          expect(Number.isFinite(r.pressure[j])).toBe(true);
          const dS = Math.abs(pySigmaAt(c.p, pyS, r.pressure[j]) - tg[j]);
          worstSigma = Math.max(worstSigma, dS);
          worstP = Math.max(worstP, Math.abs(r.pressure[j] - (pRef[j] as number)));
          expect(dS).toBeLessThan(1e-5);
          expect(Math.abs(r.props.CT[j] - (ctRef[j] as number))).toBeLessThan(1e-5);
          expect(r.crossings[j]).toBe(1);
          checked++;
        }
      }
      expect(checked).toBeGreaterThan(500);
      // Recorded for the report: the worst σ misfit and pressure difference seen.
      console.log(
        `σ${ref}: ${checked} levels, worst |Δσ| ${worstSigma.toExponential(2)} kg/m³, worst |Δp| ${worstP.toExponential(2)} dbar`,
      );
    });
  }
});
