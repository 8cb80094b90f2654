// The caution shown on every page and printed on every rendering of a sheet (one text for both).
export const safetyText =
  "Ordwise results support, and do not replace, the judgement of a qualified engineer. Local electrical codes, " +
  "the utility's interconnection requirements and licensed practice take precedence. Work on energised " +
  "equipment only under your site's safety rules.";
