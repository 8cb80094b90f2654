// IEC 61000-3-2 POHC allowance — the one copy, used for the capture-mean comparison and for
// each time rule that carries `pohcAllowance`.
import { formatNumber as fmt } from "./format-number";
import { judge } from "./judge";
import type { PohcAllowanceRule } from "./model";
import { orderMatchesParity } from "./order-matches-parity";
import type { ComplianceAggregate } from "./result";

/** What the allowance decided for one failing comparison. */
export interface PohcAllowanceDecision {
  verdict: "pass" | "fail" | "not-evaluated";
  /** Table limit × factor: the limit the value was allowed up to. */
  allowedLimit: number;
  reason: string;
}

/**
 * IEC 61000-3-2 POHC allowance (from memory): an order in the allowance's range (odd 21–39)
 * that exceeds its limit passes if it is within factor × the limit, the measured POHC passes,
 * and every other rule of the order passes (`othersNotPassing` lists those that did not).
 * Returns null when the allowance does not concern this comparison (order out of range, not a
 * fail, or beyond factor × the limit). O(aggregates).
 *
 * @example
 * pohcAllowance({ order: 21, measured: 0.12, tableLimit: 0.1071, othersNotPassing: [] }, aggregates, rule)
 * // { verdict: "pass", allowedLimit: 0.1607, reason: "exceeds the limit but is within 150 % of it; POHC … allowance applies (…)" }
 */
export function pohcAllowance(
  comparison: { order: number; measured: number; tableLimit: number; verdict: string; othersNotPassing: string[] },
  aggregates: ComplianceAggregate[],
  allowance: PohcAllowanceRule | undefined,
): PohcAllowanceDecision | null {
  if (!allowance) return null;
  const { order, measured, tableLimit } = comparison;
  if (comparison.verdict !== "fail" || order < allowance.from || order > allowance.to || !orderMatchesParity(order, allowance.parity)) return null;
  const allowedLimit = tableLimit * allowance.factor;
  if (judge(measured, allowedLimit, true) === "fail") return null;
  const text = `exceeds the limit but is within ${allowance.factor * 100} % of it`;
  if (comparison.othersNotPassing.length > 0) {
    return { verdict: "fail", allowedLimit, reason: `${text}, but ${comparison.othersNotPassing.join(", ")} did not pass, so the ${allowance.aggregate} allowance does not apply` };
  }
  const pohc = aggregates.find((aggregate) => aggregate.name === allowance.aggregate);
  if (pohc?.verdict === "pass") {
    return {
      verdict: "pass",
      allowedLimit,
      reason: `${text}; ${allowance.aggregate} ${fmt(pohc.measured)} A ≤ ${fmt(pohc.limit)} A and every other rule passes: allowance applies`,
    };
  }
  if (pohc?.verdict === "not-evaluated") {
    return { verdict: "not-evaluated", allowedLimit, reason: `${text}; the ${allowance.aggregate} allowance could not be checked (${pohc.reason ?? ""})` };
  }
  return { verdict: "fail", allowedLimit, reason: `${text} but ${allowance.aggregate} exceeds its limit, so the allowance does not apply` };
}
