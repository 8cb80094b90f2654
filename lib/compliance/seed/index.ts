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

/** Each seed limit set parsed (schema defaults applied), by key, on first use. */
const parsed = new Map<string, SeedLimitSet>();

function parseSeed({ name, content }: { name: string; content: LimitSetRevisionContentInput }): SeedLimitSet {
  const key = content.key;
  let set = parsed.get(key);
  if (!set) {
    const valid = LimitSetRevisionContentSchema.parse(content);
    set = { key: valid.key, name, content: valid };
    parsed.set(key, set);
  }
  return set;
}

/**
 * Every seed limit set, parsed (a malformed seed fails loudly) and with defaults applied. Parsed
 * on first use rather than at load: the command line judges against one set and need not parse
 * them all.
 *
 * @example
 * seedLimitSets().map((s) => s.key) // ["iec-61000-3-2-class-a", …]
 */
export function seedLimitSets(): SeedLimitSet[] {
  return seedLimitSetInputs.map(parseSeed);
}

/**
 * Look up a seed limit set by key, e.g. `iec-61000-3-2-class-a`; undefined when unknown.
 *
 * @example
 * getSeedLimitSet("ieee-519-2014-current")?.content.edition // "IEEE Std 519-2014"
 */
export function getSeedLimitSet(key: string): SeedLimitSet | undefined {
  const input = seedLimitSetInputs.find((set) => set.content.key === key);
  return input ? parseSeed(input) : undefined;
}
