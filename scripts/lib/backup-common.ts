import { execFileSync } from "node:child_process";
import { existsSync, readdirSync } from "node:fs";
import { S3Client } from "@aws-sdk/client-s3";
import { parseEnv } from "../../app/config/env-schema.ts";

/** The configuration the app reads, validated the same way (these scripts sign nothing, so the production secret rule does not apply). */
export const env = parseEnv({ ...process.env, NODE_ENV: "development" });

export const s3 = new S3Client({
  endpoint: env.S3_ENDPOINT,
  region: env.S3_REGION,
  forcePathStyle: env.S3_FORCE_PATH_STYLE,
  credentials: { accessKeyId: env.S3_ACCESS_KEY_ID, secretAccessKey: env.S3_SECRET_ACCESS_KEY },
});

/** A PostgreSQL client tool: Debian's newest under /usr/lib/postgresql, else the one on PATH. */
export function pgTool(name: "pg_dump" | "pg_restore"): string {
  const root = "/usr/lib/postgresql";
  const versions = existsSync(root) ? readdirSync(root).filter((v) => /^\d+$/.test(v)).sort((a, b) => Number(b) - Number(a)) : [];
  for (const v of versions) if (existsSync(`${root}/${v}/bin/${name}`)) return `${root}/${v}/bin/${name}`;
  return name;
}

export function run(tool: string, args: string[]) {
  execFileSync(tool, args, { stdio: ["ignore", "inherit", "inherit"] });
}

export type Manifest = {
  format: "runproof.backup/1";
  createdAt: string;
  database: string;
  bucket: string;
  objects: { key: string; size: number; sha256: string; contentType?: string }[];
};
