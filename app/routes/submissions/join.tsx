import { data, Form, href, Link, redirect } from "react-router";
import { sessionUser } from "~/access/session.server";
import { dbContext } from "~/db.server";
import { acceptContributorInvite } from "~/workspace/contributors.server";
import type { Route } from "./+types/join";

export const meta: Route.MetaFunction = () => [{ title: "Join a submission · Runproof" }];

/** The co-author invitation link: signed in, it offers to attach the account; else it says how. */
export async function loader({ request, params, context }: Route.LoaderArgs) {
  const user = await sessionUser({ request, context });
  const url = new URL(request.url);
  if (!url.searchParams.get("token")) throw data("This invitation link is incomplete; open the link from the e-mail again.", { status: 400 });
  return { signedIn: Boolean(user), next: url.pathname + url.search, submissionId: params.submissionId };
}

export async function action(args: Route.ActionArgs) {
  const user = await sessionUser(args);
  if (!user) throw redirect(`${href("/sign-in")}?next=${encodeURIComponent(new URL(args.request.url).pathname + new URL(args.request.url).search)}`);
  const token = String((await args.request.formData()).get("token") ?? "");
  const answer = await acceptContributorInvite(args.context.get(dbContext), { submissionId: args.params.submissionId, token, userId: user.id });
  if (!answer.ok) throw data(answer.message, { status: answer.reason === "other-address" ? 403 : answer.reason === "expired" ? 410 : 404 });
  throw redirect(href("/submissions/:submissionId", { submissionId: args.params.submissionId }));
}

export default function Join({ loaderData: d }: Route.ComponentProps) {
  const token = new URLSearchParams(d.next.split("?")[1] ?? "").get("token") ?? "";
  return (
    <main className="mx-auto max-w-xl p-gutter">
      <h1 className="text-title">Join the submission as a co-author</h1>
      {d.signedIn ? (
        <Form method="post" className="mt-4">
          <input type="hidden" name="token" value={token} />
          <p>Attach your account to the submission: you will see its rounds, runs and flags and get its mail.</p>
          <button type="submit" className="btn mt-4">
            Join the submission
          </button>
        </Form>
      ) : (
        <p className="mt-4">
          <Link to={`${href("/sign-in")}?next=${encodeURIComponent(d.next)}`}>Sign in</Link> to join. No account yet?{" "}
          <Link to={`${href("/sign-up")}?next=${encodeURIComponent(d.next)}`}>Create one</Link> with the address the invitation was sent
          to; the confirmation link brings you back here.
        </p>
      )}
    </main>
  );
}
