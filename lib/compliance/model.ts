// The limit-set model. One revision's content is a single JSON document validated by
// LimitSetRevisionContentSchema (the database stores it as jsonb); everything the evaluator
// needs — bands, rows, aggregates, boundary choices and rules — is data in that document.
import { z } from "zod";
import { PARITIES, orderMatchesParity } from "./order-matches-parity";
import { FormulaSyntaxError, parseFormula, type FormulaVariable } from "./parse-formula";

export const QuantitySchema = z.enum(["current", "voltage"]);

/**
 * What a limit number means.
 * - `A`: amperes r.m.s.; `mA/W`: milliamperes per watt of rated power (limit A = value × P / 1000)
 * - `%I1` / `%V1`: percent of the measured fundamental of the same channel
 * - `%IL`: percent of the maximum demand load current IL (IEEE 519)
 * - `%Iref`: percent of the reference current Iref (IEC 61000-3-12)
 * - `%Vnom`: percent of the nominal (rated) voltage of the measured channel
 */
export const BasisSchema = z.enum(["A", "mA/W", "%I1", "%V1", "%IL", "%Iref", "%Vnom"]);

/**
 * Which orders of a from..to range a row covers. `triplen` = odd multiples of 3 (3, 9, 15, …,
 * the usual power-system meaning); `non-triplen-odd` = odd and not a multiple of 3.
 */
export const ParitySchema = z.enum(PARITIES);

export const PhaseConfigSchema = z.enum(["single-phase", "balanced-three-phase", "other"]);

export const AggregateNameSchema = z.enum(["THD", "TDD", "THC", "PWHC", "PWHD", "POHC"]);

const SourceSchema = z.string().min(1);

function formulaIssue(formula: string, forbidden: FormulaVariable[] = []): string | null {
  try {
    const compiled = parseFormula(formula);
    const bad = compiled.variables.filter((name) => forbidden.includes(name));
    return bad.length > 0 ? `formula "${formula}" may not use ${bad.join(", ")} here` : null;
  } catch (error) {
    if (error instanceof FormulaSyntaxError) return error.message;
    throw error;
  }
}

/** A formula string validated at parse time (e.g. `0.15*15/h`). */
export const FormulaSchema = z.string().superRefine((formula, ctx) => {
  const issue = formulaIssue(formula);
  if (issue) ctx.addIssue({ code: "custom", message: issue });
});

/**
 * A numeric interval with explicit boundary handling. Printed tables often leave a value
 * exactly at a bound unassigned ("20 < 50"); `boundaryRule` records the choice made, and the
 * evaluator quotes it when a value falls exactly on a bound.
 */
export const RangeSchema = z
  .object({
    min: z.number().optional(),
    max: z.number().optional(),
    minInclusive: z.boolean().default(true),
    maxInclusive: z.boolean().default(false),
    boundaryRule: z.string().optional(),
  })
  .refine((r) => r.min === undefined || r.max === undefined || r.min <= r.max, {
    message: "range min must not exceed max",
  });

/** Where a band applies. Every given criterion must hold; an absent criterion always holds. */
export const ApplicabilitySchema = z.object({
  /** Isc/IL at the PCC (IEEE 519). */
  iscOverIl: RangeSchema.optional(),
  /** Nominal bus (system, line-to-line) voltage at the PCC in volts (IEEE 519). */
  busVoltageV: RangeSchema.optional(),
  /** Short-circuit ratio Rsce (IEC 61000-3-12); `min` is the table's "minimum Rsce" row. */
  rsce: RangeSchema.optional(),
  /** Rated (specified) power in watts (IEC 61000-3-2 Class C/D). */
  ratedPowerW: RangeSchema.optional(),
  phaseConfig: z.array(PhaseConfigSchema).min(1).optional(),
});

/** Limit for one order or a range of orders. Exactly one of `limit` / `formula`. */
export const OrderRowSchema = z
  .object({
    from: z.number().int().min(1).max(100),
    to: z.number().int().min(1).max(100),
    parity: ParitySchema.default("all"),
    /** The limit in the unit of `basis`. */
    limit: z.number().nonnegative().optional(),
    /** A formula of h, P, lambda giving the limit in the unit of `basis`. */
    formula: FormulaSchema.optional(),
    basis: BasisSchema,
    /** Absolute cap in amperes: the applied limit is min(limit, cap) (IEC 61000-3-2 Class D). */
    capA: z.number().positive().optional(),
    capFormulaA: FormulaSchema.optional(),
    note: z.string().optional(),
    source: SourceSchema.optional(),
  })
  .refine((row) => row.from <= row.to, { message: "row from must not exceed to" })
  .refine((row) => (row.limit === undefined) !== (row.formula === undefined), {
    message: "an order row needs exactly one of limit or formula",
  })
  .refine((row) => !(row.capA !== undefined && row.capFormulaA !== undefined), {
    message: "an order row takes at most one of capA or capFormulaA",
  });

/** Limit on a summary quantity computed from the per-order values. */
export const AggregateRowSchema = z
  .object({
    name: AggregateNameSchema,
    /** Orders summed: sqrt(Σ w_h · X_h²) over from..to with the given parity. */
    from: z.number().int().min(2).max(100),
    to: z.number().int().min(2).max(100),
    parity: ParitySchema.default("all"),
    /** `order`: w_h = h (PWHC, PWHD); `none`: w_h = 1. */
    weighting: z.enum(["none", "order"]).default("none"),
    basis: BasisSchema,
    limit: z.number().nonnegative().optional(),
    /** Formula of P and lambda (not h). */
    formula: FormulaSchema.optional(),
    /** Limit = the same sum applied to the band's per-order limits in amperes (IEC 61000-3-2 POHC). */
    fromOrderLimits: z.boolean().optional(),
    /**
     * `requirement`: part of the verdict. `allowance-condition`: only decides whether an
     * allowance (see rules.pohcAllowance) may be used; reported but not itself a pass/fail.
     */
    role: z.enum(["requirement", "allowance-condition"]).default("requirement"),
    note: z.string().optional(),
    source: SourceSchema.optional(),
  })
  .refine((a) => a.from <= a.to, { message: "aggregate from must not exceed to" })
  .refine(
    (a) => [a.limit !== undefined, a.formula !== undefined, a.fromOrderLimits === true].filter(Boolean).length === 1,
    { message: "an aggregate needs exactly one of limit, formula or fromOrderLimits" },
  )
  .superRefine((a, ctx) => {
    const issue = a.formula === undefined ? null : formulaIssue(a.formula, ["h"]);
    if (issue) ctx.addIssue({ code: "custom", message: issue, path: ["formula"] });
  });

/** A condition the evaluator cannot check from harmonic magnitudes; the user may assert it by id. */
export const BandConditionSchema = z.object({
  id: z.string().min(1),
  text: z.string().min(1),
  source: SourceSchema.optional(),
});

export const BandSchema = z.object({
  label: z.string().min(1),
  description: z.string().optional(),
  applicability: ApplicabilitySchema.default({}),
  /** Bands sharing a group are alternatives: complying with any one option is enough. */
  option: z.object({ group: z.string().min(1), label: z.string().min(1) }).optional(),
  /** IEEE 519 note (c): power-generation equipment uses this band regardless of Isc/IL. */
  generatorBand: z.boolean().optional(),
  /** No limits apply in this band (e.g. IEC 61000-3-2 equipment ≤ 75 W other than lighting). */
  exempt: z.boolean().optional(),
  conditions: z.array(BandConditionSchema).default([]),
  orderRows: z.array(OrderRowSchema).default([]),
  aggregates: z.array(AggregateRowSchema).default([]),
  source: SourceSchema.optional(),
});

/** Disregard small currents (IEC 61000-3-2): below max(percent × input r.m.s. current, minimumA). */
export const ThresholdRuleSchema = z.object({
  percentOfInputCurrent: z.number().nonnegative(),
  minimumA: z.number().nonnegative(),
  source: SourceSchema,
});

/** Linear interpolation between successive rows of a band variable (IEC 61000-3-12 Rsce). */
export const InterpolationRuleSchema = z.object({
  variable: z.literal("rsce"),
  method: z.literal("linear"),
  /** Used unless the evaluation context sets `interpolate: false`. */
  defaultOn: z.boolean().default(true),
  source: SourceSchema,
});

/** IEC 61000-3-2 POHC allowance: listed orders may exceed their limit by `factor` if the POHC aggregate passes. */
export const PohcAllowanceRuleSchema = z.object({
  from: z.number().int(),
  to: z.number().int(),
  parity: ParitySchema.default("odd"),
  factor: z.number().min(1),
  aggregate: AggregateNameSchema.default("POHC"),
  source: SourceSchema,
});

/**
 * IEC 61000-3-2 Class A relaxation of the 150 % rule (from memory): every 1.5 s smoothed value may
 * reach `multiplier` × the limit (200 %) if the excursions above the rule's own multiplier last
 * less than `maxExcursionFraction` of the observation period or `maxExcursionS` in aggregate,
 * whichever is smaller, and the observation-period average is below `averageBelowFraction` × the
 * limit. Data, off unless `enabled`.
 */
export const TimeRuleRelaxationSchema = z.object({
  enabled: z.boolean(),
  multiplier: z.number().positive(),
  maxExcursionFraction: z.number().min(0).max(1),
  maxExcursionS: z.number().nonnegative(),
  averageBelowFraction: z.number().positive(),
  source: SourceSchema,
});

/** Which values a time rule takes its statistic over (seconds; see TimeRuleSchema.intervalS). */
export const TimeRuleIntervalSchema = z.union([z.literal(0), z.literal(1.5), z.literal(3), z.literal(600)]);

/**
 * A statistical / time rule of a standard, applied to time series of per-order and aggregate
 * values (10/12-cycle windows of an analysis, or the values of an interval log):
 * statistic(values of `intervalS` over each accumulation period) compared with
 * `multiplier` × the band's limit.
 *
 * `intervalS`: 0 = the 10/12-cycle window values; 1.5 = the window values after the IEC 61000-4-7
 * 1.5 s smoothing filter; 3 = 150/180-cycle (very short) values; 600 = 10-minute (short) values.
 * `accumulationS`: consecutive periods from the record start (86400 daily, 604800 weekly); the
 * worst period decides; absent = the whole observation period. `minimumDurationS`: shortest record
 * the rule is evaluated on — shorter gives `not-evaluated` naming this minimum; a record shorter
 * than `accumulationS` but at least this long is evaluated over what it has, with a note.
 */
export const TimeRuleSchema = z
  .object({
    id: z.string().regex(/^[a-z0-9]+(?:-[a-z0-9]+)*$/, "time rule id must be kebab-case"),
    label: z.string().min(1),
    statistic: z.enum(["mean", "max", "percentile"]),
    /** Required for `percentile` (nearest-rank definition). */
    percentile: z.number().min(0).max(100).optional(),
    intervalS: TimeRuleIntervalSchema,
    multiplier: z.number().positive(),
    accumulationS: z.number().positive().optional(),
    minimumDurationS: z.number().nonnegative().default(0),
    appliesTo: z.enum(["orders", "aggregates", "all"]).default("all"),
    /** Restrict the rule to these aggregates (default: every aggregate of the band). */
    aggregates: z.array(AggregateNameSchema).optional(),
    /** Overrides rules.comparison for this rule (e.g. IEEE 519 "shall be less than"). */
    passAtLimit: z.boolean().optional(),
    /** Apply rules.pohcAllowance to this rule's statistic (IEC 61000-3-2 odd orders 21–39). */
    pohcAllowance: z.boolean().optional(),
    relaxation: TimeRuleRelaxationSchema.optional(),
    note: z.string().optional(),
    source: SourceSchema.optional(),
  })
  .refine((rule) => (rule.statistic === "percentile") === (rule.percentile !== undefined), {
    message: "a percentile time rule needs `percentile`, and only a percentile rule may have one",
  })
  .refine((rule) => rule.relaxation === undefined || rule.statistic === "max", {
    message: "only a max time rule may have a relaxation",
  });

export const RulesSchema = z.object({
  /** How a measured value exactly at the limit is judged. */
  comparison: z
    .object({ passAtLimit: z.boolean(), source: SourceSchema })
    .default({ passAtLimit: true, source: "measured ≤ limit passes" }),
  threshold: ThresholdRuleSchema.optional(),
  interpolation: InterpolationRuleSchema.optional(),
  pohcAllowance: PohcAllowanceRuleSchema.optional(),
  timeRules: z.array(TimeRuleSchema).optional(),
});

/** One revision of a limit set: meta, bands (each with its rows and aggregates) and rules. */
export const LimitSetRevisionContentSchema = z
  .object({
    key: z.string().regex(/^[a-z0-9]+(?:-[a-z0-9]+)*$/, "key must be kebab-case"),
    standard: z.string().min(1),
    edition: z.string().min(1),
    scope: z.string().min(1),
    description: z.string().min(1),
    quantity: QuantitySchema,
    appliesTo: z.string().min(1),
    /**
     * Interpretation choices of this limit set in plain words (e.g. which Isc/IL row a value on a
     * bound uses, which range h2 falls in, the Iref fallback), listed once on the sheet's and the
     * PDF's notes. No provenance markers here: per-row sources stay on the rows and rules.
     */
    notes: z.array(z.string().min(1)).optional(),
    bands: z.array(BandSchema).min(1),
    rules: RulesSchema.default({ comparison: { passAtLimit: true, source: "measured ≤ limit passes" } }),
  })
  .superRefine((content, ctx) => {
    const ruleIds = new Set<string>();
    (content.rules.timeRules ?? []).forEach((rule, ruleIndex) => {
      if (ruleIds.has(rule.id)) {
        ctx.addIssue({ code: "custom", message: `duplicate time rule id "${rule.id}"`, path: ["rules", "timeRules", ruleIndex, "id"] });
      }
      ruleIds.add(rule.id);
      if (rule.pohcAllowance && !content.rules.pohcAllowance) {
        ctx.addIssue({
          code: "custom",
          message: `time rule "${rule.id}" uses the POHC allowance but rules.pohcAllowance is not set`,
          path: ["rules", "timeRules", ruleIndex, "pohcAllowance"],
        });
      }
    });
    const labels = new Set<string>();
    content.bands.forEach((band, bandIndex) => {
      if (labels.has(band.label)) {
        ctx.addIssue({ code: "custom", message: `duplicate band label "${band.label}"`, path: ["bands", bandIndex] });
      }
      labels.add(band.label);
      const covered = new Map<number, number>();
      band.orderRows.forEach((row, rowIndex) => {
        for (let h = row.from; h <= row.to; h += 1) {
          if (!orderMatchesParity(h, row.parity)) continue;
          const previous = covered.get(h);
          if (previous !== undefined) {
            ctx.addIssue({
              code: "custom",
              message: `order ${h} is covered by rows ${previous} and ${rowIndex} of band "${band.label}"`,
              path: ["bands", bandIndex, "orderRows", rowIndex],
            });
          }
          covered.set(h, rowIndex);
        }
      });
      const names = new Set<string>();
      band.aggregates.forEach((aggregate, aggregateIndex) => {
        if (names.has(aggregate.name)) {
          ctx.addIssue({
            code: "custom",
            message: `duplicate aggregate ${aggregate.name} in band "${band.label}"`,
            path: ["bands", bandIndex, "aggregates", aggregateIndex],
          });
        }
        names.add(aggregate.name);
      });
      if (band.exempt && (band.orderRows.length > 0 || band.aggregates.length > 0)) {
        ctx.addIssue({ code: "custom", message: `exempt band "${band.label}" must not have limits`, path: ["bands", bandIndex] });
      }
    });
  });

/** Evaluation context: facts about the site or product that the limits depend on. */
export const EvaluationContextSchema = z.object({
  /** Maximum short-circuit current at the PCC, A (IEEE 519). */
  iscA: z.number().positive().optional(),
  /** Maximum demand load current (fundamental) at the PCC, A (IEEE 519). */
  ilA: z.number().positive().optional(),
  /** Reference current, A (IEC 61000-3-12); defaults to the channel's measured r.m.s. current. */
  irefA: z.number().positive().optional(),
  /** Short-circuit ratio (IEC 61000-3-12). */
  rsce: z.number().positive().optional(),
  /** Rated (specified) power, W (IEC 61000-3-2 Class C/D). */
  ratedPowerW: z.number().positive().optional(),
  /** Circuit power factor λ (IEC 61000-3-2 Class C); defaults to the measured true power factor. */
  lambda: z.number().min(0).max(1).optional(),
  /** Nominal voltage of the measured voltage channels, V (basis %Vnom). */
  nominalVoltageV: z.number().positive().optional(),
  /** Nominal system (line-to-line) voltage at the PCC, V — chooses the IEEE 519 table. */
  busVoltageV: z.number().positive().optional(),
  /** Where busVoltageV came from: given as such, or taken from the system's nominal voltage (stated on the sheet). */
  busVoltageSource: z.enum(["given", "system-nominal"]).optional(),
  phaseConfig: PhaseConfigSchema.optional(),
  /** IEEE 519 note (c): power-generation equipment uses the first row regardless of Isc/IL. */
  isGenerator: z.boolean().optional(),
  /** Set false to use the lower Rsce row instead of interpolating (where a set permits it). */
  interpolate: z.boolean().optional(),
  /** Ids of band conditions the user asserts to hold (e.g. IEC 61000-3-12 Table 4 conditions). */
  assertedConditions: z.array(z.string()).optional(),
});

export type Quantity = z.infer<typeof QuantitySchema>;
export type Basis = z.infer<typeof BasisSchema>;
export type Parity = z.infer<typeof ParitySchema>;
export type PhaseConfig = z.infer<typeof PhaseConfigSchema>;
export type AggregateName = z.infer<typeof AggregateNameSchema>;
export type Range = z.infer<typeof RangeSchema>;
export type Applicability = z.infer<typeof ApplicabilitySchema>;
export type OrderRow = z.infer<typeof OrderRowSchema>;
export type AggregateRow = z.infer<typeof AggregateRowSchema>;
export type BandCondition = z.infer<typeof BandConditionSchema>;
export type Band = z.infer<typeof BandSchema>;
export type ThresholdRule = z.infer<typeof ThresholdRuleSchema>;
export type InterpolationRule = z.infer<typeof InterpolationRuleSchema>;
export type PohcAllowanceRule = z.infer<typeof PohcAllowanceRuleSchema>;
export type TimeRule = z.infer<typeof TimeRuleSchema>;
export type TimeRuleInput = z.input<typeof TimeRuleSchema>;
export type TimeRuleRelaxation = z.infer<typeof TimeRuleRelaxationSchema>;
export type Rules = z.infer<typeof RulesSchema>;
export type LimitSetRevisionContent = z.infer<typeof LimitSetRevisionContentSchema>;
/** Shapes as written by hand (defaults not yet applied), e.g. in the seed files. */
export type LimitSetRevisionContentInput = z.input<typeof LimitSetRevisionContentSchema>;
export type BandInput = z.input<typeof BandSchema>;
export type OrderRowInput = z.input<typeof OrderRowSchema>;
export type AggregateRowInput = z.input<typeof AggregateRowSchema>;
export type RangeInput = z.input<typeof RangeSchema>;
export type RulesInput = z.input<typeof RulesSchema>;
export type EvaluationContext = z.infer<typeof EvaluationContextSchema>;
