import { getFormProps, getSelectProps } from "@conform-to/react";
import { useCheckedForm } from "~/components/checked-form";
import { getZodConstraint, parseWithZod } from "@conform-to/zod/v4";
import { eq } from "drizzle-orm";
import { data, Form, href } from "react-router";
import { venueMembers, venues } from "~db/schema";
import { addEditorSchema, createVenueSchema } from "~/admin/venue-forms";
import { createVenue, findUserIdByEmail, listVenues } from "~/admin/venues.server";
import { requireAdmin } from "~/access/session.server";
import { FormErrors, TextField } from "~/components/field";
import type { Route } from "./+types/venues";

export async function loader(args: Route.LoaderArgs) {
  const { db } = await requireAdmin(args);
  return { venues: await listVenues(db) };
}

export async function action(args: Route.ActionArgs) {
  const { db } = await requireAdmin(args);
  const formData = await args.request.formData();
  if (formData.get("intent") === "add-editor") {
    const submission = parseWithZod(formData, { schema: addEditorSchema });
    if (submission.status !== "success") return data({ result: submission.reply(), form: "add" }, { status: 400 });
    const userId = await findUserIdByEmail(db, submission.value.editorEmail);
    if (!userId) {
      return data(
        { result: submission.reply({ fieldErrors: { editorEmail: ["No account uses this address; ask them to sign up first."] } }), form: "add" },
        { status: 400 },
      );
    }
    await db
      .insert(venueMembers)
      .values({ venueId: submission.value.venueId, userId, role: "editor" })
      .onConflictDoNothing();
    return { result: submission.reply({ resetForm: true }), form: "add" };
  }
  const submission = await parseWithZod(formData, {
    schema: createVenueSchema.superRefine(async (v, ctx) => {
      const [taken] = await db.select({ id: venues.id }).from(venues).where(eq(venues.slug, v.slug));
      if (taken) ctx.addIssue({ code: "custom", path: ["slug"], message: "Another venue already uses this address." });
    }),
    async: true,
  });
  if (submission.status !== "success") return data({ result: submission.reply(), form: "create" }, { status: 400 });
  const editorUserId = await findUserIdByEmail(db, submission.value.editorEmail);
  if (!editorUserId) {
    return data(
      { result: submission.reply({ fieldErrors: { editorEmail: ["No account uses this address; ask them to sign up first."] } }), form: "create" },
      { status: 400 },
    );
  }
  await createVenue(db, { ...submission.value, editorUserId });
  return { result: submission.reply({ resetForm: true }), form: "create" };
}

export default function AdminVenues({ loaderData, actionData }: Route.ComponentProps) {
  const [form, fields] = useCheckedForm({
    lastResult: actionData?.form === "create" ? actionData.result : undefined,
    constraint: getZodConstraint(createVenueSchema),
    onValidate: ({ formData }) => parseWithZod(formData, { schema: createVenueSchema }),
    defaultValue: { blinding: "single" },
  });
  return (
    <div className="grid gap-6 md:grid-cols-[2fr_1fr]">
      <section aria-labelledby="venues-h">
        <h2 id="venues-h" className="text-lead">
          Venues
        </h2>
        <table className="mt-3 w-full text-left text-caption">
          <thead>
            <tr className="border-b border-rule">
              <th className="py-1">Name</th>
              <th>Review</th>
              <th>Editors</th>
            </tr>
          </thead>
          <tbody>
            {loaderData.venues.map((v) => (
              <tr key={v.id} className="border-b border-rule align-top">
                <td className="py-2">
                  {v.name}
                  <div className="font-mono text-basalt-soft">{v.slug}</div>
                  <a className="underline" href={`${href("/venues/:venueId/desk", { venueId: v.id })}#policy-h`}>Checker policy</a>
                </td>
                <td>{v.blinding === "double" ? "double-blind" : "single-blind"}</td>
                <td>
                  <ul>
                    {v.editors.map((e) => (
                      <li key={e}>{e}</li>
                    ))}
                  </ul>
                  <Form method="post" className="mt-1 flex gap-1">
                    <input type="hidden" name="intent" value="add-editor" />
                    <input type="hidden" name="venueId" value={v.id} />
                    <label className="sr-only" htmlFor={`add-${v.id}`}>
                      Add an editor to {v.name}
                    </label>
                    <input id={`add-${v.id}`} name="editorEmail" type="email" placeholder="editor's e-mail" className="field-input py-0.5" />
                    <button className="btn btn-quiet py-0.5" type="submit">
                      Add
                    </button>
                  </Form>
                </td>
              </tr>
            ))}
          </tbody>
        </table>
        {actionData?.form === "add" && actionData.result.error ? (
          <FormErrors errors={Object.values(actionData.result.error).flat().filter((e): e is string => Boolean(e))} />
        ) : null}
      </section>
      <section className="card" aria-labelledby="new-venue-h">
        <h2 id="new-venue-h" className="text-lead">
          Open a venue
        </h2>
        <Form method="post" {...getFormProps(form)} className="mt-3 flex flex-col gap-3">
          <input type="hidden" name="intent" value="create-venue" />
          <TextField meta={fields.name} label="Name" />
          <TextField meta={fields.slug} label="Short address" hint="Appears in links, e.g. core-dynamics." />
          <div className="flex flex-col gap-1">
            <label htmlFor={fields.blinding.id} className="font-semibold">
              Review
            </label>
            <select {...getSelectProps(fields.blinding)} className="field-input">
              <option value="single">single-blind (authors never see reviewers)</option>
              <option value="double">double-blind (reviewers never see authors either)</option>
            </select>
          </div>
          <TextField meta={fields.editorEmail} label="First editor's e-mail" type="email" />
          <button type="submit" className="btn self-start">
            Open the venue
          </button>
        </Form>
      </section>
    </div>
  );
}
