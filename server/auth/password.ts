import { hash, verify } from '@node-rs/argon2';

// argon2id with OWASP Password Storage Cheat Sheet parameters (m = 19 MiB, t = 2, p = 1),
// which are also @node-rs/argon2's defaults; stated here so a library change cannot lower them.
const OPTIONS = { memoryCost: 19456, timeCost: 2, parallelism: 1 } as const;

export function hashPassword(password: string): Promise<string> {
  return hash(password, OPTIONS);
}

export async function verifyPassword(hashed: string, password: string): Promise<boolean> {
  try {
    return await verify(hashed, password);
  } catch {
    return false;
  }
}

// A short list of the most common passwords (from memory of the published breach top lists);
// NIST SP 800-63B §3.1.1.2 asks verifiers to refuse such values.
const COMMON = new Set([
  'password',
  'password1',
  'password123',
  '12345678',
  '123456789',
  '1234567890',
  'qwertyuiop',
  'qwerty123',
  'iloveyou',
  'sunshine',
  'princess',
  'football',
  'baseball',
  'welcome1',
  'letmein1',
  'admin123',
  'abc12345',
  'passw0rd',
  '11111111',
  '00000000',
  'trustno1',
  'zaq12wsx',
  'qazwsx123',
  'guitar123',
  'changeme',
  'lugbook1',
  'lugbook123',
]);

/** A reason the password is refused, or null when it may be used. */
export function passwordProblem(password: string): string | null {
  if (password.length < 8) return 'Use at least 8 characters (15 or more is better).';
  if (COMMON.has(password.toLowerCase())) return 'This password is among the most common ones; choose another.';
  return null;
}
