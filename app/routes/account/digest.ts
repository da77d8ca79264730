import { eq } from "drizzle-orm";
import { data } from "react-router";
import { z } from "zod";
import { user as userTable } from "~db/schema";
import { requireUser } from "~/access/session.server";
import type { Route } from "./+types/digest";

const schema = z.enum(["daily", "weekly", "none"]);

/** Saves how often the signed-in person gets the digest mail (posted by the account page's form). */
export async function action(args: Route.ActionArgs) {
  const { user, db } = await requireUser(args);
  const parsed = schema.safeParse((await args.request.formData()).get("digest"));
  if (!parsed.success) return data({ ok: false, error: "Choose daily, weekly or no digest." }, { status: 400 });
  await db.update(userTable).set({ digest: parsed.data, updatedAt: new Date() }).where(eq(userTable.id, user.id));
  return { ok: true, error: null };
}
