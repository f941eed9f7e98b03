import { describe, expect, it } from 'vitest';
import { layerSetSchema, parseLevels, safeParseLevels } from '../../../shared/remap';
import { suggestedLayerSets } from '../../../shared/api/levels';

describe('layer sets', () => {
  it('expands start:step:end with the written digits (analytic case: 36 steps of 0.1)', () => {
    const lv = parseLevels('24.0:0.1:27.6');
    expect(lv.length).toBe(37);
    expect(lv[3]).toBe(24.3);
    expect(lv[36]).toBe(27.6);
  });

  it('accepts a comma list and rejects unordered, empty, non-numeric or absurd input', () => {
    expect(Array.from(parseLevels('26.5, 26.8,27.0'))).toEqual([26.5, 26.8, 27.0]);
    for (const bad of ['27,26', '', 'a,b', '24:0:25', '25:0.1:24', '24:0.0001:27', '70']) {
      expect(safeParseLevels(bad).ok, bad).toBe(false);
    }
  });

  it('validates a set with one reference pressure; defaults cover σ0 and σ2', () => {
    expect(layerSetSchema.safeParse({ name: 'x', ref: 500, spec: '24:0.1:25' }).success).toBe(false);
    const sets = suggestedLayerSets();
    expect(sets.map((s) => [s.ref, s.levels[0], s.levels[s.levels.length - 1]])).toEqual([
      [0, 24, 27.6],
      [2000, 36, 37.2],
    ]);
  });
});
