import { describe, it, expect } from 'vitest';
import { placeLabels, insidePolygon, parseStationList } from '../../../src/features/lines';

type Box = { x0: number; y0: number; x1: number; y1: number };
const boxOf = (l: { lx: number; ly: number; anchor: 'start' | 'end'; text: string }): Box => {
  const w = l.text.length * 6.4 + 2;
  const x0 = l.anchor === 'start' ? l.lx : l.lx - w;
  return { x0, y0: l.ly - 9, x1: x0 + w, y1: l.ly + 2 };
};

describe('station labels on the map', () => {
  it('never overlap, however crowded the stations', () => {
    const pts = Array.from({ length: 60 }, (_, i) => ({
      id: `S${i}`,
      x: 100 + (i % 10) * 9,
      y: 100 + Math.floor(i / 10) * 6,
      text: `ST-${i}`,
    }));
    const placed = placeLabels(pts);
    expect(placed.length).toBeGreaterThan(3);
    expect(placed.length).toBeLessThan(pts.length);
    for (let i = 0; i < placed.length; i++)
      for (let j = i + 1; j < placed.length; j++) {
        const a = boxOf(placed[i]);
        const b = boxOf(placed[j]);
        expect(a.x0 < b.x1 && b.x0 < a.x1 && a.y0 < b.y1 && b.y0 < a.y1, `${placed[i].id} / ${placed[j].id}`).toBe(
          false,
        );
      }
  });
  it('labels every station when they are far apart, and the first points win', () => {
    expect(
      placeLabels([
        { id: 'a', x: 10, y: 50, text: 'A' },
        { id: 'b', x: 200, y: 50, text: 'B' },
      ]),
    ).toHaveLength(2);
    const two = placeLabels([
      { id: 'first', x: 50, y: 50, text: 'LONGNAME' },
      { id: 'second', x: 52, y: 50, text: 'LONGNAME' },
    ]);
    expect(two[0].id).toBe('first');
  });
  it('finds stations inside a lasso and reads a pasted station list', () => {
    const sq: [number, number][] = [
      [0, 0],
      [10, 0],
      [10, 10],
      [0, 10],
    ];
    expect(insidePolygon(5, 5, sq)).toBe(true);
    expect(insidePolygon(15, 5, sq)).toBe(false);
    expect(parseStationList('CP-01, CP-02;CP-05\n 12A\tK-07')).toEqual(['CP-01', 'CP-02', 'CP-05', '12A', 'K-07']);
  });
});
