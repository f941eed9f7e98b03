// The cast sheet's overlays: the neighbours and the earlier occupation's partner become one list of overlaid casts,
// labelled with the earlier cruise and the partner's date, drawn in every panel (N² on its own mid-point pressures).
// Invented numbers: a behaviour check of the client's bookkeeping, not of any science.
import { describe, expect, it } from 'vitest';
import {
  castDetailSchema,
  derivedPanels,
  earlierDate,
  measuredPanels,
  overlayCasts,
  type EarlierOccupation,
  type Neighbour,
} from '../../../src/features/castsheet';

const col = (a: number[]) => a;
const cast = castDetailSchema.parse({
  id: 'k1',
  station: 'CP-03',
  cast: '1',
  levels: 3,
  columns: {
    pressure: col([2, 4, 6]),
    temperature: col([20, 19, 18]),
    SP: col([35, 35.1, 35.2]),
    SA: col([35.16, 35.26, 35.36]),
    CT: col([20, 19, 18]),
    N2: col([1e-5, 2e-5]),
    p_mid: col([3, 5]),
  },
});
const profile = (dt: number) => ({
  pressure: [2, 4, 6],
  temperature: [20 + dt, 19 + dt, 18 + dt],
  SP: [35, 35.1, 35.2],
  SA: [35.16, 35.26, 35.36],
  CT: [20 + dt, 19 + dt, 18 + dt],
  N2: [1e-5, 3e-5],
  p_mid: [3, 5],
});
const neighbours: Neighbour[] = [
  { id: 'n1', station: 'CP-02', cast: '1', role: 'previous', columns: profile(0.1), extras: {} },
  { id: 'n2', station: 'CP-04', cast: '1', role: 'next', columns: profile(-0.1), extras: {} },
];
const earlier: EarlierOccupation = {
  cruiseId: 'c0',
  cruise: 'TS-16-02',
  ship: 'RV Tessellate',
  startDate: '2016-03-01',
  lineId: 'l0',
  line: 'All stations',
  why: ['same section identifier'],
  partner: {
    id: 'e1',
    station: 'CP-03',
    cast: '1',
    time: '2016-03-02T14:55:00.000Z',
    offsetKm: 0.9,
    columns: profile(0.5),
    extras: {},
  },
  note: null,
};

describe('overlays of the cast sheet', () => {
  it('label the neighbours by side and the earlier partner by cruise, date and station, earlier last', () => {
    const o = overlayCasts(neighbours, earlier);
    expect(o.map((x) => [x.role, x.label])).toEqual([
      ['previous', 'previous · CP-02'],
      ['next', 'next · CP-04'],
      ['earlier', 'TS-16-02 · 2016-03-02 · CP-03'],
    ]);
    expect(earlierDate({ ...earlier, partner: { ...earlier.partner!, time: null } })).toBe('2016-03-01');
  });

  it('leave the earlier occupation out when it has no partner, or none is chosen', () => {
    expect(overlayCasts(neighbours, { ...earlier, partner: null, note: 'far' }).map((x) => x.role)).toEqual([
      'previous',
      'next',
    ]);
    expect(overlayCasts(neighbours, null)).toHaveLength(2);
  });

  it('reach every panel, N² on the overlaid cast’s own mid-point pressures', () => {
    const o = overlayCasts(neighbours, earlier);
    const measured = measuredPanels(cast, o);
    expect(measured.map((p) => p.key)).toEqual(['temperature', 'SP']);
    for (const p of measured) expect(p.overlays?.map((x) => x.role)).toEqual(['previous', 'next', 'earlier']);
    const derived = derivedPanels(cast, [25, 25.1, 25.2], 0, o);
    for (const p of derived) expect(p.overlays?.map((x) => x.role)).toEqual(['previous', 'next', 'earlier']);
    const n2 = derived.find((p) => p.key === 'N2')!.overlays!.find((x) => x.role === 'earlier')!;
    expect(n2.p).toEqual([3, 5]);
    expect(n2.v).toEqual([1e-5, 3e-5]);
    const t = measured[0].overlays!.find((x) => x.role === 'earlier')!;
    expect(t.v).toEqual([20.5, 19.5, 18.5]);
  });
});
