// Which text encoding a CSV export uses, decided once from the first bytes of the file, so the
// preview and the analysis read the same characters.

/** The encodings exports come in (WHATWG Encoding Standard labels, as TextDecoder takes them). */
export type TextEncodingName = "utf-8" | "utf-16le" | "utf-16be" | "windows-1252";

/**
 * Detects the encoding from the head of a file: a byte-order mark says UTF-8 (EF BB BF), UTF-16 LE
 * (FF FE) or UTF-16 BE (FE FF) — Unicode Standard 15.0, §23.8 "Specials", U+FEFF; without one,
 * text where every other byte is zero is UTF-16 (ASCII digits and delimiters with a zero high
 * byte), text that decodes as UTF-8 is UTF-8, and anything else is Windows-1252 (the Latin-1
 * superset older instruments write: "µ" is byte B5).
 *
 * Complexity O(head length).
 *
 * @param head the first bytes of the file (e.g. 256 KB); a multi-byte character cut at its end is tolerated.
 * @example
 * detectEncoding(new Uint8Array([0x5a, 0x65, 0x69, 0x74, 0x20, 0x28, 0xb5, 0x73, 0x29])) // "windows-1252" ("Zeit (µs)")
 * detectEncoding(new Uint8Array([0xff, 0xfe, 0x74, 0x00]))                               // "utf-16le"
 */
export function detectEncoding(head: Uint8Array): TextEncodingName {
  if (head[0] === 0xef && head[1] === 0xbb && head[2] === 0xbf) return "utf-8";
  if (head[0] === 0xff && head[1] === 0xfe) return "utf-16le";
  if (head[0] === 0xfe && head[1] === 0xff) return "utf-16be";
  const sample = head.subarray(0, Math.min(head.length, 4096) & ~1);
  if (sample.length >= 4) {
    let zeroEven = 0;
    let zeroOdd = 0;
    for (let i = 0; i < sample.length; i += 2) {
      if (sample[i] === 0) zeroEven++;
      if (sample[i + 1] === 0) zeroOdd++;
    }
    const pairs = sample.length / 2;
    if (zeroOdd > 0.9 * pairs && zeroEven === 0) return "utf-16le";
    if (zeroEven > 0.9 * pairs && zeroOdd === 0) return "utf-16be";
  }
  // A head cut inside a multi-byte character: drop up to 3 trailing bytes of an unfinished sequence.
  let end = head.length;
  for (let back = 1; back <= 3 && end - back >= 0; back++) {
    const byte = head[end - back]!;
    if ((byte & 0xc0) === 0x80) continue; // continuation byte: keep looking for the lead byte
    if (byte >= 0xc0) {
      const needed = byte >= 0xf0 ? 4 : byte >= 0xe0 ? 3 : 2;
      if (back < needed) end -= back;
    }
    break;
  }
  try {
    new TextDecoder("utf-8", { fatal: true }).decode(head.subarray(0, end));
    return "utf-8";
  } catch {
    return "windows-1252";
  }
}
