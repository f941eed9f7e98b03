export { castsQuery, useCasts, useRemovedCasts, useCastLife } from './api';
export { RemovedCasts } from './components/RemovedCasts';
export { CastsTable } from './components/CastsTable';
export { castSummarySchema, castListSchema } from './types';
export type { CastSummary, RemovedCast } from './types';
