import { randomBytes } from "node:crypto";
import { Readable } from "node:stream";
import { describe, expect, it } from "vitest";
import { createS3Storage } from "~/storage/s3";

// Against the local S3-compatible fake that `npm test` starts, through the real AWS SDK.
const storage = createS3Storage({
  endpoint: process.env.S3_ENDPOINT ?? "http://127.0.0.1:4569",
  region: "us-east-1",
  bucket: process.env.S3_BUCKET ?? "runproof",
  accessKeyId: "S3RVER",
  secretAccessKey: "S3RVER",
  forcePathStyle: true,
});

describe("object storage", () => {
  it("streams an object of unknown length up and reads the same bytes back", async () => {
    const key = `test/${Date.now()}-series.csv`;
    const bytes = randomBytes(6 * 1024 * 1024 + 123); // over one multipart part
    await storage.put(key, Readable.from([bytes.subarray(0, 1000), bytes.subarray(1000)]), "text/csv");
    const back = await storage.getBytes(key);
    expect(Buffer.from(back).equals(bytes)).toBe(true);
    await storage.remove(key);
    await expect(storage.getBytes(key)).rejects.toThrow();
  });
});
