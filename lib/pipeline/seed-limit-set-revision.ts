// The limit sets as shipped in the seed files, in the shape the database gives a current revision.
import { getSeedLimitSet, seedLimitSetInputs } from "@/lib/compliance/seed";
import type { LimitSetRevision } from "./types";
import { UnknownLimitSetError } from "./unknown-limit-set-error";

/**
 * The seed files' content of a limit set, as revision "seed:KEY" number 1 (the revision a fresh
 * database is seeded with). Used by the command line when no DATABASE_URL is set.
 *
 * @throws UnknownLimitSetError naming the known keys.
 * @example
 * seedLimitSetRevision("iec-61000-3-2-class-a").revisionId // "seed:iec-61000-3-2-class-a"
 */
export function seedLimitSetRevision(key: string): LimitSetRevision {
  const seed = getSeedLimitSet(key);
  if (!seed) throw new UnknownLimitSetError(`unknown limit set "${key}"; known keys: ${seedLimitSetInputs.map((s) => s.content.key).join(", ")}`);
  return { key: seed.key, name: seed.name, revisionId: `seed:${seed.key}`, revisionNumber: 1, content: seed.content };
}
