import { randomBytes, createHash, timingSafeEqual } from 'node:crypto';

// Tokens sent by e-mail are random; only their SHA-256 is stored, so a database leak does not
// leak usable links.
export const newToken = () => randomBytes(32).toString('base64url');
export const hashToken = (token: string) => createHash('sha256').update(token).digest('hex');
export function safeEqual(a: string, b: string) {
  const x = Buffer.from(a);
  const y = Buffer.from(b);
  return x.length === y.length && timingSafeEqual(x, y);
}
