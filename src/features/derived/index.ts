export { derivedKeys } from './keys';
export {
  derivedVariablesQuery,
  useDerivedVariables,
  useFormulaPreview,
  useCreateDerivedVariable,
  useDeleteDerivedVariable,
} from './api';
export { DerivedForm, columnNamesOf } from './components/DerivedForm';
export { DerivedList } from './components/DerivedList';
export { FormulaProblemView } from './components/FormulaProblemView';
export { PreviewPlot } from './components/PreviewPlot';
export {
  derivedVariableSchema,
  derivedVariableListSchema,
  formulaPreviewSchema,
  formulaProblemOf,
  validateDerived,
  IDENTIFIER,
} from './types';
export type { DerivedVariable, FormulaPreview, FormulaProblem, NewDerivedVariable } from './types';
