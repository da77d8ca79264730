import { getFormProps } from "@conform-to/react";
import { useCheckedForm } from "~/components/checked-form";
import { getZodConstraint, parseWithZod } from "@conform-to/zod/v4";
import { data, Form, Link, redirect, href } from "react-router";
import { auth } from "~/auth/auth.server";
import { authErrorOf } from "~/auth/cookies.server";
import { resetSchema } from "~/auth/sign-in-forms";
import { FormErrors, TextField } from "~/components/field";
import type { Route } from "./+types/reset-password";

export const meta: Route.MetaFunction = () => [{ title: "New password · Runproof" }];

export function loader({ request }: Route.LoaderArgs) {
  const params = new URL(request.url).searchParams;
  return { token: params.get("token"), error: params.get("error") };
}

export async function action({ request }: Route.ActionArgs) {
  const submission = parseWithZod(await request.formData(), { schema: resetSchema });
  if (submission.status !== "success") {
    return data({ result: submission.reply({ hideFields: ["password", "confirm"] }) }, { status: 400 });
  }
  const res = await auth.api.resetPassword({
    body: { newPassword: submission.value.password, token: submission.value.token },
    headers: request.headers,
    asResponse: true,
  });
  if (!res.ok) {
    const err = await authErrorOf(res);
    return data(
      {
        result: submission.reply({
          formErrors: [
            err.code === "INVALID_TOKEN"
              ? "This link has expired or was already used. Ask for a new one."
              : (err.message ?? "The password could not be changed."),
          ],
          hideFields: ["password", "confirm"],
        }),
      },
      { status: 400 },
    );
  }
  throw redirect(`${href("/sign-in")}?reset=1`);
}

export default function ResetPassword({ loaderData, actionData }: Route.ComponentProps) {
  const [form, fields] = useCheckedForm({
    lastResult: actionData?.result,
    constraint: getZodConstraint(resetSchema),
    onValidate: ({ formData }) => parseWithZod(formData, { schema: resetSchema }),
  });
  if (!loaderData.token) {
    return (
      <main className="mx-auto max-w-md p-gutter">
        <h1 className="text-title">This link cannot be used</h1>
        <p className="mt-3">It has expired or was already used.</p>
        <p className="mt-3">
          <Link to={href("/forgot-password")}>Ask for a new link</Link>
        </p>
      </main>
    );
  }
  return (
    <main className="mx-auto max-w-md p-gutter">
      <h1 className="text-title">Choose a new password</h1>
      <Form method="post" {...getFormProps(form)} className="mt-6 flex flex-col gap-4">
        <input type="hidden" name="token" value={loaderData.token} />
        <TextField meta={fields.password} label="New password" type="password" autoComplete="new-password" hint="At least 10 characters." />
        <TextField meta={fields.confirm} label="Repeat the new password" type="password" autoComplete="new-password" />
        <button type="submit" className="btn self-start">
          Save the new password
        </button>
        {/* Below the button: when the message clears on blur, the button must not move under the pointer. */}
        <FormErrors errors={form.errors} id={form.errorId} />
      </Form>
    </main>
  );
}
