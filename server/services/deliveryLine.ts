// The casts a delivery covers: one line of the cruise, resolved by the lines service
// (docs/lines.md): its stations in line order, one cast each (composites joined).
import type { CruiseCast } from './cruiseData';
import { lineProvenanceNote, lineRow, resolveLine } from './lines';

export type DeliveryLine = { id: string | null; name: string; casts: CruiseCast[]; note?: string };

/** The line's casts in line order; lineId null: the cruise's default line. */
export async function castsOfLine(cruiseId: string, lineId: string | null, all: CruiseCast[]): Promise<DeliveryLine> {
  const l = await resolveLine(cruiseId, await lineRow(cruiseId, lineId), all);
  return { id: l.id, name: l.name, casts: l.casts, note: lineProvenanceNote(l) };
}
