export {
  authKeys,
  meQuery,
  useMe,
  useSignIn,
  useSignOut,
  useRequestPasswordReset,
  useConfirmPasswordReset,
} from './api';
export type { Credentials } from './api';
export { requireSession, SessionGate, safeReturnPath, signInPath } from './guard';
export { ROLE_LABELS, ROLE_ORDER, roleLabel, can } from './roles';
export { roleSchema, userSchema, meSchema, signedInSchema } from './types';
export type { Role, User, Me, Membership } from './types';
