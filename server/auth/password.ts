import { hash, verify } from "@node-rs/argon2";

// argon2id at OWASP's minimum: 19 MiB memory, 2 passes, 1 lane. The library's defaults are lower.
const ARGON2_OPTIONS = {
  algorithm: 2, // Algorithm.Argon2id (a const enum, not importable under isolatedModules)
  memoryCost: 19456,
  timeCost: 2,
  parallelism: 1,
  outputLen: 32,
} as const;

export function hashPassword(password: string) {
  return hash(password, ARGON2_OPTIONS);
}

export async function verifyPassword(passwordHash: string, password: string) {
  try {
    return await verify(passwordHash, password);
  } catch {
    return false;
  }
}

export const passwordRules = { min: 10, max: 200 };
