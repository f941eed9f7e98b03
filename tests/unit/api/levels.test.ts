// The one levels policy (shared/api/levels.ts): parsing, bounds, defaults per reference pressure,
// and that no other module of the tree writes its own default level specification.
import { describe, expect, it } from 'vitest';
import { execFileSync } from 'node:child_process';
import {
  defaultLayerBoundaries,
  defaultLevels,
  FALLBACK_LEVELS,
  MAX_LEVELS,
  parseLevels,
  REFERENCE_PRESSURES,
  safeParseLevels,
} from '../../../shared/api/levels';

describe('levels policy', () => {
  it('parses start:step:end and comma lists; bounds count and precision', () => {
    expect(Array.from(parseLevels('26.00:0.25:27.00'))).toEqual([26, 26.25, 26.5, 26.75, 27]);
    expect(Array.from(parseLevels('26.5,27'))).toEqual([26.5, 27]);
    expect(safeParseLevels(`0:0.01:${(MAX_LEVELS * 0.01).toFixed(2)}`).ok).toBe(false); // MAX_LEVELS + 1 levels
    expect(safeParseLevels('26.12345,27').ok).toBe(false); // five decimals
    expect(safeParseLevels('26:0.00001:26.001').ok).toBe(false);
    expect(safeParseLevels('26.1234,27').ok).toBe(true);
  });

  it('a default is ~100 levels on a round step covering the range; the fallback per reference pressure parses', () => {
    // analytic case: range 24.53–27.96 over 100 levels wants a step ≥ 0.0343 → 0.05; 24.50 … 28.00
    expect(defaultLevels(0, [24.53, 27.96])).toBe('24.50:0.05:28.00');
    const lv = parseLevels(defaultLevels(2000, [36.01, 37.18]));
    expect(lv[0]).toBeLessThanOrEqual(36.01);
    expect(lv[lv.length - 1]).toBeGreaterThanOrEqual(37.18);
    expect(lv.length).toBeGreaterThan(50);
    expect(lv.length).toBeLessThanOrEqual(101);
    for (const r of REFERENCE_PRESSURES) {
      expect(defaultLevels(r, null)).toBe(FALLBACK_LEVELS[r]);
      expect(safeParseLevels(FALLBACK_LEVELS[r]).ok).toBe(true);
    }
  });

  it("geostrophy's default boundaries are levels of the default set, first and last included", () => {
    const range: [number, number] = [25.1, 27.83];
    const all = Array.from(parseLevels(defaultLevels(0, range)));
    const b = Array.from(parseLevels(defaultLayerBoundaries(0, range)));
    expect(b.length).toBeGreaterThanOrEqual(5);
    expect(b.length).toBeLessThanOrEqual(10);
    for (const v of b)
      expect(
        all.some((a) => Math.abs(a - v) < 1e-9),
        String(v),
      ).toBe(true);
    expect(b[0]).toBe(all[0]);
    expect(b[b.length - 1]).toBe(all[all.length - 1]);
  });

  it('no other module writes a default level specification (start:step:end literals) or its own default table', () => {
    // Literal level specs outside the policy module, the suggested layer sets' seed and tests are defaults in disguise.
    let out: string;
    try {
      out = execFileSync(
        'grep',
        ['-rnE', '[\'"`][0-9]{2}\\.[0-9]+:[0-9.]+:[0-9]{2}\\.[0-9]+[\'"`]', 'server', 'src', 'shared'],
        { encoding: 'utf8' },
      );
    } catch (e) {
      out = (e as { stdout?: string }).stdout ?? ''; // grep exits 1 when nothing matches
    }
    const offenders = out.split('\n').filter((l) => l && !l.startsWith('shared/api/levels.ts:'));
    expect(offenders).toEqual([]);
  });
});
