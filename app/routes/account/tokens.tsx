import { getFormProps, getInputProps, getSelectProps } from "@conform-to/react";
import { useCheckedForm } from "~/components/checked-form";
import { getZodConstraint, parseWithZod } from "@conform-to/zod/v4";
import { data, Form, Link, useNavigation, href } from "react-router";
import { createApiToken, listApiTokens, revokeApiToken } from "~/api/api-tokens.server";
import { createTokenSchema, revokeTokenSchema, scopesFor } from "~/api/token-form";
import { requireUser } from "~/access/session.server";
import { TextField } from "~/components/field";
import type { Route } from "./+types/tokens";

export const meta: Route.MetaFunction = () => [{ title: "API tokens · Runproof" }];

export async function loader(args: Route.LoaderArgs) {
  const { user, db } = await requireUser(args);
  const tokens = await listApiTokens(db, user.id);
  return { tokens: tokens.map((t) => ({ ...t, expired: t.expiresAt.getTime() <= Date.now() })) };
}

export async function action(args: Route.ActionArgs) {
  const { user, db } = await requireUser(args);
  const formData = await args.request.formData();
  if (formData.get("intent") === "revoke") {
    const parsed = revokeTokenSchema.safeParse(Object.fromEntries(formData));
    if (!parsed.success || !(await revokeApiToken(db, user.id, parsed.data.tokenId))) {
      throw data("Not found", { status: 404 });
    }
    return { result: undefined, created: null, revoked: parsed.data.tokenId };
  }
  const submission = parseWithZod(formData, { schema: createTokenSchema });
  if (submission.status !== "success") return data({ result: submission.reply(), created: null, revoked: null }, { status: 400 });
  const { name, access, expiresInDays } = submission.value;
  const token = await createApiToken(db, { userId: user.id, name, scopes: [...scopesFor(access)], expiresInDays });
  // The secret travels in this one response only; it is never stored or shown again.
  return { result: submission.reply({ resetForm: true }), created: { name, secret: token.secret, expiresAt: token.expiresAt.toISOString() }, revoked: null };
}

const day = (d: Date | string) => new Date(d).toISOString().slice(0, 10);

export default function AccountTokens({ loaderData, actionData }: Route.ComponentProps) {
  const navigation = useNavigation();
  const [form, fields] = useCheckedForm({
    lastResult: navigation.state === "idle" ? actionData?.result : undefined,
    defaultValue: { access: "write", expiresInDays: "90" },
    constraint: getZodConstraint(createTokenSchema),
    onValidate: ({ formData }) => parseWithZod(formData, { schema: createTokenSchema }),
  });
  return (
    <main className="mx-auto max-w-2xl p-gutter">
      <p className="text-caption">
        <Link to={href("/account")} className="underline">Your account</Link> › API tokens
      </p>
      <h1 className="text-title">API tokens</h1>
      <p className="mt-2 text-basalt-soft">
        Scripts on your cluster use a token to push run records and series to your draft rounds. See{" "}
        <Link to={href("/help/api")} className="underline">the API guide</Link> for examples.
      </p>
      {actionData?.created ? (
        <section className="card mt-4 border-lichen" role="status" aria-label="New token">
          <h2 className="font-semibold">Token “{actionData.created.name}” created</h2>
          <p className="mt-1">Copy it now: it is shown only this once. It expires on {day(actionData.created.expiresAt)}.</p>
          <code className="mt-2 block break-all rounded bg-vellum-deep p-2 font-mono" data-testid="new-token">
            {actionData.created.secret}
          </code>
        </section>
      ) : null}
      <Form method="post" {...getFormProps(form)} className="card mt-6 flex flex-col gap-4">
        <h2 className="font-semibold">New token</h2>
        <input type="hidden" name="intent" value="create" />
        <TextField meta={fields.name} label="Name" hint="Where the token is used, e.g. “Lanthorn cluster”." />
        <div className="flex flex-col gap-1">
          <label htmlFor={fields.access.id} className="font-semibold">What it may do</label>
          <select {...getSelectProps(fields.access)} key={fields.access.key} className="field-input">
            <option value="write">read, and add or change runs, series and claims of draft rounds</option>
            <option value="read">read only</option>
          </select>
          <p id={fields.access.errorId} className="field-error">{fields.access.errors?.join(" ")}</p>
        </div>
        <div className="flex flex-col gap-1">
          <label htmlFor={fields.expiresInDays.id} className="font-semibold">Expires after (days)</label>
          <input {...getInputProps(fields.expiresInDays, { type: "number" })} key={fields.expiresInDays.key} className="field-input w-32" />
          <p id={fields.expiresInDays.errorId} className="field-error" role={fields.expiresInDays.errors ? "alert" : undefined}>
            {fields.expiresInDays.errors?.join(" ")}
          </p>
        </div>
        <button type="submit" className="btn self-start">Create token</button>
      </Form>
      <h2 className="mt-8 font-semibold">Your tokens</h2>
      {loaderData.tokens.length === 0 ? (
        <p className="mt-2 text-basalt-soft">No tokens yet.</p>
      ) : (
        <table className="mt-2 w-full text-left">
          <thead>
            <tr><th>Name</th><th>Starts with</th><th>Scopes</th><th>Expires</th><th>Last used</th><th><span className="sr-only">Actions</span></th></tr>
          </thead>
          <tbody>
            {loaderData.tokens.map((t) => (
              <tr key={t.id} className="border-t border-rule">
                <td>{t.name}</td>
                <td><code>{t.prefix}…</code></td>
                <td>{t.scopes.join(", ")}</td>
                <td>{day(t.expiresAt)}{t.expired ? " (expired)" : ""}</td>
                <td>{t.lastUsedAt ? day(t.lastUsedAt) : "never"}</td>
                <td>
                  {t.revokedAt ? (
                    <span>revoked {day(t.revokedAt)}</span>
                  ) : (
                    <Form method="post">
                      <input type="hidden" name="intent" value="revoke" />
                      <input type="hidden" name="tokenId" value={t.id} />
                      <button type="submit" className="btn-quiet" aria-label={`Revoke ${t.name}`}>Revoke</button>
                    </Form>
                  )}
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      )}
    </main>
  );
}
