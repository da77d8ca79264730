import { eq } from "drizzle-orm";
import { submissions } from "~db/schema";
import type { RoundAccess } from "~/access/relation.server";
import type { Db } from "./types";

/**
 * The manuscript file a person reads in a round: the authors' latest upload while the round is a
 * draft, and the file as sent once it was sent — so a draft's upload never reaches anyone else.
 */
export async function manuscriptFileOf(db: Db, access: Pick<RoundAccess, "round" | "submission">): Promise<string | null> {
  if (access.round.state !== "draft") return access.round.sentManuscriptFileId;
  const [row] = await db.select({ file: submissions.manuscriptFileId }).from(submissions).where(eq(submissions.id, access.submission.id));
  return row?.file ?? null;
}
