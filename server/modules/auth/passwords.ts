import argon2 from 'argon2';

/**
 * argon2id with the OWASP Password Storage Cheat Sheet's first recommended
 * configuration: m = 19 MiB (19456 KiB), t = 2, p = 1.
 */
export const ARGON2_OPTIONS = {
  type: argon2.argon2id,
  memoryCost: 19456,
  timeCost: 2,
  parallelism: 1,
} as const;

export function hashPassword(password: string): Promise<string> {
  return argon2.hash(password, ARGON2_OPTIONS);
}

export async function verifyPassword(hash: string, password: string): Promise<boolean> {
  try {
    return await argon2.verify(hash, password);
  } catch {
    return false;
  }
}

let dummyHash: Promise<string> | undefined;
/** Spends the same work as a real verification, so an unknown e-mail answers no faster than a wrong password. */
export async function burnVerification(password: string): Promise<void> {
  dummyHash ??= hashPassword('not-a-real-password-for-timing');
  await verifyPassword(await dummyHash, password);
}
