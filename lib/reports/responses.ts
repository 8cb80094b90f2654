import "server-only";
import { z } from "zod";
import { buildSheetCsv } from "./build-sheet-csv";
import { buildSheetPdf, type SheetPdfOptions } from "./build-sheet-pdf";
import type { SheetReport } from "./sheet-report";

export const reportQuerySchema = z.object({ evaluation: z.uuid("Not an evaluation id").optional() });

/** Query parameters of the report routes as a plain object (absent ones left out). */
export function reportQuery(url: string) {
  const params = new URL(url).searchParams;
  return reportQuerySchema.parse({ evaluation: params.get("evaluation") ?? undefined });
}

function fileStem(sheet: SheetReport): string {
  const slug = sheet.capture.title.toLowerCase().replace(/[^a-z0-9]+/g, "-").replace(/^-|-$/g, "").slice(0, 60) || "capture";
  return `ordwise-${slug}-rev${sheet.evaluation?.revisionNumber ?? 0}`;
}

/** The sheet as a PDF download. */
export async function pdfResponse(sheet: SheetReport, options: SheetPdfOptions = {}): Promise<Response> {
  const pdf = await buildSheetPdf(sheet, options);
  return new Response(new Uint8Array(pdf), {
    headers: {
      "content-type": "application/pdf",
      "content-disposition": `attachment; filename="${fileStem(sheet)}.pdf"`,
      "cache-control": "private, no-store",
    },
  });
}

/** The sheet as a CSV download (UTF-8 with a byte-order mark so spreadsheets read µ and – right). */
export function csvResponse(sheet: SheetReport): Response {
  return new Response(`\uFEFF${buildSheetCsv(sheet)}`, {
    headers: {
      "content-type": "text/csv; charset=utf-8",
      "content-disposition": `attachment; filename="${fileStem(sheet)}.csv"`,
      "cache-control": "private, no-store",
    },
  });
}
