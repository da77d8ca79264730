/**
 * npm run db:restore -- DIR --yes: replaces the database's contents with the backup's (pg_restore
 * --clean, in one transaction) and puts every stored object back, checking each one's SHA-256.
 */
import { createHash } from "node:crypto";
import { readFileSync } from "node:fs";
import { join, resolve } from "node:path";
import { CreateBucketCommand, HeadBucketCommand, PutObjectCommand } from "@aws-sdk/client-s3";
import { env, pgTool, run, s3, type Manifest } from "./lib/backup-common.ts";

const args = process.argv.slice(2);
const dirArg = args.find((a) => !a.startsWith("--"));
if (!dirArg || !args.includes("--yes")) {
  console.error("usage: npm run db:restore -- <backup folder> --yes   (replaces the contents of DATABASE_URL and S3_BUCKET)");
  process.exit(2);
}
const dir = resolve(dirArg);
const manifest = JSON.parse(readFileSync(join(dir, "manifest.json"), "utf8")) as Manifest;
if (manifest.format !== "runproof.backup/1") throw new Error(`${dir} is not a Runproof backup (format ${manifest.format})`);

// Check every object before anything is changed: a damaged backup restores nothing.
const files = manifest.objects.map((o) => {
  const bytes = readFileSync(join(dir, "objects", o.key));
  const sum = createHash("sha256").update(bytes).digest("hex");
  if (sum !== o.sha256 || bytes.byteLength !== o.size) throw new Error(`stored object ${o.key} in the backup is damaged (checksum differs); nothing was restored`);
  return { ...o, bytes };
});

run(pgTool("pg_restore"), ["--clean", "--if-exists", "--no-owner", "--no-privileges", "--single-transaction", `--dbname=${env.DATABASE_URL}`, join(dir, "database.dump")]);

await s3.send(new HeadBucketCommand({ Bucket: env.S3_BUCKET })).catch(() => s3.send(new CreateBucketCommand({ Bucket: env.S3_BUCKET })));
for (const f of files) {
  await s3.send(new PutObjectCommand({ Bucket: env.S3_BUCKET, Key: f.key, Body: f.bytes, ContentType: f.contentType }));
}
console.log(`restored ${manifest.database} (from ${manifest.createdAt}) into ${new URL(env.DATABASE_URL).pathname.slice(1)} and ${files.length} stored objects into ${env.S3_BUCKET}`);
