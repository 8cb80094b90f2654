// The sheet PDF's palette (the app's, in hex for pdfkit).

export const pdfColours = {
  ink: "#1d2a3a",
  soft: "#3c4b5e",
  muted: "#6b788a",
  line: "#ddd6ca",
  copper: "#b4582a",
  pass: "#1f7a4d",
  passLight: "#dcefe4",
  fail: "#b3261e",
  failLight: "#f7dcd9",
  caution: "#8a6100",
  cautionLight: "#f8ecc9",
  idle: "#5d6b7c",
  idleLight: "#e6e9ee",
} as const;

/** Text and background colour of a verdict ("pass", "fail", "incomplete", anything else as idle). */
export function verdictColours(verdict: string): { fg: string; bg: string } {
  if (verdict === "pass") return { fg: pdfColours.pass, bg: pdfColours.passLight };
  if (verdict === "fail") return { fg: pdfColours.fail, bg: pdfColours.failLight };
  if (verdict === "incomplete") return { fg: pdfColours.caution, bg: pdfColours.cautionLight };
  return { fg: pdfColours.idle, bg: pdfColours.idleLight };
}
