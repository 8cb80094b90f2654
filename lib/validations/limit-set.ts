// Bodies of the limit-set editor's requests, shared by the editor forms, the route handlers and
// the SWR hooks. Revision content itself is LimitSetRevisionContentSchema (lib/compliance/model).
import { z } from "zod";
import { formulaValueIssues } from "@/lib/compliance/check-formula-values";
import { LimitSetRevisionContentSchema } from "@/lib/compliance/model";
import { AppError } from "@/lib/errors";
import { multiLineText, singleLineText } from "./text";

export const limitSetKeySchema = z
  .string()
  .trim()
  .min(3, "Key needs at least 3 characters")
  .max(80, "Key is too long (max 80)")
  .regex(/^[a-z0-9]+(?:-[a-z0-9]+)*$/, "Key must be kebab-case: lower-case letters, digits and single hyphens")
  // `/api/limit-sets/import` is a route of its own.
  .refine((k) => k !== "import", "Key import is reserved");

export const limitSetNameSchema = singleLineText().trim().min(2, "Name needs at least 2 characters").max(160, "Name is too long (max 160)");

export const revisionReasonSchema = multiLineText({ error: "Give a reason for this revision" })
  .trim()
  .min(3, "Give a reason for this revision (at least 3 characters)")
  .max(1000, "Reason is too long (max 1000)");

/**
 * Revision content as it may be saved: the model, plus every limit its formulas give (for each
 * order they cover) finite and ≥ 0. Checked on save and import only, so a revision stored
 * before this check still evaluates (its bad values are "not evaluated", never a pass).
 */
export const SavableRevisionContentSchema = LimitSetRevisionContentSchema.superRefine((content, ctx) => {
  for (const issue of formulaValueIssues(content)) ctx.addIssue({ code: "custom", message: issue.message, path: issue.path });
});

/** PUT /api/limit-sets/[key]: a new revision of the set `key`; the content must keep the set's key. */
export function reviseLimitSetSchemaFor(key: string) {
  return z.object({
    content: SavableRevisionContentSchema.refine((c) => c.key === key, {
      message: `key must stay "${key}" (clone the set to make one with a new key)`,
      path: ["key"],
    }),
    reason: revisionReasonSchema,
  });
}

/** POST /api/limit-sets/[key]/clone: the new custom set's key and name. */
export const cloneLimitSetSchema = z.object({ key: limitSetKeySchema, name: limitSetNameSchema });

/**
 * POST /api/limit-sets/import: the export document `{ key, name, content }`, plus a reason
 * (required when the key exists already, because the import then makes a new revision).
 */
export const importLimitSetSchema = z
  .object({
    key: limitSetKeySchema,
    name: limitSetNameSchema,
    content: SavableRevisionContentSchema,
    reason: revisionReasonSchema.optional(),
  })
  .refine((doc) => doc.content.key === doc.key, { message: "content.key must equal key", path: ["content", "key"] });

export const revisionNumberSchema = z.coerce.number({ error: "Not a revision number" }).int("Not a revision number").min(1, "Not a revision number");

export type ReviseLimitSet = z.infer<ReturnType<typeof reviseLimitSetSchemaFor>>;
export type CloneLimitSet = z.infer<typeof cloneLimitSetSchema>;
export type ImportLimitSet = z.infer<typeof importLimitSetSchema>;

type PathPart = PropertyKey;

function at(value: unknown, part: PathPart): unknown {
  if (value === null || typeof value !== "object") return undefined;
  return (value as Record<PropertyKey, unknown>)[part as string];
}

const fieldNames: Record<string, string> = {
  from: "from",
  to: "to",
  limit: "limit",
  formula: "formula",
  capA: "cap (A)",
  capFormulaA: "cap formula (A)",
  iscOverIl: "Isc/IL",
  busVoltageV: "bus voltage (V)",
  rsce: "Rsce",
  ratedPowerW: "rated power (W)",
  phaseConfig: "phase configuration",
};

/**
 * A human location for a path into revision content, e.g.
 * `["bands", 0, "orderRows", 2, "formula"]` → `Band 'Class A', row 3: formula`.
 * `content` is the (possibly invalid) document the path points into.
 */
export function describeContentPath(content: unknown, path: readonly PathPart[]): string {
  const parts: string[] = [];
  let i = 0;
  if (path[0] === "bands" && typeof path[1] === "number") {
    const label = at(at(at(content, "bands"), path[1]), "label");
    parts.push(typeof label === "string" && label ? `Band '${label}'` : `Band ${path[1] + 1}`);
    i = 2;
    const section = path[2];
    if ((section === "orderRows" || section === "aggregates" || section === "conditions") && typeof path[3] === "number") {
      const noun = section === "orderRows" ? "row" : section === "aggregates" ? "aggregate" : "condition";
      const name = section === "aggregates" ? at(at(at(at(at(content, "bands"), path[1]), "aggregates"), path[3]), "name") : undefined;
      parts.push(typeof name === "string" ? `${noun} ${path[3] + 1} (${name})` : `${noun} ${path[3] + 1}`);
      i = 4;
    } else if (section === "applicability") {
      parts.push("applicability");
      i = 3;
    }
  }
  const rest = path.slice(i).map((p) => (typeof p === "number" ? String(p + 1) : fieldNames[String(p)] ?? String(p)));
  const head = parts.join(", ");
  if (rest.length === 0) return head;
  return head ? `${head}: ${rest.join(".")}` : rest.join(".");
}

function plainMessage(issue: z.core.$ZodIssue, content: unknown): string {
  // zod's default wording ("Invalid input: expected number, received NaN") reads poorly in a form.
  if (issue.code === "invalid_type" && issue.message.startsWith("Invalid input")) return `must be ${issue.expected === "number" ? "a number" : `a ${issue.expected}`}`;
  // The model counts rows from 0; the editor shows them from 1 and already names the band.
  const overlap = /^order (\d+) is covered by rows (\d+) and (\d+) of band /.exec(issue.message);
  if (overlap) return `order ${overlap[1]} is also covered by row ${Number(overlap[2]) + 1}`;
  // A formula's syntax error quotes the formula; the location already says which one.
  const formula = issue.path.reduce<unknown>((v, p) => at(v, p), content);
  if (typeof formula === "string") {
    const prefix = `formula "${formula}": `;
    if (issue.message.startsWith(prefix)) return issue.message.slice(prefix.length);
  }
  return issue.message;
}

/**
 * Field errors for a zod error over a request body, keyed by dotted path as usual, but with
 * messages that name the band, row and field an admin has to fix
 * (`Band 'Isc/IL < 20', row 3: formula: unexpected ")" at position 7`).
 * `contentKey` is where the revision content sits in the body ("content", or "" for bare content).
 */
export function labelledFieldErrors(error: z.ZodError, body: unknown, contentKey = "content"): Record<string, string[]> {
  const out: Record<string, string[]> = {};
  const content = contentKey ? at(body, contentKey) : body;
  for (const issue of error.issues) {
    const inContent = contentKey === "" || issue.path[0] === contentKey;
    const inner = contentKey && inContent ? issue.path.slice(1) : issue.path;
    // Outside the content (reason, key, name) the message already says which field it is about.
    const where = inContent ? describeContentPath(content, inner) : "";
    const message = plainMessage({ ...issue, path: inner } as z.core.$ZodIssue, inContent ? content : body);
    const key = issue.path.map(String).join(".") || "_";
    (out[key] ??= []).push(where ? `${where}: ${message}` : message);
  }
  return out;
}

/** Every message of a field-error map, in path order, for a summary list. */
export function allMessages(fieldErrors: Record<string, string[]>): string[] {
  return Object.values(fieldErrors).flat();
}

/**
 * Parses a request body with `schema`; on failure throws a 422 AppError whose field errors name
 * band, row and field (see labelledFieldErrors).
 */
export function parseLimitSetBody<T extends z.ZodType>(schema: T, body: unknown, contentKey = "content"): z.infer<T> {
  const result = schema.safeParse(body);
  if (result.success) return result.data;
  throw new AppError("validation", "Some fields need attention.", labelledFieldErrors(result.error, body, contentKey));
}
