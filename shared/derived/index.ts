export { compileFormula, MAX_FORMULA_LENGTH } from './formula';
export type { CompiledFormula, FormulaError } from './formula';
