export { mailKeys, useCaughtMail } from './api';
export { caughtMailSchema } from './types';
export type { CaughtMail } from './types';
