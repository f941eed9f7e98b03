/**
 * Station labels that never overlap: each label tries four places around its point (right-above,
 * right-below, left-above, left-below) and takes the first that overlaps no label already placed and
 * no station point; a label with no free place is left out (its station stays, labelled on hover).
 * Points earlier in the list win, so pass the ones that matter first (line ends, the selected line).
 */
export interface LabelPoint {
  id: string;
  x: number;
  y: number;
  text: string;
}
export interface PlacedLabel extends LabelPoint {
  lx: number;
  ly: number;
  anchor: 'start' | 'end';
}
type Box = { x0: number; y0: number; x1: number; y1: number };
const hit = (a: Box, b: Box) => a.x0 < b.x1 && b.x0 < a.x1 && a.y0 < b.y1 && b.y0 < a.y1;

export function placeLabels(
  points: LabelPoint[],
  opts: { charWidth?: number; height?: number; pointRadius?: number; width?: number; heightLimit?: number } = {},
): PlacedLabel[] {
  const cw = opts.charWidth ?? 6.4;
  const h = opts.height ?? 11;
  const r = opts.pointRadius ?? 4.5;
  const taken: Box[] = points.map((p) => ({ x0: p.x - r, y0: p.y - r, x1: p.x + r, y1: p.y + r }));
  const out: PlacedLabel[] = [];
  for (const p of points) {
    const w = p.text.length * cw + 2;
    const tries: [number, number, 'start' | 'end'][] = [
      [7, -6, 'start'],
      [7, 13, 'start'],
      [-7, -6, 'end'],
      [-7, 13, 'end'],
    ];
    for (const [dx, dy, anchor] of tries) {
      const x0 = anchor === 'start' ? p.x + dx : p.x + dx - w;
      const box = { x0, y0: p.y + dy - h + 2, x1: x0 + w, y1: p.y + dy + 2 };
      if (opts.width !== undefined && (box.x0 < 0 || box.x1 > opts.width)) continue;
      if (opts.heightLimit !== undefined && (box.y0 < 0 || box.y1 > opts.heightLimit)) continue;
      if (taken.some((b) => hit(b, box))) continue;
      taken.push(box);
      out.push({ ...p, lx: p.x + dx, ly: p.y + dy, anchor });
      break;
    }
  }
  return out;
}

/** Whether a point lies inside a polygon (screen coordinates; even–odd rule). */
export function insidePolygon(x: number, y: number, poly: readonly [number, number][]): boolean {
  let inside = false;
  for (let i = 0, j = poly.length - 1; i < poly.length; j = i++) {
    const [xi, yi] = poly[i];
    const [xj, yj] = poly[j];
    if (yi > y !== yj > y && x < ((xj - xi) * (y - yi)) / (yj - yi) + xi) inside = !inside;
  }
  return inside;
}
