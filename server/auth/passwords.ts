import argon2 from 'argon2';

/** OWASP's minimum for argon2id: 19 MiB memory, 2 iterations, 1 lane. */
export const ARGON2_OPTIONS = {
  type: argon2.argon2id,
  memoryCost: 19_456,
  timeCost: 2,
  parallelism: 1,
} as const;

export const hashPassword = (password: string) => argon2.hash(password, ARGON2_OPTIONS);

export async function verifyPassword(hash: string, password: string) {
  try {
    return await argon2.verify(hash, password);
  } catch {
    return false;
  }
}

export const passwordNeedsRehash = (hash: string) => argon2.needsRehash(hash, ARGON2_OPTIONS);

let dummy: Promise<string> | undefined;
/** Verifies against a throwaway hash so an unknown e-mail costs as long as a wrong password. */
export async function burnVerifyTime(password: string) {
  dummy ??= hashPassword('benchwright-timing-equaliser');
  await verifyPassword(await dummy, password);
}
