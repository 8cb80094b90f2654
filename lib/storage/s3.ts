import "server-only";
import { GetObjectCommand, HeadObjectCommand, PutObjectCommand, S3Client } from "@aws-sdk/client-s3";
import { getSignedUrl } from "@aws-sdk/s3-request-presigner";
import { createWriteStream } from "node:fs";
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

export async function headObject(key: string): Promise<{ sizeBytes: number } | null> {
  try {
    const res = await s3.send(new HeadObjectCommand({ Bucket: bucket, Key: key }));
    return { sizeBytes: res.ContentLength ?? 0 };
  } catch {
    return null;
  }
}

export function presignPut(key: string, contentType: string, expiresInS = 900): Promise<string> {
  return getSignedUrl(s3, new PutObjectCommand({ Bucket: bucket, Key: key, ContentType: contentType }), { expiresIn: expiresInS });
}

/** Streams an object to a file (large captures never sit in memory whole). */
export async function downloadObjectToFile(key: string, path: string): Promise<void> {
  const res = await s3.send(new GetObjectCommand({ Bucket: bucket, Key: key }));
  if (!res.Body) throw new Error(`object ${key} has no body`);
  await pipeline(res.Body as Readable, createWriteStream(path));
}

/** The first `bytes` bytes of an object (for previews of large uploads). */
export async function getObjectHead(key: string, bytes: number): Promise<Uint8Array> {
  const res = await s3.send(new GetObjectCommand({ Bucket: bucket, Key: key, Range: `bytes=0-${bytes - 1}` }));
  if (!res.Body) throw new Error(`object ${key} has no body`);
  return res.Body.transformToByteArray();
}
