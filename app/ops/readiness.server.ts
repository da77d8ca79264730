import { HeadBucketCommand, S3Client } from "@aws-sdk/client-s3";
import { sql } from "drizzle-orm";
import nodemailer from "nodemailer";
import type { Database } from "~db/client";
import type { S3Settings } from "~/storage/s3";

export type ReadinessCheck = { ok: boolean; message?: string };
export type Readiness = { ok: boolean; checks: Record<string, ReadinessCheck> };

type Dependencies = { db: Database; s3: S3Settings; smtp: { host: string; port: number }; timeoutMs?: number };

function withTimeout<T>(promise: Promise<T>, ms: number, what: string): Promise<T> {
  let timer: NodeJS.Timeout | undefined;
  const timeout = new Promise<never>((_, reject) => {
    timer = setTimeout(() => reject(new Error(`${what} did not answer within ${ms} ms`)), ms);
  });
  return Promise.race([promise, timeout]).finally(() => clearTimeout(timer));
}

async function probe(what: string, ms: number, run: () => Promise<unknown>): Promise<ReadinessCheck> {
  try {
    await withTimeout(run(), ms, what);
    return { ok: true };
  } catch (error) {
    return { ok: false, message: `${what} unreachable: ${error instanceof Error ? error.message : String(error)}` };
  }
}

/**
 * Can this process serve? The database answers a query, the object store knows the bucket, the
 * SMTP relay greets. Each probe has its own time budget, so one dead service cannot hang the answer.
 */
export function readinessProbe(deps: Dependencies): () => Promise<Readiness> {
  const ms = deps.timeoutMs ?? 2000;
  const s3 = new S3Client({
    endpoint: deps.s3.endpoint,
    region: deps.s3.region,
    forcePathStyle: deps.s3.forcePathStyle,
    credentials: { accessKeyId: deps.s3.accessKeyId, secretAccessKey: deps.s3.secretAccessKey },
    maxAttempts: 1,
  });
  const smtp = nodemailer.createTransport({
    host: deps.smtp.host,
    port: deps.smtp.port,
    secure: false,
    ignoreTLS: true,
    connectionTimeout: ms,
    greetingTimeout: ms,
  });
  return async () => {
    const [database, objectStorage, mail] = await Promise.all([
      probe("database", ms, () => deps.db.execute(sql`select 1`)),
      probe("object storage", ms, () => s3.send(new HeadBucketCommand({ Bucket: deps.s3.bucket }))),
      probe("SMTP relay", ms, () => smtp.verify()),
    ]);
    const checks = { database, objectStorage, mail };
    return { ok: Object.values(checks).every((c) => c.ok), checks };
  };
}
