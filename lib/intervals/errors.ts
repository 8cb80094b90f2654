/** One problem in an interval log, located by 1-based line and (where relevant) column header. */
export interface IntervalLogIssue {
  line: number;
  column?: string;
  message: string;
}

/**
 * A hard input error in an interval log or its mapping. `message` is one line naming the first
 * problem's line and column; `issues` lists up to 20 problems.
 */
export class IntervalLogError extends Error {
  readonly issues: IntervalLogIssue[];
  constructor(issues: IntervalLogIssue[]) {
    const first = issues[0] ?? { line: 0, message: "invalid interval log" };
    const where = `line ${first.line}${first.column !== undefined ? `, column "${first.column}"` : ""}`;
    const more = issues.length > 1 ? ` (and ${issues.length - 1} more problem${issues.length > 2 ? "s" : ""})` : "";
    super(`${where}: ${first.message}${more}`);
    this.name = "IntervalLogError";
    this.issues = issues;
  }
}
