// Picking a pressure range on the cast sheet: the span of a drag, snapped to the cast's levels, and how an
// inversion the intake found is reported as handled now.
import { describe, expect, it } from 'vitest';
import type { PlotSelectionEvent } from 'plotly.js';
import { inversionHandling, snapToLevels, spanOfSelection, flaggedRuns } from '../../../src/features/castsheet';
import type { CastInversion } from '../../../src/features/castsheet';

const pressure = Array.from({ length: 50 }, (_, i) => 2 + 2 * i);
const sel = (y: [number, number]) => ({ points: [], range: { x2: [1, 2], y } }) as unknown as PlotSelectionEvent;

describe('picking a range on the plot', () => {
  it('takes the levels inside the span of a drag, in either vertical direction', () => {
    expect(spanOfSelection(sel([33.1, 50.7]), pressure)).toEqual({ pFrom: 34, pTo: 50 });
    expect(spanOfSelection(sel([50.7, 33.1]), pressure)).toEqual({ pFrom: 34, pTo: 50 });
  });
  it('a span thinner than the level spacing (a sideways drag) picks the nearest level, never zero levels', () => {
    expect(snapToLevels([40.6, 41.1], pressure)).toEqual({ pFrom: 40, pTo: 40 });
    expect(snapToLevels([41.2, 41.2], pressure)).toEqual({ pFrom: 42, pTo: 42 });
  });
  it('falls back on the selected points when there is no range', () => {
    const e = { points: [{ y: 10 }, { y: 20 }] } as unknown as PlotSelectionEvent;
    expect(spanOfSelection(e, pressure)).toEqual({ pFrom: 10, pTo: 20 });
  });
  it('groups flagged levels into runs by flag', () => {
    const f = new Array(50).fill(2);
    f[3] = 3;
    f[4] = 3;
    f[5] = 4;
    f[9] = 3;
    expect(flaggedRuns({ salinity: f }, ['salinity'], pressure).map((r) => [r.flag, r.pFrom, r.pTo])).toEqual([
      [3, 8, 10],
      [4, 12, 12],
      [3, 20, 20],
    ]);
  });
});

describe('inversions found at intake, handled now', () => {
  const spike: CastInversion = {
    iTop: 9,
    iBottom: 10,
    pTop: 20,
    pBottom: 22,
    depthTop: null,
    depthBottom: null,
    deficit: 0.03,
    minN2: null,
    class: 'spike',
    levels: 1,
  };
  it('flagged and silenced', () => {
    const flags = { salinity: Object.assign(new Array(50).fill(2), { 10: 3 }) };
    const h = inversionHandling([spike], [], flags, [
      { test: 'density_inversion', iFrom: 10, iTo: 10, status: 'accepted' },
    ]);
    expect(h[0]).toMatchObject({
      warned: false,
      flagged: 1,
      proposal: 'accepted',
      text: '1 level flagged · no longer warned · proposal accepted',
    });
  });
  it('kept as real when its proposal was rejected', () => {
    const h = inversionHandling([spike], [spike], {}, [
      { test: 'density_inversion', iFrom: 10, iTo: 10, status: 'rejected' },
    ]);
    expect(h[0].text).toBe('still warned · proposal rejected: kept as real');
  });
});
