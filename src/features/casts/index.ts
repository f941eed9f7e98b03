export { castsQuery, useCasts } from './api';
export { CastsTable } from './components/CastsTable';
export { castSummarySchema, castListSchema } from './types';
export type { CastSummary } from './types';
