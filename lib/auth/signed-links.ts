// Links sent by mail (invitations, password resets): `<nonce>.<signature>`, the signature an HMAC of the purpose
// and nonce with the server's secret. A tampered or made-up link is refused by its signature before any lookup;
// the database keeps only the SHA-256 of the nonce, with the link's expiry and whether it was used.
import { createHash, createHmac, randomBytes, timingSafeEqual } from 'node:crypto';
import { authSecret } from './secret';

export type LinkPurpose = 'invitation' | 'password-reset';

function signature(purpose: LinkPurpose, nonce: string): string {
  return createHmac('sha256', authSecret()).update(`${purpose}:${nonce}`).digest('base64url');
}

function hashOf(nonce: string): string {
  return createHash('sha256').update(nonce).digest('hex');
}

/** A new link secret: the token for the URL and the hash to store. */
export function newSignedToken(purpose: LinkPurpose): { token: string; secretHash: string } {
  const nonce = randomBytes(24).toString('base64url');
  return { token: `${nonce}.${signature(purpose, nonce)}`, secretHash: hashOf(nonce) };
}

/** The stored hash a token names, or null when it is malformed or its signature is not ours. */
export function signedTokenHash(purpose: LinkPurpose, token: string): string | null {
  const match = /^([A-Za-z0-9_-]{32})\.([A-Za-z0-9_-]{43})$/.exec(token);
  if (!match) return null;
  const expected = Buffer.from(signature(purpose, match[1]));
  const given = Buffer.from(match[2]);
  return expected.length === given.length && timingSafeEqual(expected, given) ? hashOf(match[1]) : null;
}
