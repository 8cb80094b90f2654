import "server-only";
import type { Reader } from "@/lib/auth/permissions";
import { loadSheet } from "@/lib/captures/load-sheet";
import { AppError } from "@/lib/errors";
import { reportQuery } from "./responses";

/**
 * The sheet behind a report download (PDF or CSV) of a capture: the evaluation named by `?evaluation=ID`
 * in the request URL, else the one the sheet shows. A capture without an evaluation is a conflict (409).
 */
export async function loadReportSheet({ captureId, url, reader }: { captureId: string; url: string; reader: Reader }) {
  const { evaluation } = reportQuery(url);
  const sheet = await loadSheet({ captureId, evaluationId: evaluation, reader });
  if (!sheet.evaluation) throw new AppError("conflict", "The capture has not been evaluated yet.");
  return sheet;
}
