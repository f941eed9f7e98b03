import argon2 from 'argon2';
import { randomBytes } from 'node:crypto';

// argon2id with the library's defaults (memory-hard; OWASP-recommended family).
export const hashPassword = (password: string) => argon2.hash(password, { type: argon2.argon2id });
// An account that does not exist (or has no password yet) is checked against this hash of a random
// password, so that a sign-in costs the same whether or not the address has an account.
let dummy: Promise<string> | null = null;
const dummyHash = () => (dummy ??= argon2.hash(randomBytes(24).toString('base64url'), { type: argon2.argon2id }));
/** Warms the dummy hash (at start-up, so the first unknown address is not the fast one). */
export const warmPasswordCheck = () => {
  void dummyHash();
};

export const verifyPassword = async (hash: string | null, password: string) => {
  if (!hash) {
    await argon2.verify(await dummyHash(), password).catch(() => false);
    return false;
  }
  try {
    return await argon2.verify(hash, password);
  } catch {
    return false;
  }
};

/** The password policy: at least 10 characters and at least two of letters, digits, other characters.
 * Returns the reason it fails, or null. */
export function passwordProblem(password: string): string | null {
  if (password.length < 10) return 'The password must have at least 10 characters.';
  if (password.length > 200) return 'The password must have at most 200 characters.';
  const classes = [/[A-Za-z]/, /\d/, /[^A-Za-z\d]/].filter((r) => r.test(password)).length;
  if (classes < 2) return 'The password must mix at least two of: letters, digits, other characters.';
  return null;
}
