import crypto from "node:crypto";
import { describe, expect, it } from "vitest";
import { getObjectBytes, hashObject, presignUpload, putObject } from "@/lib/storage/s3";
import { postUpload } from "../support/captures";

describe("object storage through @aws-sdk/client-s3 against s3rver", () => {
  it("reads back a written object byte-identical, and hashes it by streaming", async () => {
    // Random bytes, including every byte value, in a size that spans several network chunks.
    const bytes = new Uint8Array(crypto.randomBytes(300_000));
    const key = `tests/roundtrip-${Date.now()}.bin`;
    await putObject(key, bytes);
    const back = await getObjectBytes(key);
    expect(back.length).toBe(bytes.length);
    expect(Buffer.from(back).equals(Buffer.from(bytes))).toBe(true);
    // Independent hash of the same bytes with node:crypto in one piece.
    expect(await hashObject(key)).toEqual({ sha256: crypto.createHash("sha256").update(bytes).digest("hex"), sizeBytes: bytes.length });
  });

  it("accepts a form POST with the presigned policy and keeps the bytes as sent; the policy fixes key, type, size and a short expiry", async () => {
    const key = `tests/presigned-${Date.now()}.csv`;
    const text = "t (s);I (A)\n0,000;1,5\n";
    const before = Date.now();
    const upload = await presignUpload(key, { contentType: "text/csv", maxBytes: Buffer.byteLength(text), expiresInS: 3600 });
    const res = await postUpload({ ...upload, expiresAt: upload.expiresAt.toISOString() }, text);
    expect(res.ok).toBe(true);
    expect(new TextDecoder().decode(await getObjectBytes(key))).toBe(text);
    // The signed policy document (base64 JSON, the S3 POST policy format).
    const policy = JSON.parse(Buffer.from(upload.fields.Policy!, "base64").toString("utf8")) as { expiration: string; conditions: unknown[] };
    // Asked for an hour, capped at 10 minutes.
    expect(Date.parse(policy.expiration) - before).toBeLessThanOrEqual(600_000 + 5_000);
    expect(policy.conditions).toContainEqual(["content-length-range", 1, Buffer.byteLength(text)]);
    expect(policy.conditions).toContainEqual(["eq", "$Content-Type", "text/csv"]);
    expect(policy.conditions).toContainEqual({ key });
  });
});
