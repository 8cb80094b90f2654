import "server-only";
import { CopyObjectCommand, DeleteObjectCommand, GetObjectCommand, HeadObjectCommand, PutObjectCommand, S3Client } from "@aws-sdk/client-s3";
import { createPresignedPost } from "@aws-sdk/s3-presigned-post";
import { createHash } from "node:crypto";
import { createWriteStream } from "node:fs";
import { PassThrough, Transform } from "node:stream";
import type { Readable } from "node:stream";
import { pipeline } from "node:stream/promises";

// The only module that talks to the object store (s3rver locally).
export const bucket = process.env.S3_BUCKET ?? "ordwise-captures";

export const s3 = new S3Client({
  endpoint: process.env.S3_ENDPOINT ?? "http://127.0.0.1:4569",
  region: process.env.S3_REGION ?? "us-east-1",
  forcePathStyle: true,
  credentials: {
    accessKeyId: process.env.S3_ACCESS_KEY_ID ?? "S3RVER",
    secretAccessKey: process.env.S3_SECRET_ACCESS_KEY ?? "S3RVER",
  },
  // Without these the SDK streams aws-chunked bodies that s3rver stores verbatim (corrupt objects).
  requestChecksumCalculation: "WHEN_REQUIRED",
  responseChecksumValidation: "WHEN_REQUIRED",
});

export async function putObject(key: string, body: Uint8Array | string, contentType = "application/octet-stream"): Promise<void> {
  await s3.send(new PutObjectCommand({ Bucket: bucket, Key: key, Body: body, ContentType: contentType }));
}

export async function getObjectBytes(key: string): Promise<Uint8Array> {
  const res = await s3.send(new GetObjectCommand({ Bucket: bucket, Key: key }));
  if (!res.Body) throw new Error(`object ${key} has no body`);
  return res.Body.transformToByteArray();
}

export async function headObject(key: string): Promise<{ sizeBytes: number; contentType: string | null } | null> {
  try {
    const res = await s3.send(new HeadObjectCommand({ Bucket: bucket, Key: key }));
    return { sizeBytes: res.ContentLength ?? 0, contentType: res.ContentType ?? null };
  } catch {
    return null;
  }
}

/** A browser form upload the store itself checks: fixed key, exact content type, size range, short expiry. */
export interface PresignedUpload {
  url: string;
  /** Form fields to send before the file field (named "file"). */
  fields: Record<string, string>;
  expiresAt: Date;
}

/**
 * A presigned POST policy for exactly one key: `content-length-range` 1…`maxBytes`, the exact
 * `contentType`, expiring in `expiresInS` (at most 600 s). Whatever the store enforces, the server
 * still checks the object at confirmation (size, SHA-256, first bytes) and copies it to a key the
 * client never gets a URL for.
 */
export async function presignUpload(key: string, { contentType, maxBytes, expiresInS = 600 }: { contentType: string; maxBytes: number; expiresInS?: number }): Promise<PresignedUpload> {
  const expires = Math.min(expiresInS, 600);
  // The client types of this package and @aws-sdk/client-s3 are the same class in two published versions.
  const post = await createPresignedPost(s3 as unknown as Parameters<typeof createPresignedPost>[0], {
    Bucket: bucket,
    Key: key,
    Conditions: [["content-length-range", 1, maxBytes], ["eq", "$Content-Type", contentType]],
    Fields: { "Content-Type": contentType },
    Expires: expires,
  });
  return { url: post.url, fields: post.fields, expiresAt: new Date(Date.now() + expires * 1000) };
}

/** A stream step that hashes (SHA-256) and counts what passes through it. */
function hashing() {
  const hash = createHash("sha256");
  let sizeBytes = 0;
  const step = new Transform({
    transform(chunk: Buffer, _enc, done) {
      hash.update(chunk);
      sizeBytes += chunk.length;
      done(null, chunk);
    },
  });
  return { step, result: () => ({ sha256: hash.digest("hex"), sizeBytes }) };
}

/** Streams an object to a file (large captures never sit in memory whole); returns its SHA-256 (hex) and size. */
export async function downloadObjectToFile(key: string, path: string): Promise<{ sha256: string; sizeBytes: number }> {
  const res = await s3.send(new GetObjectCommand({ Bucket: bucket, Key: key }));
  if (!res.Body) throw new Error(`object ${key} has no body`);
  const h = hashing();
  await pipeline(res.Body as Readable, h.step, createWriteStream(path));
  return h.result();
}

/** SHA-256 (hex) and size of an object, computed by streaming it through the server. */
export async function hashObject(key: string): Promise<{ sha256: string; sizeBytes: number }> {
  const res = await s3.send(new GetObjectCommand({ Bucket: bucket, Key: key }));
  if (!res.Body) throw new Error(`object ${key} has no body`);
  const h = hashing();
  await pipeline(res.Body as Readable, h.step, new PassThrough().resume());
  return h.result();
}

/** Server-side copy inside the bucket (the confirmed original is a copy the client never had a URL for). */
export async function copyObject(fromKey: string, toKey: string): Promise<void> {
  await s3.send(new CopyObjectCommand({ Bucket: bucket, Key: toKey, CopySource: `${bucket}/${encodeURIComponent(fromKey).replaceAll("%2F", "/")}` }));
}

export async function deleteObject(key: string): Promise<void> {
  await s3.send(new DeleteObjectCommand({ Bucket: bucket, Key: key }));
}

/** The first `bytes` bytes of an object (for previews of large uploads). */
export async function getObjectHead(key: string, bytes: number): Promise<Uint8Array> {
  const res = await s3.send(new GetObjectCommand({ Bucket: bucket, Key: key, Range: `bytes=0-${bytes - 1}` }));
  if (!res.Body) throw new Error(`object ${key} has no body`);
  return res.Body.transformToByteArray();
}
