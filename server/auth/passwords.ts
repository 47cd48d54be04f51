import { hash, verify } from '@node-rs/argon2';

// argon2id with the OWASP-recommended minimum (19 MiB, 2 passes): slow for an attacker, ~30 ms here.
const OPTIONS = { memoryCost: 19456, timeCost: 2, outputLen: 32, parallelism: 1 } as const;

export const MIN_PASSWORD_LENGTH = 10;

export const hashPassword = (password: string) => hash(password, OPTIONS);

export async function verifyPassword(passwordHash: string, password: string): Promise<boolean> {
  try {
    return await verify(passwordHash, password);
  } catch (error) {
    // A malformed stored hash must fail the sign-in, not crash it; it is still worth a log line.
    console.error('Password hash could not be verified', error);
    return false;
  }
}

let dummyHash: Promise<string> | undefined;
/** Spends the same time as a real check when the e-mail is unknown, so timing does not reveal accounts. */
export async function burnPasswordCheck(password: string): Promise<void> {
  dummyHash ??= hashPassword('not-a-real-password-for-timing');
  await verifyPassword(await dummyHash, password);
}
