import "server-only";
import { inspectCsv } from "@/lib/analysis/inspect-csv";
import { isAnalysisInputError } from "@/lib/analysis/errors";
import { getObjectHead } from "@/lib/storage/s3";
import { completeLines, decodeText } from "./decode-text";

const previewBytes = 256 * 1024;

/** The first lines of the stored original and what the importer detects in them. */
export async function previewCapture(s3Key: string) {
  const text = completeLines(decodeText(await getObjectHead(s3Key, previewBytes)));
  const firstLines = text.split(/\r?\n/).slice(0, 12);
  try {
    const preview = inspectCsv(text);
    return { preview, problem: preview.timeAxisProblem, firstLines };
  } catch (err) {
    // A file the importer cannot read still gets its first lines and the reason.
    if (isAnalysisInputError(err)) return { preview: null, problem: err.message, firstLines };
    throw err;
  }
}

export type CapturePreview = Awaited<ReturnType<typeof previewCapture>>;
