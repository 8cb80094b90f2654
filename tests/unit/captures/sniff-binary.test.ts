import { describe, expect, it } from "vitest";
import { sniffBinary } from "@/lib/captures/sniff-binary";

const bytes = (...b: number[]) => Uint8Array.from(b);
const text = (s: string) => new TextEncoder().encode(s);

describe("sniffBinary", () => {
  it.each([
    // PNG signature: ISO/IEC 15948:2004 (PNG), §5.2.
    ["PNG image", bytes(0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, 0, 0, 0, 13)],
    // Local file header signature 0x04034b50: PKWARE .ZIP File Format Specification (APPNOTE), §4.3.7.
    ["ZIP archive (or Office document)", text("PK\u0003\u0004rest")],
    // File header "%PDF-1.7": ISO 32000-1:2008, §7.5.2.
    ["PDF document", text("%PDF-1.7\n")],
    // "MZ" DOS header of PE files (common practice, no source).
    ["Windows executable", text("MZ\u0090\u0000")],
    // 0x7F 'E' 'L' 'F' (common practice, no source).
    ["ELF executable", bytes(0x7f, 0x45, 0x4c, 0x46, 2, 1, 1)],
    // gzip ID1 ID2 = 31, 139: RFC 1952, §2.3.1.
    ["gzip archive", bytes(0x1f, 0x8b, 8, 0)],
  ])("recognises a %s", (kind, head) => {
    expect(sniffBinary(head)).toBe(kind);
  });

  it("calls a NUL byte without a UTF-16 byte-order mark binary data", () => {
    expect(sniffBinary(bytes(0x74, 0x00, 0x2c, 0x00))).toBe("binary data");
  });

  it("lets UTF-16 text with its byte-order mark through (LE FF FE, BE FE FF; Unicode Standard §3.10)", () => {
    expect(sniffBinary(bytes(0xff, 0xfe, 0x74, 0x00, 0x2c, 0x00))).toBeNull();
    expect(sniffBinary(bytes(0xfe, 0xff, 0x00, 0x74, 0x00, 0x2c))).toBeNull();
  });

  it("lets CSV text through, in UTF-8 with BOM and in Latin-1", () => {
    expect(sniffBinary(text("\ufeffTime (s);I (A)\n0,000;1,5\n"))).toBeNull();
    expect(sniffBinary(bytes(0x54, 0x3b, 0xb5, 0x41, 0x0a))).toBeNull();
    // A CSV whose first column header starts with "MZ" would be misread; exports start with a time or header word.
    expect(sniffBinary(text("t,I\n"))).toBeNull();
  });
});
