// The one line a sheet and its PDF print about the limits used and whether they were checked.

export interface RevisionVerification {
  /** The printed edition the verifier held, e.g. "IEC 61000-3-2:2018". */
  edition: string;
  /** The clause or table checked, e.g. "Table 1". */
  checked: string;
  verifiedByName: string;
  /** YYYY-MM-DD. */
  verifiedOn: string;
}

/** What the limits line is made from: the limit set's standard and edition, its revision, and the verification if any. */
export interface LimitsLineInput {
  standard: string;
  edition: string;
  revisionNumber: number;
  verification: RevisionVerification | null;
}

export interface LimitsLine {
  verified: boolean;
  text: string;
}

/** "Ines Marlowe" → "I. Marlowe"; a single name stays as it is. */
function shortName(name: string): string {
  const parts = name.trim().split(/\s+/);
  if (parts.length < 2) return name.trim();
  return `${parts.slice(0, -1).map((p) => `${p[0]!.toUpperCase()}.`).join(" ")} ${parts.at(-1)}`;
}

/**
 * The limits line of a sheet: which edition and table, which revision, and who verified it against
 * the printed edition when — or a warning that nobody has yet.
 *
 * @example
 * limitsLine({ standard: "IEC 61000-3-2", edition: "Edition 5.0 (2018)", revisionNumber: 3,
 *   verification: { edition: "IEC 61000-3-2:2018", checked: "Table 1", verifiedByName: "Ines Marlowe", verifiedOn: "2026-12-03" } }).text
 * // "Limits: IEC 61000-3-2:2018 Table 1, revision 3, verified against the printed edition by I. Marlowe on 2026-12-03"
 */
export function limitsLine({ standard, edition, revisionNumber, verification }: LimitsLineInput): LimitsLine {
  if (verification) {
    return {
      verified: true,
      text: `Limits: ${verification.edition} ${verification.checked}, revision ${revisionNumber}, verified against the printed edition by ${shortName(verification.verifiedByName)} on ${verification.verifiedOn}`,
    };
  }
  return {
    verified: false,
    text: `Limits: ${standard}, ${edition}, revision ${revisionNumber} — not yet verified against the printed standard. Check the limit values against your copy of the standard before relying on this sheet.`,
  };
}
