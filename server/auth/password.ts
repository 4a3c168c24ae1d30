/**
 * Password hashing with Argon2id (@node-rs/argon2).
 *
 * Parameters: m = 19456 KiB (19 MiB), t = 2 iterations, p = 1 — the minimum configuration the OWASP
 * Password Storage Cheat Sheet recommends for Argon2id
 * (https://cheatsheetseries.owasp.org/cheatsheets/Password_Storage_Cheat_Sheet.html#argon2id).
 * The parameters travel inside the PHC string, so raising them later still verifies old hashes.
 */
import { hash, verify, type Algorithm } from '@node-rs/argon2';

/** Algorithm.Argon2id is a const enum in the package's types; its value is 2. */
const ARGON2ID = 2 as Algorithm;

export const ARGON2_OPTIONS = { algorithm: ARGON2ID, memoryCost: 19456, timeCost: 2, parallelism: 1 } as const;

export function hashPassword(password: string): Promise<string> {
  return hash(password, ARGON2_OPTIONS);
}

export async function verifyPassword(passwordHash: string, password: string): Promise<boolean> {
  try {
    return await verify(passwordHash, password);
  } catch {
    return false;
  }
}

let dummyHash: Promise<string> | undefined;
/**
 * Spend the same time as a real verification when no account has the address, so the answer's
 * timing does not tell whether the address exists.
 */
export async function verifyAgainstNothing(password: string): Promise<false> {
  dummyHash ??= hashPassword('no account has this password, it only costs time');
  await verifyPassword(await dummyHash, password);
  return false;
}
