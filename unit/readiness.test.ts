import { createServer } from "node:net";
import { afterAll, describe, expect, it } from "vitest";
import { readinessProbe } from "~/ops/readiness.server";
import { testDatabase } from "./support/test-db";

// Against the services `npm test` starts (PostgreSQL, the S3 fake, maildev), and a port nobody serves.
const { db, sql } = testDatabase();
const s3 = {
  endpoint: process.env.S3_ENDPOINT ?? "http://127.0.0.1:4569",
  region: "us-east-1",
  bucket: process.env.S3_BUCKET ?? "runproof",
  accessKeyId: "S3RVER",
  secretAccessKey: "S3RVER",
  forcePathStyle: true,
};
const smtp = { host: "127.0.0.1", port: Number(process.env.SMTP_PORT ?? 1025) };

/** A loopback port with nothing listening on it. */
async function deadPort(): Promise<number> {
  const server = createServer();
  await new Promise<void>((r) => server.listen(0, "127.0.0.1", r));
  const { port } = server.address() as { port: number };
  await new Promise<void>((r) => server.close(() => r()));
  return port;
}

afterAll(() => sql.end({ timeout: 5 }));

describe("/readyz's probe", () => {
  it("is ready when the database, the object store and the SMTP relay answer", async () => {
    const ready = await readinessProbe({ db, s3, smtp })();
    expect(ready.checks).toEqual({ database: { ok: true }, objectStorage: { ok: true }, mail: { ok: true } });
    expect(ready.ok).toBe(true);
  });

  it("names each dependency that does not answer", async () => {
    const port = await deadPort();
    const ready = await readinessProbe({ db, s3: { ...s3, endpoint: `http://127.0.0.1:${port}` }, smtp: { ...smtp, port }, timeoutMs: 1500 })();
    expect(ready.ok).toBe(false);
    expect(ready.checks.database).toEqual({ ok: true });
    expect(ready.checks.objectStorage!.message).toMatch(/^object storage unreachable/);
    expect(ready.checks.mail!.message).toMatch(/^SMTP relay unreachable/);
  });
});
