import { getFormProps, getTextareaProps } from "@conform-to/react";
import { useCheckedForm } from "~/components/checked-form";
import { getZodConstraint, parseWithZod } from "@conform-to/zod/v4";
import { eq } from "drizzle-orm";
import { data, Form, href, redirect } from "react-router";
import { venues } from "~db/schema";
import { isId } from "~/access/relation.server";
import { requireUser } from "~/access/session.server";
import { TextField } from "~/components/field";
import { TextArea } from "~/components/workspace/text-area";
import { submissionFields, submissionSchema } from "~/workspace/submission-form";
import { createSubmission } from "~/workspace/submissions.server";
import type { Route } from "./+types/new";

export const meta: Route.MetaFunction = () => [{ title: "Start a submission · Runproof" }];

async function venueOf(db: Awaited<ReturnType<typeof requireUser>>["db"], venueId: string) {
  if (!isId(venueId)) throw data("Not found", { status: 404 });
  const [venue] = await db.select({ id: venues.id, name: venues.name }).from(venues).where(eq(venues.id, venueId));
  if (!venue) throw data("Not found", { status: 404 });
  return venue;
}

export async function loader(args: Route.LoaderArgs) {
  const { db } = await requireUser(args);
  return { venue: await venueOf(db, args.params.venueId) };
}

export async function action(args: Route.ActionArgs) {
  const { db, user } = await requireUser(args);
  const venue = await venueOf(db, args.params.venueId);
  const submission = parseWithZod(await args.request.formData(), { schema: submissionSchema });
  if (submission.status !== "success") return data({ result: submission.reply() }, { status: 400 });
  const created = await createSubmission(db, { venueId: venue.id, userId: user.id, fields: submissionFields(submission.value) });
  throw redirect(href("/venues/:venueId/submissions/:submissionId/rounds/:round", { venueId: venue.id, submissionId: created.submissionId, round: String(created.round) }));
}

export default function NewSubmission({ loaderData, actionData }: Route.ComponentProps) {
  const [form, fields] = useCheckedForm({
    lastResult: actionData?.result,
    constraint: getZodConstraint(submissionSchema),
    onValidate: ({ formData }) => parseWithZod(formData, { schema: submissionSchema }),
  });
  return (
    <main className="mx-auto max-w-3xl p-gutter">
      <h1 className="text-title">Start a submission</h1>
      <p className="mt-2 text-basalt-soft">
        To {loaderData.venue.name}. The draft stays private to you and your co-authors until you send round 1 to the editor.
      </p>
      <Form method="post" {...getFormProps(form)} className="mt-6 flex flex-col gap-4">
        <TextField meta={fields.title} label="Title" />
        <TextArea meta={fields.abstract} label="Abstract" rows={6} textarea={getTextareaProps(fields.abstract)} />
        <TextField meta={fields.keywords} label="Keywords" hint="Separated by commas, e.g. stable layer, zonal flow, dynamo." />
        <TextArea
          meta={fields.availability}
          label="Data and code availability"
          rows={3}
          textarea={getTextareaProps(fields.availability)}
          hint="Where readers find the run records, input files and code."
        />
        <TextField meta={fields.dois} label="DOIs cited in the statement" hint="One or more, e.g. 10.5281/zenodo.1234567 — separated by commas or spaces." />
        <button type="submit" className="btn self-start">
          Create the draft
        </button>
      </Form>
    </main>
  );
}
