import { eq } from "drizzle-orm";
import { data } from "react-router";
import { storedFiles, submissions } from "~db/schema";
import { storage } from "~/storage/storage.server";
import { requireWorkspace } from "~/workspace/access.server";
import type { Route } from "./+types/manuscript-pdf";
import { contentDisposition } from "~/lib/content-disposition";

export async function loader(args: Route.LoaderArgs) {
  const { db, submission } = await requireWorkspace(args, args.params.submissionId);
  const [row] = await db
    .select({ key: storedFiles.key, filename: storedFiles.filename, size: storedFiles.size })
    .from(submissions)
    .innerJoin(storedFiles, eq(storedFiles.id, submissions.manuscriptFileId))
    .where(eq(submissions.id, submission.id));
  if (!row) throw data("No manuscript uploaded yet.", { status: 404 });
  return new Response(await storage.getStream(row.key), {
    headers: { "content-type": "application/pdf", "content-disposition": contentDisposition("inline", row.filename), "content-length": String(row.size) },
  });
}
