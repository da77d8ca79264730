import { createHash, randomUUID } from "node:crypto";
import { and, eq, inArray } from "drizzle-orm";
import { data, Form, href } from "react-router";
import { requireRound } from "~/access/page-guards.server";
import { attachments, roundRuns, runs, storedFiles, submissions } from "~db/schema";
import { env } from "~/config/env.server";
import { storage } from "~/storage/storage.server";
import { manuscriptFileOf } from "~/workspace/manuscript.server";
import type { Route } from "./+types/files";

export const meta: Route.MetaFunction = () => [{ title: "Files · Runproof" }];

export async function loader(args: Route.LoaderArgs) {
  const { db, access } = await requireRound(args, "read-files");
  const { round } = access;
  const fileId = await manuscriptFileOf(db, access);
  const [manuscript] = fileId
    ? await db.select({ filename: storedFiles.filename, size: storedFiles.size, createdAt: storedFiles.createdAt }).from(storedFiles).where(eq(storedFiles.id, fileId))
    : [];
  const versionIds = (await db.select({ v: roundRuns.runVersionId }).from(roundRuns).where(eq(roundRuns.roundId, round.id))).map((r) => r.v);
  const csvs = versionIds.length
    ? await db
        .select({ id: attachments.id, kind: attachments.kind, rows: attachments.rowCount, filename: storedFiles.filename, size: storedFiles.size, label: runs.label })
        .from(attachments)
        .innerJoin(storedFiles, eq(storedFiles.id, attachments.fileId))
        .innerJoin(roundRuns, and(eq(roundRuns.runVersionId, attachments.runVersionId), eq(roundRuns.roundId, round.id)))
        .innerJoin(runs, eq(runs.id, roundRuns.runId))
        .where(and(inArray(attachments.runVersionId, versionIds), eq(attachments.active, true)))
    : [];
  return { manuscript: manuscript ? { ...manuscript, createdAt: manuscript.createdAt.toISOString() } : null, csvs, canEdit: access.can("write-runs") };
}

export async function action(args: Route.ActionArgs) {
  const { db, user, access } = await requireRound(args, "write-runs");
  const { submission } = access;
  const file = (await args.request.formData()).get("manuscript");
  if (!file || typeof file === "string" || file.size === 0) return data({ error: "Choose the manuscript PDF first." }, { status: 400 });
  if (file.size > env.UPLOAD_LIMIT_MB * 1024 * 1024) return data({ error: `The PDF is larger than the upload limit of ${env.UPLOAD_LIMIT_MB} MB; nothing was stored.` }, { status: 413 });
  const bytes = new Uint8Array(await file.arrayBuffer());
  if (new TextDecoder().decode(bytes.slice(0, 5)) !== "%PDF-") return data({ error: "This file is not a PDF (it does not start with %PDF-); nothing was stored." }, { status: 400 });
  const key = `manuscripts/${submission.id}/${randomUUID()}.pdf`;
  await storage.put(key, bytes, "application/pdf");
  try {
    await db.transaction(async (tx) => {
      const [row] = await tx
        .insert(storedFiles)
        .values({ key, filename: file.name, contentType: "application/pdf", size: bytes.byteLength, sha256: createHash("sha256").update(bytes).digest("hex"), uploadedBy: user.id })
        .returning({ id: storedFiles.id });
      await tx.update(submissions).set({ manuscriptFileId: row!.id, updatedAt: new Date() }).where(eq(submissions.id, submission.id));
    });
  } catch (e) {
    await storage.remove(key).catch(() => {});
    throw e;
  }
  return { ok: true };
}

export default function Files({ loaderData: d, actionData, params }: Route.ComponentProps) {
  return (
    <div className="grid gap-6 md:grid-cols-2">
      <section className="card" aria-labelledby="ms-h">
        <h3 id="ms-h" className="text-lead">
          Manuscript
        </h3>
        {d.manuscript ? (
          <p className="mt-2">
            <a href={href("/venues/:venueId/submissions/:submissionId/rounds/:round/manuscript.pdf", params)}>{d.manuscript.filename}</a> ({Math.ceil(d.manuscript.size / 1024)} KB)
          </p>
        ) : (
          <p className="mt-2 text-caption">No manuscript uploaded yet.</p>
        )}
        {d.canEdit ? (
          <Form method="post" encType="multipart/form-data" className="mt-3 flex flex-col gap-2">
            <label htmlFor="manuscript" className="font-semibold">
              Upload the manuscript (PDF)
            </label>
            <input id="manuscript" name="manuscript" type="file" accept="application/pdf" className="field-input" />
            {actionData && "error" in actionData ? (
              <p role="alert" className="field-error">
                {actionData.error}
              </p>
            ) : null}
            <button type="submit" className="btn self-start">
              Upload
            </button>
          </Form>
        ) : null}
      </section>
      <section className="card" aria-labelledby="csv-h">
        <h3 id="csv-h" className="text-lead">
          Series and spectra of this round
        </h3>
        {d.csvs.length === 0 ? (
          <p className="mt-2 text-caption">None attached yet; attach them on each run's page.</p>
        ) : (
          <ul className="mt-2 text-caption">
            {d.csvs.map((c) => (
              <li key={c.id}>
                {c.label} · {c.kind}: {c.filename} ({c.rows} rows, {Math.ceil(c.size / 1024)} KB)
              </li>
            ))}
          </ul>
        )}
      </section>
    </div>
  );
}
