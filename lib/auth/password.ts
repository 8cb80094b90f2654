import "server-only";
import { hash, verify } from "@node-rs/argon2";

// argon2id with the OWASP-recommended minimum (m = 19 MiB, t = 2, p = 1).
const options = { memoryCost: 19456, timeCost: 2, parallelism: 1, outputLen: 32 } as const;

export function hashPassword(password: string): Promise<string> {
  return hash(password, options);
}

export function verifyPassword(passwordHash: string, password: string): Promise<boolean> {
  return verify(passwordHash, password);
}
