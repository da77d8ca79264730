import { getFormProps } from "@conform-to/react";
import { useCheckedForm } from "~/components/checked-form";
import { getZodConstraint, parseWithZod } from "@conform-to/zod/v4";
import { data, Form } from "react-router";
import { isAPIError } from "better-auth/api";
import { auth } from "~/auth/auth.server";
import { forgotSchema } from "~/auth/sign-in-forms";
import { FormErrors, TextField } from "~/components/field";
import type { Route } from "./+types/forgot-password";

export const meta: Route.MetaFunction = () => [{ title: "Forgot password · Runproof" }];

export async function action({ request }: Route.ActionArgs) {
  const submission = parseWithZod(await request.formData(), { schema: forgotSchema });
  if (submission.status !== "success") return data({ result: submission.reply(), sent: false }, { status: 400 });
  // The same answer whether or not the address has an account, so it cannot be probed.
  try {
    await auth.api.requestPasswordReset({
      body: { email: submission.value.email, redirectTo: "/reset-password" },
      headers: request.headers,
    });
  } catch (error) {
    // Too many mails asked for from this address or for this account: nothing is sent.
    if (isAPIError(error) && error.statusCode === 429) {
      return data({ result: submission.reply({ formErrors: [error.message] }), sent: false }, { status: 429 });
    }
    throw error;
  }
  return { result: submission.reply({ resetForm: true }), sent: true };
}

export default function ForgotPassword({ actionData }: Route.ComponentProps) {
  const [form, fields] = useCheckedForm({
    lastResult: actionData?.result,
    constraint: getZodConstraint(forgotSchema),
    onValidate: ({ formData }) => parseWithZod(formData, { schema: forgotSchema }),
  });
  return (
    <main className="mx-auto max-w-md p-gutter">
      <h1 className="text-title">Forgot your password?</h1>
      {actionData?.sent ? (
        <p className="mt-3 rounded bg-lichen-wash p-3" role="status">
          If an account uses that address, a link to choose a new password is on its way.
        </p>
      ) : null}
      <Form method="post" {...getFormProps(form)} className="mt-6 flex flex-col gap-4">
        <TextField meta={fields.email} label="E-mail" type="email" autoComplete="email" />
        <button type="submit" className="btn self-start">
          Send me a link
        </button>
        <FormErrors errors={form.errors} id={form.errorId} />
      </Form>
    </main>
  );
}
