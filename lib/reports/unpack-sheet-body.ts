import type { ComplianceAggregate, ComplianceRow, RowRuleResult } from "@/lib/compliance/result";
import type { PackedRuleResult, SheetBodyData, SheetBodyPayload } from "./sheet-body-data";

/**
 * The sheet body as its components read it, from the payload sheetBodyData sends: each rule result is
 * its shared part (by index) with its own values. O(rows × rules).
 *
 * @example unpackSheetBody(sheetBodyData(head, channel)).channel.rows[0]?.rowRules?.[0]?.label // "Daily 99th percentile of 3 s values < 2.0 × limit"
 */
export function unpackSheetBody(payload: SheetBodyPayload): SheetBodyData {
  const { ruleParts, channel, ...rest } = payload;
  const unpackRules = (rules: PackedRuleResult[] | undefined): RowRuleResult[] | undefined => rules?.map(({ part, ...own }) => ({ ...ruleParts[part]!, ...own }));
  const unpackRow = <T extends ComplianceRow | ComplianceAggregate>({ rowRules, ...row }: Omit<T, "rowRules"> & { rowRules?: PackedRuleResult[] }): T => {
    const rules = unpackRules(rowRules);
    return { ...row, ...(rules ? { rowRules: rules } : {}) } as T;
  };
  return {
    ...rest,
    channel: { ...channel, rows: channel.rows.map((r) => unpackRow<ComplianceRow>(r)), aggregates: channel.aggregates.map((a) => unpackRow<ComplianceAggregate>(a)) },
  };
}
