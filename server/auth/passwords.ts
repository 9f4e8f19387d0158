import { createHash } from 'node:crypto';
import { hash, verify } from '@node-rs/argon2';
import type { Config } from '../config';

/** argon2id (the library's default algorithm) with the cost from config (OWASP: 19 MiB, t=2). */
export function hashPassword(config: Pick<Config, 'argon2'>, password: string): Promise<string> {
  return hash(password, { memoryCost: config.argon2.memoryCost, timeCost: config.argon2.timeCost, parallelism: 1 });
}

export async function verifyPassword(passwordHash: string, password: string): Promise<boolean> {
  try {
    return await verify(passwordHash, password);
  } catch {
    return false;
  }
}

const dummyHashes = new Map<string, Promise<string>>();
/**
 * Verifies against a throw-away hash of the same cost, so an unknown e-mail takes as long
 * as a wrong password and the answer does not tell which e-mails have accounts.
 */
export async function verifyDummy(config: Pick<Config, 'argon2'>, password: string): Promise<false> {
  const key = `${config.argon2.memoryCost}:${config.argon2.timeCost}`;
  let dummy = dummyHashes.get(key);
  if (!dummy) {
    dummy = hashPassword(config, 'not-a-password-anyone-has');
    dummyHashes.set(key, dummy);
  }
  await verifyPassword(await dummy, password);
  return false;
}

/** Tokens in links are stored as their sha256 only. */
export const hashToken = (token: string) => createHash('sha256').update(token).digest('hex');
