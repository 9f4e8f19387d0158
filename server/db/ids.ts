import { randomBytes } from 'node:crypto';

/**
 * The one id scheme of every table: 26 characters of lowercase base32 (128 random bits),
 * stored as `varchar(26)`. Made by the server, never by the database; not guessable, so a
 * leaked id does not reveal how many records a shop has.
 */
export const ID_LENGTH = 26;
const alphabet = 'abcdefghijklmnopqrstuvwxyz234567';

export function newId(): string {
  const bytes = randomBytes(17); // 136 bits; 26 base32 characters carry 130
  let bits = 0;
  let value = 0;
  let out = '';
  for (const byte of bytes) {
    value = (value << 8) | byte;
    bits += 8;
    while (bits >= 5 && out.length < ID_LENGTH) {
      out += alphabet[(value >>> (bits - 5)) & 31];
      bits -= 5;
    }
    value &= (1 << bits) - 1;
  }
  return out;
}

/** A secret for a link (invitation, password reset): 32 random bytes, base64url. */
export function newToken(): string {
  return randomBytes(32).toString('base64url');
}
