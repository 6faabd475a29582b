import { hash, verify } from '@node-rs/argon2';

/** argon2id with the library's defaults (about 75 ms a hash on the target machine). */
export function hashPassword(password: string): Promise<string> {
  return hash(password); // the library's default algorithm is argon2id
}

export async function verifyPassword(passwordHash: string, password: string): Promise<boolean> {
  try {
    return await verify(passwordHash, password);
  } catch {
    return false;
  }
}

/** A hash of a random password, verified against when the e-mail is unknown so both paths take as long. */
let dummyHash: Promise<string> | undefined;
export function dummyPasswordHash(): Promise<string> {
  dummyHash ??= hashPassword('not-a-real-password-' + Math.random());
  return dummyHash;
}
