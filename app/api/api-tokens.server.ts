import { createHash, randomBytes } from "node:crypto";
import { and, desc, eq } from "drizzle-orm";
import { apiTokens } from "~db/schema";
import type { Db } from "~/workspace/types";
import { InvalidInput } from "~/workspace/types";

/** What a token may do. `read` reads what the person may read; `write:runs` changes draft rounds. */
export const TOKEN_SCOPES = ["read", "write:runs"] as const;
export type TokenScope = (typeof TOKEN_SCOPES)[number];

/** Tokens look like `rp_<43 base64url characters>`; the prefix tells them apart from other secrets. */
export const TOKEN_PREFIX = "rp_";
const SHOWN_PREFIX_LENGTH = 10;
export const MAX_TOKEN_DAYS = 366;

export function hashToken(secret: string) {
  return createHash("sha256").update(secret, "utf8").digest("hex");
}

/**
 * Creates a token and returns its secret once; only the SHA-256 hash is stored, so a leaked
 * database does not leak usable tokens.
 */
export async function createApiToken(
  db: Db,
  opts: { userId: string; name: string; scopes: TokenScope[]; expiresInDays: number; now?: Date },
) {
  const issues: { path: string; message: string }[] = [];
  if (!opts.name.trim()) issues.push({ path: "name", message: "Give the token a name, e.g. the cluster it runs on." });
  if (!Number.isInteger(opts.expiresInDays) || opts.expiresInDays < 1 || opts.expiresInDays > MAX_TOKEN_DAYS) {
    issues.push({ path: "expiresInDays", message: `Choose a whole number of days from 1 to ${MAX_TOKEN_DAYS}.` });
  }
  if (opts.scopes.length === 0) issues.push({ path: "scopes", message: "Choose at least one scope." });
  if (issues.length) throw new InvalidInput("The token cannot be created.", issues);
  const secret = TOKEN_PREFIX + randomBytes(32).toString("base64url");
  const now = opts.now ?? new Date();
  const [row] = await db
    .insert(apiTokens)
    .values({
      userId: opts.userId,
      name: opts.name.trim(),
      prefix: secret.slice(0, SHOWN_PREFIX_LENGTH),
      tokenHash: hashToken(secret),
      scopes: [...new Set(opts.scopes)],
      expiresAt: new Date(now.getTime() + opts.expiresInDays * 86_400_000),
    })
    .returning({ id: apiTokens.id, prefix: apiTokens.prefix, expiresAt: apiTokens.expiresAt });
  return { ...row!, secret };
}

export async function listApiTokens(db: Db, userId: string) {
  return db
    .select({
      id: apiTokens.id,
      name: apiTokens.name,
      prefix: apiTokens.prefix,
      scopes: apiTokens.scopes,
      expiresAt: apiTokens.expiresAt,
      revokedAt: apiTokens.revokedAt,
      lastUsedAt: apiTokens.lastUsedAt,
      createdAt: apiTokens.createdAt,
    })
    .from(apiTokens)
    .where(eq(apiTokens.userId, userId))
    .orderBy(desc(apiTokens.createdAt));
}

/** Revokes one of the person's own tokens; someone else's token id changes nothing. */
export async function revokeApiToken(db: Db, userId: string, tokenId: string) {
  const rows = await db
    .update(apiTokens)
    .set({ revokedAt: new Date() })
    .where(and(eq(apiTokens.id, tokenId), eq(apiTokens.userId, userId)))
    .returning({ id: apiTokens.id });
  return rows.length > 0;
}

export type TokenLookup =
  | { ok: true; token: { id: string; userId: string; scopes: string[] } }
  | { ok: false; reason: "unknown" | "revoked" | "expired" };

/** Finds a presented secret by its hash and says why it is refused, if it is. */
export async function verifyApiToken(db: Db, secret: string, now = new Date()): Promise<TokenLookup> {
  if (!secret.startsWith(TOKEN_PREFIX)) return { ok: false, reason: "unknown" };
  const [row] = await db
    .select({ id: apiTokens.id, userId: apiTokens.userId, scopes: apiTokens.scopes, expiresAt: apiTokens.expiresAt, revokedAt: apiTokens.revokedAt })
    .from(apiTokens)
    .where(eq(apiTokens.tokenHash, hashToken(secret)));
  if (!row) return { ok: false, reason: "unknown" };
  if (row.revokedAt) return { ok: false, reason: "revoked" };
  if (row.expiresAt.getTime() <= now.getTime()) return { ok: false, reason: "expired" };
  // Marking use is best effort: a failed update must not refuse a valid call.
  await db.update(apiTokens).set({ lastUsedAt: now }).where(eq(apiTokens.id, row.id)).catch(() => {});
  return { ok: true, token: { id: row.id, userId: row.userId, scopes: row.scopes } };
}
