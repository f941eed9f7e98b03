// The casts a delivery covers: one line of the cruise. Until the cruise has lines of its own, every
// cast is on one line named "default"; point castsOfLine at the lines service when it exists.
import type { CruiseCast } from './cruiseData';

export type DeliveryLine = { id: string | null; name: string; casts: CruiseCast[]; note?: string };

/** The line's casts in line order; lineId null: the cruise's default line. */
export async function castsOfLine(_cruiseId: string, lineId: string | null, all: CruiseCast[]): Promise<DeliveryLine> {
  if (lineId) return { id: lineId, name: lineId, casts: all, note: 'lines are not defined yet; every cast of the cruise' };
  return { id: null, name: 'default', casts: all };
}
