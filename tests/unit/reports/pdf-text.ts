// Reads the text out of a PDF written by pdfkit with the standard fonts: inflates the page
// streams when compressed and decodes the hex strings of each TJ/Tj operator. Enough for
// asserting on our own reports; not a general PDF parser.
import { inflateSync } from "node:zlib";

export function pdfText(pdf: Buffer): string {
  return pdfStreamTexts(pdf).join("\n");
}

/**
 * The text of each content stream that holds any, in file order: with pdfkit one per page (a
 * page's footer, drawn last, lands in its own page's stream), so [0] is page 1.
 */
export function pdfPageTexts(pdf: Buffer): string[] {
  return pdfStreamTexts(pdf).filter((text) => text !== "");
}

function pdfStreamTexts(pdf: Buffer): string[] {
  const raw = pdf.toString("latin1");
  const streams: string[] = [];
  const re = /<<([^]*?)>>\s*stream\r?\n/g;
  let m: RegExpExecArray | null;
  while ((m = re.exec(raw))) {
    const start = m.index + m[0].length;
    const end = raw.indexOf("endstream", start);
    if (end < 0) break;
    const body = pdf.subarray(start, end);
    if (/\/FlateDecode/.test(m[1] ?? "")) {
      try {
        streams.push(inflateSync(body).toString("latin1"));
      } catch {
        // not a content stream we can read (fonts etc.)
      }
    } else streams.push(body.toString("latin1"));
    re.lastIndex = end;
  }
  return streams.map((s) => {
    const lines: string[] = [];
    for (const op of s.matchAll(/\[([^\]]*)\]\s*TJ|<([0-9a-fA-F]*)>\s*Tj|\(((?:\\.|[^)])*)\)\s*Tj/g)) {
      if (op[1] !== undefined) {
        lines.push([...op[1].matchAll(/<([0-9a-fA-F]*)>/g)].map((h) => Buffer.from(h[1] ?? "", "hex").toString("latin1")).join(""));
      } else if (op[2] !== undefined) lines.push(Buffer.from(op[2], "hex").toString("latin1"));
      else if (op[3] !== undefined) lines.push(op[3]);
    }
    return lines.join("\n");
  });
}
