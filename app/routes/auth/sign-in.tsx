import { getFormProps } from "@conform-to/react";
import { useCheckedForm } from "~/components/checked-form";
import { getZodConstraint, parseWithZod } from "@conform-to/zod/v4";
import { data, Form, Link, redirect, useSearchParams, href } from "react-router";
import { auth } from "~/auth/auth.server";
import { apiErrorResponse, authErrorOf, forwardCookies } from "~/auth/cookies.server";
import { safeNext, signInSchema } from "~/auth/sign-in-forms";
import { sessionUser } from "~/access/session.server";
import { FormErrors, TextField } from "~/components/field";
import type { Route } from "./+types/sign-in";

export const meta: Route.MetaFunction = () => [{ title: "Sign in · Runproof" }];

export async function loader({ request, context }: Route.LoaderArgs) {
  if (await sessionUser({ request, context })) throw redirect(safeNext(new URL(request.url).searchParams.get("next")));
  return null;
}

export async function action({ request }: Route.ActionArgs) {
  const formData = await request.formData();
  const submission = parseWithZod(formData, { schema: signInSchema });
  if (submission.status !== "success") {
    return data({ result: submission.reply({ hideFields: ["password"] }) }, { status: 400 });
  }
  const res = await auth.api
    .signInEmail({
      // The callback is where a fresh confirmation link (sent when an unconfirmed person signs in) lands.
      body: { email: submission.value.email, password: submission.value.password, callbackURL: safeNext(submission.value.next) },
      headers: request.headers,
      asResponse: true,
    })
    .catch(apiErrorResponse);
  if (!res.ok) {
    const err = await authErrorOf(res);
    const message =
      err.code === "EMAIL_NOT_VERIFIED"
        ? "Confirm your e-mail address first: we have just sent you a new confirmation link."
        : res.status === 429
          ? (err.message ?? "Too many attempts. Wait a few minutes and try again.")
          : "That e-mail and password do not match an account.";
    return data(
      { result: submission.reply({ formErrors: [message], hideFields: ["password"] }) },
      { status: res.status === 429 ? 429 : 400 },
    );
  }
  throw redirect(safeNext(submission.value.next), { headers: forwardCookies(res) });
}

export default function SignIn({ actionData }: Route.ComponentProps) {
  const [params] = useSearchParams();
  const [form, fields] = useCheckedForm({
    lastResult: actionData?.result,
    constraint: getZodConstraint(signInSchema),
    onValidate: ({ formData }) => parseWithZod(formData, { schema: signInSchema }),
  });
  return (
    <main className="mx-auto max-w-md p-gutter">
      <h1 className="text-title">Sign in</h1>
      {params.get("verified") ? (
        <p className="mt-3 rounded bg-lichen-wash p-3" role="status">
          Your address is confirmed. Sign in to continue.
        </p>
      ) : null}
      {params.get("reset") ? (
        <p className="mt-3 rounded bg-lichen-wash p-3" role="status">
          Your password was changed. Sign in with the new one.
        </p>
      ) : null}
      <Form method="post" {...getFormProps(form)} className="mt-6 flex flex-col gap-4">
        <input type="hidden" name="next" value={params.get("next") ?? ""} />
        <TextField meta={fields.email} label="E-mail" type="email" autoComplete="email" />
        <TextField meta={fields.password} label="Password" type="password" autoComplete="current-password" />
        <button type="submit" className="btn self-start">
          Sign in
        </button>
        {/* Below the button: when the message clears on blur, the button must not move under the pointer. */}
        <FormErrors errors={form.errors} id={form.errorId} />
      </Form>
      <p className="mt-6 text-caption">
        <Link to={href("/forgot-password")}>Forgot your password?</Link> · <Link to={href("/sign-up")}>Create an account</Link>
      </p>
    </main>
  );
}
