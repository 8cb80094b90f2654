import crypto from "node:crypto";
import { describe, expect, it } from "vitest";
import { getObjectBytes, presignPut, putObject } from "@/lib/storage/s3";

describe("object storage through @aws-sdk/client-s3 against s3rver", () => {
  it("reads back a written object byte-identical", async () => {
    // Random bytes, including every byte value, in a size that spans several network chunks.
    const bytes = new Uint8Array(crypto.randomBytes(300_000));
    const key = `tests/roundtrip-${Date.now()}.bin`;
    await putObject(key, bytes);
    const back = await getObjectBytes(key);
    expect(back.length).toBe(bytes.length);
    expect(Buffer.from(back).equals(Buffer.from(bytes))).toBe(true);
  });

  it("accepts a PUT through a presigned URL and keeps the bytes as sent", async () => {
    const key = `tests/presigned-${Date.now()}.csv`;
    const text = "t (s);I (A)\n0,000;1,5\n";
    const url = await presignPut(key, "text/csv");
    const res = await fetch(url, { method: "PUT", body: text, headers: { "content-type": "text/csv" } });
    expect(res.status).toBe(200);
    expect(new TextDecoder().decode(await getObjectBytes(key))).toBe(text);
  });
});
