import { getFormProps } from "@conform-to/react";
import { useCheckedForm } from "~/components/checked-form";
import { getZodConstraint, parseWithZod } from "@conform-to/zod/v4";
import { eq } from "drizzle-orm";
import { data, Form, Link, href } from "react-router";
import { user as userTable } from "~db/schema";
import { profileSchema } from "~/auth/sign-in-forms";
import { requireUser } from "~/access/session.server";
import { TextField } from "~/components/field";
import { DigestForm } from "~/components/review/digest-form";
import { previewDigest } from "~/review/digest.server";
import type { Route } from "./+types/index";

export const meta: Route.MetaFunction = () => [{ title: "Your account · Runproof" }];

export async function loader(args: Route.LoaderArgs) {
  const { user, db } = await requireUser(args);
  const [profile] = await db
    .select({ name: userTable.name, email: userTable.email, affiliation: userTable.affiliation, orcid: userTable.orcid, digest: userTable.digest })
    .from(userTable)
    .where(eq(userTable.id, user.id));
  const preview = await previewDigest(db, user.id);
  return { profile: profile!, preview: preview ? { ...preview, since: preview.since ? new Date(preview.since).toISOString().slice(0, 10) : null } : null };
}

export async function action(args: Route.ActionArgs) {
  const { user, db } = await requireUser(args);
  const submission = parseWithZod(await args.request.formData(), { schema: profileSchema });
  if (submission.status !== "success") return data({ result: submission.reply(), saved: false }, { status: 400 });
  const { name, affiliation, orcid } = submission.value;
  await db
    .update(userTable)
    .set({ name, affiliation: affiliation || null, orcid: orcid ?? null, updatedAt: new Date() })
    .where(eq(userTable.id, user.id));
  return { result: submission.reply(), saved: true };
}

export default function Account({ loaderData, actionData }: Route.ComponentProps) {
  const { profile } = loaderData;
  const [form, fields] = useCheckedForm({
    lastResult: actionData?.result,
    defaultValue: { name: profile.name, affiliation: profile.affiliation ?? "", orcid: profile.orcid ?? "" },
    constraint: getZodConstraint(profileSchema),
    onValidate: ({ formData }) => parseWithZod(formData, { schema: profileSchema }),
  });
  return (
    <main className="mx-auto max-w-xl p-gutter">
      <h1 className="text-title">Your account</h1>
      <p className="mt-2 text-basalt-soft">Signed in as {profile.email}.</p>
      <p className="mt-2">
        <Link to={href("/account/tokens")} className="underline">API tokens</Link> for scripts that push run records.
      </p>
      {actionData?.saved ? (
        <p className="mt-3 rounded bg-lichen-wash p-3" role="status">
          Saved.
        </p>
      ) : null}
      <Form method="post" {...getFormProps(form)} className="mt-6 flex flex-col gap-4">
        <TextField meta={fields.name} label="Name" autoComplete="name" />
        <TextField meta={fields.affiliation} label="Affiliation" autoComplete="organization" hint="Institute and city, as it should appear on a submission." />
        <TextField meta={fields.orcid} label="ORCID iD" hint="16 characters such as 0000-0002-1825-0097; the last one is a check digit." />
        <button type="submit" className="btn self-start">
          Save
        </button>
      </Form>
      <DigestForm current={profile.digest} />
      {loaderData.preview ? (
        <section className="card mt-6" aria-labelledby="digest-preview-h" data-testid="digest-preview">
          <h2 id="digest-preview-h" className="text-lead">
            Your next digest
          </h2>
          {loaderData.preview.frequency === "none" ? (
            <p className="mt-2 text-caption">You asked for no digest; choose daily or weekly above to get one.</p>
          ) : loaderData.preview.bySubmission.length === 0 ? (
            <p className="mt-2 text-caption">Nothing new{loaderData.preview.since ? ` since ${loaderData.preview.since}` : ""}: no new flags, released remarks or decisions yet.</p>
          ) : (
            <ul className="mt-2 flex flex-col gap-2">
              {loaderData.preview.bySubmission.map((s) => (
                <li key={s.submissionId}>
                  <p className="font-semibold">{s.title}</p>
                  <ul className="ml-4 list-disc text-caption">
                    {s.lines.map((line, i) => (
                      <li key={i}>{line}</li>
                    ))}
                  </ul>
                </li>
              ))}
            </ul>
          )}
        </section>
      ) : null}
    </main>
  );
}
