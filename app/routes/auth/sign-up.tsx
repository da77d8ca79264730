import { getFormProps } from "@conform-to/react";
import { useCheckedForm } from "~/components/checked-form";
import { getZodConstraint, parseWithZod } from "@conform-to/zod/v4";
import { data, Form, Link, redirect, useSearchParams, href } from "react-router";
import { auth } from "~/auth/auth.server";
import { apiErrorResponse, authErrorOf } from "~/auth/cookies.server";
import { safeNext, signUpSchema } from "~/auth/sign-in-forms";
import { FormErrors, TextField } from "~/components/field";
import type { Route } from "./+types/sign-up";

export const meta: Route.MetaFunction = () => [{ title: "Create an account · Runproof" }];

export async function action({ request }: Route.ActionArgs) {
  const submission = parseWithZod(await request.formData(), { schema: signUpSchema });
  if (submission.status !== "success") {
    return data({ result: submission.reply({ hideFields: ["password", "confirm"] }) }, { status: 400 });
  }
  const { name, email, password, next } = submission.value;
  const res = await auth.api.signUpEmail({
    // The confirmation link lands where the person was headed (e.g. a co-author invitation).
    body: { name, email, password, callbackURL: safeNext(next) },
    headers: request.headers,
    asResponse: true,
  }).catch(apiErrorResponse);
  if (!res.ok) {
    const err = await authErrorOf(res);
    const message =
      err.code === "USER_ALREADY_EXISTS" || err.code === "USER_ALREADY_EXISTS_USE_ANOTHER_EMAIL"
        ? "An account with this e-mail already exists. Sign in, or reset the password."
        : (err.message ?? "The account could not be created.");
    return data(
      { result: submission.reply({ formErrors: [message], hideFields: ["password", "confirm"] }) },
      { status: res.status === 429 ? 429 : 400 },
    );
  }
  throw redirect(`${href("/check-email")}?to=${encodeURIComponent(email)}`);
}

export default function SignUp({ actionData }: Route.ComponentProps) {
  const [params] = useSearchParams();
  const [form, fields] = useCheckedForm({
    lastResult: actionData?.result,
    constraint: getZodConstraint(signUpSchema),
    onValidate: ({ formData }) => parseWithZod(formData, { schema: signUpSchema }),
  });
  return (
    <main className="mx-auto max-w-md p-gutter">
      <h1 className="text-title">Create an account</h1>
      <p className="mt-2 text-basalt-soft">
        One account serves every role: editors and authors add you to venues and submissions.
      </p>
      <Form method="post" {...getFormProps(form)} className="mt-6 flex flex-col gap-4">
        <input type="hidden" name="next" value={params.get("next") ?? ""} />
        <TextField meta={fields.name} label="Name" autoComplete="name" />
        <TextField meta={fields.email} label="E-mail" type="email" autoComplete="email" />
        <TextField meta={fields.password} label="Password" type="password" autoComplete="new-password" hint="At least 10 characters." />
        <TextField meta={fields.confirm} label="Repeat the password" type="password" autoComplete="new-password" />
        <button type="submit" className="btn self-start">
          Create the account
        </button>
        {/* Below the button: when the message clears on blur, the button must not move under the pointer. */}
        <FormErrors errors={form.errors} id={form.errorId} />
      </Form>
      <p className="mt-6 text-caption">
        Already registered? <Link to={href("/sign-in")}>Sign in</Link>
      </p>
    </main>
  );
}
