import argon2 from 'argon2';

/** argon2id with m = 19 MiB, t = 2, p = 1: the OWASP Password Storage Cheat Sheet minimum. */
const OPTIONS = { type: argon2.argon2id, memoryCost: 19 * 1024, timeCost: 2, parallelism: 1 } as const;

export const hashPassword = (password: string) => argon2.hash(password, OPTIONS);

export async function verifyPassword(hash: string, password: string): Promise<boolean> {
  try {
    return await argon2.verify(hash, password);
  } catch {
    return false;
  }
}

/** A valid hash of a random secret, verified against when the e-mail is unknown, so timing does not reveal accounts. */
let decoy: Promise<string> | null = null;
export const decoyHash = () => (decoy ??= hashPassword(`decoy-${Math.random()}`));
