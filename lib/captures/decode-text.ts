import { detectEncoding } from "@/lib/analysis/detect-encoding";

/**
 * Decodes a stored export (or its head) in the encoding detected from its first bytes — the same
 * detection the analysis makes when it streams the file, so preview and analysis read the same
 * characters: UTF-8 with or without BOM, UTF-16 LE/BE, else Windows-1252.
 */
export function decodeText(bytes: Uint8Array): string {
  const text = new TextDecoder(detectEncoding(bytes)).decode(bytes);
  // TextDecoder drops a leading byte-order mark; a second one (a BOM written twice) is dropped here.
  return text.charCodeAt(0) === 0xfeff ? text.slice(1) : text;
}

/** Cuts a preview at the last complete line so a half row never looks like bad data. */
export function completeLines(text: string): string {
  const cut = text.lastIndexOf("\n");
  return cut > 0 ? text.slice(0, cut + 1) : text;
}
