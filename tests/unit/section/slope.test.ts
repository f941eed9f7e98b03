import { describe, expect, it } from 'vitest';
import { alongIsopycnalGradient, alongIsopycnalGradientDirect } from '../../../shared/section';
import { remapToIsopycnals } from '../../../shared/remap';

/**
 * Analytic two-dimensional field (analytic case). Isopycnals are displaced by η(x) = A sin(πx/L):
 * σ(x, d) = 24 + 3(1 − e^{−(d − η)/H}), so an isopycnal's depth is D(x, σ) = D₀(σ) + η(x) and its
 * slope (∂z/∂x)_σ = −η′(x). Property φ(x, d) = 20 e^{−d/800} + 2·10⁻⁶ x (1 + d/1000) (x in m).
 * Along an isopycnal dφ/dx = φ_x + φ_d η′(x).
 */
const A = 100;
const L = 400e3;
const H = 700;
const eta = (x: number) => A * Math.sin((Math.PI * x) / L);
const etaX = (x: number) => ((A * Math.PI) / L) * Math.cos((Math.PI * x) / L);
const phi = (x: number, d: number) => 20 * Math.exp(-d / 800) + 2e-6 * x * (1 + d / 1000);
const phiX = (_x: number, d: number) => 2e-6 * (1 + d / 1000);
const phiD = (x: number, d: number) => (-20 / 800) * Math.exp(-d / 800) + 2e-9 * x;
const sigmaOf = (x: number, d: number) => 24 + 3 * (1 - Math.exp(-(d - eta(x)) / H));

function run(dxKm: number, dd: number) {
  const x = Float64Array.from({ length: Math.round(400 / dxKm) + 1 }, (_, i) => i * dxKm);
  const depth = Float64Array.from({ length: Math.round(2000 / dd) + 1 }, (_, i) => i * dd);
  const nx = x.length;
  const ny = depth.length;
  const targets = Float64Array.from({ length: 9 }, (_, j) => 25 + 0.15 * j);
  const levelGrid = new Float64Array(nx * ny);
  const depthOfSigma = new Float64Array(nx * targets.length);
  const phiOnSigma = new Float64Array(nx * targets.length);
  for (let ix = 0; ix < nx; ix++) {
    const xm = x[ix] * 1000;
    const sigma = depth.map((d) => sigmaOf(xm, d));
    const col = depth.map((d) => phi(xm, d));
    for (let iy = 0; iy < ny; iy++) levelGrid[iy * nx + ix] = col[iy];
    const r = remapToIsopycnals({ p: depth, z: depth.map((d) => -d), sigma, props: { phi: col } }, targets, {
      handling: 'sort',
      interpolation: 'pchip',
    });
    for (let j = 0; j < targets.length; j++) {
      depthOfSigma[j * nx + ix] = r.depth![j];
      phiOnSigma[j * nx + ix] = r.props.phi[j];
    }
  }
  const t = alongIsopycnalGradient(x, depth, levelGrid, depthOfSigma, targets.length);
  const direct = alongIsopycnalGradientDirect(x, phiOnSigma, targets.length);
  let maxIdentity = 0;
  let maxExact = 0;
  let maxSlope = 0;
  let scale = 0;
  for (let j = 0; j < targets.length; j++) {
    for (let ix = 1; ix < nx - 1; ix++) {
      const k = j * nx + ix;
      const xm = x[ix] * 1000;
      const d = depthOfSigma[k];
      const exact = phiX(xm, d) + phiD(xm, d) * etaX(xm);
      scale = Math.max(scale, Math.abs(exact));
      maxIdentity = Math.max(maxIdentity, Math.abs(t.alongIsopycnal[k] - direct[k]));
      maxExact = Math.max(maxExact, Math.abs(t.alongIsopycnal[k] - exact));
      maxSlope = Math.max(maxSlope, Math.abs(t.slope[k] + etaX(xm)));
    }
  }
  return { maxIdentity, maxExact, maxSlope, scale };
}

describe('coordinate transform (∂φ/∂x)_σ = (∂φ/∂x)_z + (∂φ/∂z)_x (∂z/∂x)_σ (docs/science.md §3.4)', () => {
  const coarse = run(20, 20);
  const fine = run(10, 10);

  it('agrees with the direct difference on the remapped grid, closing at second order (analytic case)', () => {
    expect(coarse.maxIdentity).toBeLessThan(0.02 * coarse.scale);
    expect(fine.maxIdentity).toBeLessThan(coarse.maxIdentity / 3); // halving h: error ÷ ≈ 4
  });

  it('matches the analytic along-isopycnal gradient and slope, converging (analytic case)', () => {
    expect(fine.maxExact).toBeLessThan(0.01 * fine.scale);
    expect(fine.maxExact).toBeLessThan(coarse.maxExact / 3);
    expect(fine.maxSlope).toBeLessThan((1e-2 * (A * Math.PI)) / L);
    expect(fine.maxSlope).toBeLessThan(coarse.maxSlope / 3);
  });
});
