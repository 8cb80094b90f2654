// Recognises binary files by their first bytes, so a picture, archive, document or program uploaded
// under a .csv name is refused at confirmation instead of waiting as "Needs mapping". Pure.

export type BinaryKind = "PNG image" | "JPEG image" | "GIF image" | "ZIP archive (or Office document)" | "gzip archive" | "PDF document" | "Windows executable" | "ELF executable" | "Mach-O executable" | "binary data";

const signatures: { kind: BinaryKind; bytes: number[] }[] = [
  // Magic numbers: PNG (ISO/IEC 15948:2004 §5.2), ZIP local header "PK\x03\x04" (PKWARE APPNOTE §4.3.7),
  // PDF "%PDF-" (ISO 32000-1:2008 §7.5.2), gzip 1F 8B (RFC 1952 §2.3.1), JPEG SOI FF D8 FF, GIF "GIF8";
  // executables: "MZ" (DOS/PE), 7F "ELF", Mach-O FE ED FA CE/CF and their byte-swapped forms (common practice, no source).
  { kind: "PNG image", bytes: [0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a] },
  { kind: "JPEG image", bytes: [0xff, 0xd8, 0xff] },
  { kind: "GIF image", bytes: [0x47, 0x49, 0x46, 0x38] },
  { kind: "ZIP archive (or Office document)", bytes: [0x50, 0x4b, 0x03, 0x04] },
  { kind: "ZIP archive (or Office document)", bytes: [0x50, 0x4b, 0x05, 0x06] },
  { kind: "gzip archive", bytes: [0x1f, 0x8b] },
  { kind: "PDF document", bytes: [0x25, 0x50, 0x44, 0x46, 0x2d] },
  { kind: "Windows executable", bytes: [0x4d, 0x5a] },
  { kind: "ELF executable", bytes: [0x7f, 0x45, 0x4c, 0x46] },
  { kind: "Mach-O executable", bytes: [0xfe, 0xed, 0xfa, 0xce] },
  { kind: "Mach-O executable", bytes: [0xfe, 0xed, 0xfa, 0xcf] },
  { kind: "Mach-O executable", bytes: [0xce, 0xfa, 0xed, 0xfe] },
  { kind: "Mach-O executable", bytes: [0xcf, 0xfa, 0xed, 0xfe] },
];

/**
 * What binary format `head` (the first bytes of a file, a few KB) starts with, or null when it may
 * be text. A file starting with a UTF-16 byte-order mark is text (the importer decodes it); otherwise
 * any NUL byte counts as binary data (UTF-8 and Windows-1252 text never holds one).
 * O(n) in `head.length`.
 *
 * @example sniffBinary(new TextEncoder().encode("t,I\n0,1\n")) // null
 * @example sniffBinary(Uint8Array.of(0x25, 0x50, 0x44, 0x46, 0x2d, 0x31)) // "PDF document"
 */
export function sniffBinary(head: Uint8Array): BinaryKind | null {
  for (const s of signatures) {
    if (head.length >= s.bytes.length && s.bytes.every((b, i) => head[i] === b)) return s.kind;
  }
  // UTF-16 LE (FF FE) or BE (FE FF) byte-order mark (Unicode Standard §3.10): text with NUL high/low bytes.
  if (head.length >= 2 && ((head[0] === 0xff && head[1] === 0xfe) || (head[0] === 0xfe && head[1] === 0xff))) return null;
  return head.includes(0) ? "binary data" : null;
}
