import { hash, verify } from '@node-rs/argon2';

/**
 * Argon2id with the library's defaults (19 MiB, 2 passes, 1 lane), which equal OWASP's
 * Password Storage Cheat Sheet minimum for Argon2id.
 */
export function hashPassword(password: string): Promise<string> {
  return hash(password);
}

export async function verifyPassword(passwordHash: string, password: string): Promise<boolean> {
  try {
    return await verify(passwordHash, password);
  } catch {
    return false;
  }
}

// Verified against when the account does not exist, so a wrong address takes as long as a
// wrong password and does not reveal which addresses have accounts.
let decoyHash: Promise<string> | undefined;
export function decoyPasswordHash(): Promise<string> {
  decoyHash ??= hash('no account has this password');
  return decoyHash;
}
