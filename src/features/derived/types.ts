import { z } from 'zod';
import { ApiError, isApiError } from '../../lib/http';

export {
  derivedVariableResponseSchema as derivedVariableSchema,
  derivedVariableListResponseSchema as derivedVariableListSchema,
  type DerivedVariableResponse as DerivedVariable,
} from '../../../shared/api/resources';

export const formulaPreviewSchema = z.object({
  pressure: z.array(z.number().nullable()),
  values: z.array(z.number().nullable()),
  variables: z.array(z.string()).default([]),
});
export type FormulaPreview = z.infer<typeof formulaPreviewSchema>;

export interface NewDerivedVariable {
  name: string;
  formula: string;
  unit?: string;
  description?: string;
}

/** A problem in a formula, with the 0-based character position where the parser stopped, when known. */
export interface FormulaProblem {
  message: string;
  position: number | null;
}

const detailSchema = z.object({
  field: z.string().optional(),
  message: z.string(),
  position: z.number().int().nonnegative().nullish(),
});

/** The formula problem in an API error (400 with details `[{ field: 'formula', message, position? }]`), if it is one. */
export function formulaProblemOf(error: unknown): FormulaProblem | null {
  if (!isApiError(error, 400)) return null;
  for (const d of (error as ApiError).details) {
    const parsed = detailSchema.safeParse(d);
    if (parsed.success && (parsed.data.field === undefined || parsed.data.field === 'formula')) {
      return { message: parsed.data.message, position: parsed.data.position ?? null };
    }
  }
  return { message: error.message, position: null };
}

/** Identifiers the formulas can use: a letter or underscore, then letters, digits, underscores. */
export const IDENTIFIER = /^[A-Za-z_][A-Za-z0-9_]*$/;

export function validateDerived(
  input: NewDerivedVariable,
  taken: readonly string[],
): Partial<Record<keyof NewDerivedVariable, string>> {
  const errors: Partial<Record<keyof NewDerivedVariable, string>> = {};
  const name = input.name.trim();
  if (!name) errors.name = 'Name the variable.';
  else if (!IDENTIFIER.test(name))
    errors.name =
      'A name is a letter or _ followed by letters, digits or _ (it is used in formulas and column headers).';
  else if (name.length > 64) errors.name = 'At most 64 characters.';
  else if (taken.includes(name)) errors.name = `“${name}” is already a column or a derived variable.`;
  if (!input.formula.trim()) errors.formula = 'Write the formula.';
  else if (input.formula.length > 500) errors.formula = 'At most 500 characters.';
  return errors;
}
