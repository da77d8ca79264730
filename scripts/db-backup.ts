/**
 * npm run db:backup [-- DIR]: the database (pg_dump, custom format) and every stored object of the
 * bucket, with a manifest of sizes and SHA-256 sums, into DIR (default .data/backups/<time>).
 */
import { createHash } from "node:crypto";
import { mkdirSync, writeFileSync } from "node:fs";
import { dirname, join, resolve } from "node:path";
import { GetObjectCommand, ListObjectsV2Command } from "@aws-sdk/client-s3";
import { env, pgTool, run, s3, type Manifest } from "./lib/backup-common.ts";

const dir = resolve(process.argv[2] ?? join(".data/backups", new Date().toISOString().replace(/[:.]/g, "-")));
mkdirSync(join(dir, "objects"), { recursive: true });

run(pgTool("pg_dump"), ["--format=custom", "--no-owner", "--no-privileges", `--file=${join(dir, "database.dump")}`, env.DATABASE_URL]);

const objects: Manifest["objects"] = [];
let token: string | undefined;
do {
  const page = await s3.send(new ListObjectsV2Command({ Bucket: env.S3_BUCKET, ContinuationToken: token }));
  for (const item of page.Contents ?? []) {
    const key = item.Key!;
    if (key.split("/").includes("..")) throw new Error(`refusing the object key ${JSON.stringify(key)}`);
    const out = await s3.send(new GetObjectCommand({ Bucket: env.S3_BUCKET, Key: key }));
    const bytes = await out.Body!.transformToByteArray();
    const file = join(dir, "objects", key);
    mkdirSync(dirname(file), { recursive: true });
    writeFileSync(file, bytes);
    objects.push({ key, size: bytes.byteLength, sha256: createHash("sha256").update(bytes).digest("hex"), contentType: out.ContentType });
  }
  token = page.IsTruncated ? page.NextContinuationToken : undefined;
} while (token);

const manifest: Manifest = {
  format: "runproof.backup/1",
  createdAt: new Date().toISOString(),
  database: new URL(env.DATABASE_URL).pathname.slice(1),
  bucket: env.S3_BUCKET,
  objects,
};
writeFileSync(join(dir, "manifest.json"), JSON.stringify(manifest, null, 2));
console.log(`backup of ${manifest.database} and ${objects.length} stored objects written to ${dir}`);
