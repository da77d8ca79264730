import { getFormProps, getInputProps, getTextareaProps } from "@conform-to/react";
import { useCheckedForm } from "~/components/checked-form";
import { getZodConstraint, parseWithZod } from "@conform-to/zod/v4";
import { data, Form } from "react-router";
import { TextField } from "~/components/field";
import { TextArea } from "~/components/workspace/text-area";
import { serviceError } from "~/workspace/action-errors.server";
import { requireLatestRound } from "~/access/page-guards.server";
import { inviteContributor, revokeContributorInvite } from "~/workspace/contributors.server";
import { clientAddress } from "~/lib/client-address";
import { CREDIT_ROLES } from "~/workspace/credit";
import { contributorSchema, submissionFields, submissionSchema } from "~/workspace/submission-form";
import { submissionContributors, submissionHeader, updateSubmission } from "~/workspace/submissions.server";
import type { Route } from "./+types/details";

export const meta: Route.MetaFunction = () => [{ title: "Manuscript details · Runproof" }];

export async function loader(args: Route.LoaderArgs) {
  const { db, found, access } = await requireLatestRound(args, "read-details");
  const [{ submission: s }, people] = await Promise.all([submissionHeader(db, found.submission.id), submissionContributors(db, found.submission.id)]);
  return { s, people, canEdit: access.can("write-details") };
}

export async function action(args: Route.ActionArgs) {
  const { db, found, user } = await requireLatestRound(args, "write-details");
  const submission = found.submission;
  const formData = await args.request.formData();
  if (formData.get("intent") === "invite") {
    const parsed = parseWithZod(formData, { schema: contributorSchema });
    if (parsed.status !== "success") return data({ form: "invite", result: parsed.reply() }, { status: 400 });
    try {
      await inviteContributor(db, { submissionId: submission.id, invitedBy: user.id, ...parsed.value, fromAddress: clientAddress(args.request) });
    } catch (e) {
      const r = serviceError(e);
      return data({ form: "invite", result: parsed.reply({ fieldErrors: { email: [r.data.error.message] } }) }, { status: r.init?.status ?? 400 });
    }
    return { form: "invite", result: parsed.reply({ resetForm: true }) };
  }
  if (formData.get("intent") === "revoke-invite") {
    // The link in the mail stops working; the person stays listed and can be invited again.
    const contributorId = String(formData.get("contributorId") ?? "");
    const withdrawn = /^[0-9a-f-]{36}$/i.test(contributorId) && (await revokeContributorInvite(db, { submissionId: submission.id, contributorId }));
    return data({ form: "revoke", withdrawn, result: undefined }, { status: withdrawn ? 200 : 404 });
  }
  const parsed = parseWithZod(formData, { schema: submissionSchema });
  if (parsed.status !== "success") return data({ form: "details", result: parsed.reply() }, { status: 400 });
  await updateSubmission(db, submission.id, submissionFields(parsed.value));
  return { form: "details", result: parsed.reply() };
}

export default function Details({ loaderData: { s, people, canEdit }, actionData }: Route.ComponentProps) {
  const [form, fields] = useCheckedForm({
    id: "details",
    lastResult: actionData?.form === "details" ? actionData.result : undefined,
    constraint: getZodConstraint(submissionSchema),
    onValidate: ({ formData }) => parseWithZod(formData, { schema: submissionSchema }),
    defaultValue: { title: s.title, abstract: s.abstract, keywords: s.keywords.join(", "), availability: s.availability, dois: s.dois.join(", ") },
  });
  const [invite, inv] = useCheckedForm({
    id: "invite",
    lastResult: actionData?.form === "invite" ? actionData.result : undefined,
    constraint: getZodConstraint(contributorSchema),
    onValidate: ({ formData }) => parseWithZod(formData, { schema: contributorSchema }),
  });
  return (
    <div className="mt-6 grid gap-6 md:grid-cols-2">
      {canEdit ? null : (
        <p className="card md:col-span-2" data-testid="details-frozen">
          The latest round was sent to the editor, so these details are frozen as sent. They open again for changes in the next round.
        </p>
      )}
      <section className="card" aria-labelledby="details-h">
        <h2 id="details-h" className="text-lead">
          Manuscript
        </h2>
        <Form method="post" {...getFormProps(form)} className="mt-3">
          <fieldset disabled={!canEdit} className="flex flex-col gap-3">
          <input type="hidden" name="intent" value="details" />
          <TextField meta={fields.title} label="Title" />
          <TextArea meta={fields.abstract} label="Abstract" rows={5} textarea={getTextareaProps(fields.abstract)} />
          <TextField meta={fields.keywords} label="Keywords" />
          <TextArea meta={fields.availability} label="Data and code availability" rows={3} textarea={getTextareaProps(fields.availability)} />
          <TextField meta={fields.dois} label="DOIs" hint="e.g. 10.5281/zenodo.1234567" />
          {canEdit ? (
            <button type="submit" className="btn self-start">
              Save the details
            </button>
          ) : null}
          </fieldset>
        </Form>
      </section>
      <section className="card" aria-labelledby="people-h">
        <h2 id="people-h" className="text-lead">
          Authors
        </h2>
        <ol className="mt-3 list-decimal pl-5" data-testid="contributors">
          {people.map((p) => (
            <li key={p.id} className="py-1">
              <span className="font-semibold">{p.name}</span> {p.corresponding ? <span className="text-caption">(corresponding)</span> : null}
              <div className="text-caption text-basalt-soft">
                {p.affiliation}
                {p.orcid ? ` · ORCID ${p.orcid}` : ""} · {p.joined ? "joined" : "invited, not yet joined"}
                {p.creditRoles.length ? ` · ${p.creditRoles.join(", ")}` : ""}
              </div>
              {p.joined || !canEdit ? null : (
                <Form method="post" className="mt-1">
                  <input type="hidden" name="intent" value="revoke-invite" />
                  <input type="hidden" name="contributorId" value={p.id} />
                  <button type="submit" className="text-caption underline">
                    Withdraw the invitation link
                  </button>
                </Form>
              )}
            </li>
          ))}
        </ol>
        {canEdit ? (
          <>
          <h3 className="mt-5 font-semibold">Invite a co-author</h3>
        <Form method="post" {...getFormProps(invite)} className="mt-2">
          <fieldset disabled={!canEdit} className="flex flex-col gap-3">
          <input type="hidden" name="intent" value="invite" />
          <TextField meta={inv.name} label="Name" />
          <TextField meta={inv.email} label="E-mail" type="email" />
          <TextField meta={inv.affiliation} label="Affiliation" />
          <TextField meta={inv.orcid} label="ORCID iD" hint="optional, e.g. 0000-0002-1825-0097" />
          <fieldset>
            <legend className="font-semibold">Contributor roles (CRediT, ANSI/NISO Z39.104-2022)</legend>
            <div className="mt-1 grid grid-cols-2 gap-1 text-caption">
              {CREDIT_ROLES.map((role, i) => (
                <label key={role} className="flex items-center gap-1">
                  <input {...getInputProps(inv.creditRoles, { type: "checkbox", value: role })} id={`credit-${i}`} key={role} />
                  {role}
                </label>
              ))}
            </div>
          </fieldset>
          <button type="submit" className="btn self-start">
            Send the invitation
          </button>
          </fieldset>
        </Form>
          </>
        ) : null}
      </section>
    </div>
  );
}
