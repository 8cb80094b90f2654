// Seed limit sets: the published tables as revision content, keyed by limit-set key.
import { LimitSetRevisionContentSchema, type LimitSetRevisionContent, type LimitSetRevisionContentInput } from "../model";
import { iec61000312LimitSets } from "./iec-61000-3-12";
import { iec6100032LimitSets } from "./iec-61000-3-2";
import { ieee519LimitSets } from "./ieee-519";

/** A seed limit set: its key and display name, and the content of its first revision. */
export interface SeedLimitSet {
  key: string;
  name: string;
  content: LimitSetRevisionContent;
}

/** The hand-written seed documents before schema defaults are applied (for validation tests). */
export const seedLimitSetInputs: Array<{ name: string; content: LimitSetRevisionContentInput }> = [
  ...iec6100032LimitSets,
  ...iec61000312LimitSets,
  ...ieee519LimitSets,
];

// Parsed once at load so a malformed seed fails loudly and callers get defaults applied.
export const seedLimitSets: SeedLimitSet[] = seedLimitSetInputs.map(({ name, content }) => {
  const parsed = LimitSetRevisionContentSchema.parse(content);
  return { key: parsed.key, name, content: parsed };
});

/**
 * Look up a seed limit set by key, e.g. `iec-61000-3-2-class-a`; undefined when unknown.
 *
 * @example
 * getSeedLimitSet("ieee-519-2014-current")?.content.edition // "IEEE Std 519-2014"
 */
export function getSeedLimitSet(key: string): SeedLimitSet | undefined {
  return seedLimitSets.find((set) => set.key === key);
}
