import "server-only";
import { markUploaded } from "@/db/queries/captures";
import type { Capture } from "@/db/schema";
import { AppError } from "@/lib/errors";
import { copyObject, deleteObject, getObjectHead, hashObject, headObject } from "@/lib/storage/s3";
import { sniffBinary } from "./sniff-binary";

/** Where the browser's form upload lands. The confirmed original is a server-side copy elsewhere. */
export function incomingKey(captureId: string): string {
  return `uploads/${captureId}/incoming`;
}

export const uploadContentType = "text/csv";

/**
 * Confirms an upload: copies the incoming object to the capture's original key (which no client ever
 * gets a URL for), streams the copy to compute its SHA-256 and size, refuses a size other than the
 * registered one and binary files, and records size and hash. Only once: a confirmed original cannot
 * be replaced by uploading again.
 */
export async function confirmUpload({ capture, actorId }: { capture: Capture; actorId: string }): Promise<{ sizeBytes: number; sha256: string }> {
  if (capture.status !== "uploading") {
    throw new AppError("conflict", "This upload was already confirmed; its original cannot be replaced. Register a new capture for another file.");
  }
  const incoming = incomingKey(capture.id);
  const head = await headObject(incoming);
  if (!head) throw new AppError("conflict", "The file has not arrived in storage. Upload it again.");
  const refuse = async (message: string): Promise<never> => {
    await deleteObject(capture.s3Key).catch(() => undefined);
    throw new AppError("validation", message, { file: [message] });
  };
  if (head.contentType && head.contentType !== uploadContentType) await refuse(`The file was sent as ${head.contentType}; only CSV text exports (${uploadContentType}) are accepted.`);
  await copyObject(incoming, capture.s3Key);
  const { sizeBytes, sha256 } = await hashObject(capture.s3Key);
  if (sizeBytes === 0) await refuse("The uploaded file is empty.");
  if (sizeBytes !== capture.sizeBytes) {
    await refuse(`The file in storage has ${sizeBytes} bytes but ${capture.sizeBytes} bytes were registered. Upload the file again.`);
  }
  const binary = sniffBinary(await getObjectHead(capture.s3Key, 4096));
  if (binary) await refuse(`This file is a ${binary}, not a CSV export. Export the record as CSV text and upload that.`);
  if (!(await markUploaded({ id: capture.id, sizeBytes, sha256, actorId }))) {
    throw new AppError("conflict", "This upload was already confirmed; its original cannot be replaced.");
  }
  await deleteObject(incoming).catch(() => undefined);
  return { sizeBytes, sha256 };
}
