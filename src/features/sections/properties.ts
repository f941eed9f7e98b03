// The properties a section can draw, as the property control lists them: read from the variable
// catalogue (shared/api/variables.ts), the one place for labels and units.
import { SECTION_VARIABLES, propertyLabel as catalogueLabel } from '../../../shared/api/variables';

/** The cast columns a section can show, with how they read and their units. N² is left out: it lives on mid-points. */
export const SECTION_PROPERTIES: readonly { name: string; label: string; unit: string }[] = SECTION_VARIABLES.map(
  ({ name, label, unit }) => ({ name, label, unit }),
);

/** Label and unit of a property: the catalogue's, a derived variable's, or an extra variable of the files (`x:<name>`). */
export function propertyLabel(
  name: string,
  others: readonly { name: string; unit: string | null }[] = [],
): { label: string; unit: string } {
  return catalogueLabel(name, others);
}
