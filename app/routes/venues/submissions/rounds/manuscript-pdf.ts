import { eq } from "drizzle-orm";
import { data } from "react-router";
import { storedFiles } from "~db/schema";
import { requireRound } from "~/access/page-guards.server";
import { contentDisposition } from "~/lib/content-disposition";
import { storage } from "~/storage/storage.server";
import { manuscriptFileOf } from "~/workspace/manuscript.server";
import type { Route } from "./+types/manuscript-pdf";

/** The manuscript as this round holds it (the draft's upload only for its authors). */
export async function loader(args: Route.LoaderArgs) {
  const { db, access } = await requireRound(args, "read-files");
  const fileId = await manuscriptFileOf(db, access);
  const [row] = fileId ? await db.select({ key: storedFiles.key, filename: storedFiles.filename, size: storedFiles.size }).from(storedFiles).where(eq(storedFiles.id, fileId)) : [];
  if (!row) throw data("No manuscript was uploaded in this round.", { status: 404 });
  return new Response(await storage.getStream(row.key), {
    headers: {
      "content-type": "application/pdf",
      // An ASCII fallback name plus the RFC 6266 / RFC 8187 UTF-8 name, so any file name is a valid header.
      "content-disposition": contentDisposition("inline", row.filename),
      "content-length": String(row.size),
    },
  });
}
