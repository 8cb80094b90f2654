import "server-only";
import { IntervalLogError } from "@/lib/intervals/errors";
import { inspectIntervalLog } from "@/lib/intervals/inspect-interval-log";
import { getObjectHead } from "@/lib/storage/s3";
import { completeLines, decodeText } from "./decode-text";

/** The header, first rows and a suggested column mapping of a stored interval log. */
export async function previewIntervalLog(s3Key: string) {
  const text = completeLines(decodeText(await getObjectHead(s3Key, 128 * 1024)));
  const firstLines = text.split(/\r?\n/).slice(0, 8);
  try {
    return { preview: inspectIntervalLog(text), problem: null, firstLines };
  } catch (err) {
    if (err instanceof IntervalLogError || err instanceof Error) return { preview: null, problem: err.message, firstLines };
    throw err;
  }
}

export type IntervalPreview = Awaited<ReturnType<typeof previewIntervalLog>>;
