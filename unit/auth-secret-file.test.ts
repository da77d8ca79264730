import { execFileSync } from "node:child_process";
import { mkdtempSync, readFileSync, rmSync, statSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { afterAll, describe, expect, it } from "vitest";
import { parseEnv } from "~/config/env-schema";

// npm start (scripts/start.sh) takes its signing secret from this shell function.
function ensureSecret(file: string): string {
  return execFileSync("bash", ["-c", 'source scripts/lib/common.sh && rp_ensure_auth_secret "$1"', "_", file], {
    encoding: "utf8",
  }).trim();
}

describe("the secret npm start makes on first run", () => {
  const dir = mkdtempSync(join(tmpdir(), "runproof-secret-"));
  afterAll(() => rmSync(dir, { recursive: true, force: true }));

  it("is random, 256 bits, readable by its owner only, and accepted by a production start", () => {
    const file = join(dir, "auth-secret");
    const secret = ensureSecret(file);
    expect(secret).toMatch(/^[0-9a-f]{64}$/);
    expect(statSync(file).mode & 0o077).toBe(0);
    expect(parseEnv({ NODE_ENV: "production", AUTH_SECRET: secret }).AUTH_SECRET).toBe(secret);
    // A second checkout (another file) gets another secret.
    expect(ensureSecret(join(dir, "other-secret"))).not.toBe(secret);
  });

  it("is reused on later starts, so sessions and e-mail links survive a restart", () => {
    const file = join(dir, "kept");
    const first = ensureSecret(file);
    expect(ensureSecret(file)).toBe(first);
    expect(readFileSync(file, "utf8").trim()).toBe(first);
  });

  it("replaces a file too short to be a secret", () => {
    const file = join(dir, "short");
    writeFileSync(file, "abc\n");
    expect(ensureSecret(file)).toMatch(/^[0-9a-f]{64}$/);
  });
});
