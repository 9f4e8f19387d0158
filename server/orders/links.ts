import { createHmac, timingSafeEqual } from 'node:crypto';

/**
 * Customer links: `<linkId>.<expires, unix seconds>.<signature>` where the signature is
 * HMAC-SHA256 over `linkId.orderId.expires` with the shop's link key. The row keeps the expiry
 * and the revocation; the token itself is never stored. Verification needs all three: the row,
 * a matching signature and a future expiry.
 */
export function signLink(key: string, linkId: string, orderId: string, expiresAt: Date): string {
  const exp = Math.floor(expiresAt.getTime() / 1000);
  return `${linkId}.${exp}.${mac(key, linkId, orderId, exp)}`;
}

function mac(key: string, linkId: string, orderId: string, exp: number): string {
  return createHmac('sha256', Buffer.from(key, 'hex')).update(`${linkId}.${orderId}.${exp}`).digest('base64url');
}

/** Splits a token; null when it does not have the shape of one. */
export function parseLinkToken(token: string): { linkId: string; exp: number; signature: string } | null {
  const m = /^([a-z2-7]{26})\.(\d{1,12})\.([A-Za-z0-9_-]{43})$/.exec(token);
  if (!m) return null;
  return { linkId: m[1], exp: Number(m[2]), signature: m[3] };
}

export function verifyLink(key: string, parsed: { linkId: string; exp: number; signature: string }, orderId: string, expiresAt: Date): boolean {
  const exp = Math.floor(expiresAt.getTime() / 1000);
  if (exp !== parsed.exp) return false;
  const expected = Buffer.from(mac(key, parsed.linkId, orderId, exp));
  const given = Buffer.from(parsed.signature);
  return expected.length === given.length && timingSafeEqual(expected, given);
}
