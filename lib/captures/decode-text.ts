// CSV exports arrive as UTF-8 (with or without BOM) or, from older instruments, Latin-1.
export function decodeText(bytes: Uint8Array): string {
  let text: string;
  try {
    text = new TextDecoder("utf-8", { fatal: true }).decode(bytes);
  } catch {
    text = new TextDecoder("latin1").decode(bytes);
  }
  return text.charCodeAt(0) === 0xfeff ? text.slice(1) : text;
}

/** Cuts a preview at the last complete line so a half row never looks like bad data. */
export function completeLines(text: string): string {
  const cut = text.lastIndexOf("\n");
  return cut > 0 ? text.slice(0, cut + 1) : text;
}
