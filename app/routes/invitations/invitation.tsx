import { data, Form, Link, redirect, href } from "react-router";
import { sessionUser } from "~/access/session.server";
import { dbContext } from "~/db.server";
import { roundContext } from "~/review/round-context.server";
import { invitationByToken, respondToInvitation } from "~/review/invitations.server";
import { StateConflict } from "~/workspace/types";
import type { Route } from "./+types/invitation";

export const meta: Route.MetaFunction = () => [{ title: "Invitation to review · Runproof" }, { name: "robots", content: "noindex" }];

/**
 * The link in the invitation mail. The token itself is the credential (stored hashed); GET only
 * shows the question, so a mail scanner following the link changes nothing.
 */
export async function loader(args: Route.LoaderArgs) {
  const db = args.context.get(dbContext);
  const { inv, problem } = await invitationByToken(db, args.params.token);
  if (!inv || problem) return data({ problem: problem ?? "This invitation link is not valid.", invitation: null, signedInAs: null, next: "" }, { status: inv ? 410 : 404 });
  const ctx = await roundContext(db, { roundId: inv.roundId });
  const me = await sessionUser(args);
  const answer = new URL(args.request.url).searchParams.get("answer");
  return {
    problem: null,
    invitation: { email: inv.email, dueAt: inv.dueAt.toISOString().slice(0, 10), title: ctx.submission.title, venue: ctx.venue.name, round: ctx.round.number, answer },
    signedInAs: me ? me.email : null,
    next: `${href("/invitations/:token", { token: args.params.token })}?answer=accept`,
  };
}

export async function action(args: Route.ActionArgs) {
  const db = args.context.get(dbContext);
  const form = await args.request.formData();
  const answer = form.get("answer") === "accept" ? "accept" : "decline";
  const me = await sessionUser(args);
  try {
    if (answer === "accept") {
      const { inv } = await invitationByToken(db, args.params.token);
      if (!me) throw redirect(`${href("/sign-in")}?next=${encodeURIComponent(`${href("/invitations/:token", { token: args.params.token })}?answer=accept`)}`);
      if (inv && me.email.toLowerCase() !== inv.email.toLowerCase()) {
        return data({ error: `This invitation is for ${inv.email}; you are signed in as ${me.email}. Sign in with the invited address to accept.`, declined: false }, { status: 403 });
      }
    }
    const { ctx } = await respondToInvitation(db, { token: args.params.token, answer, userId: me?.id ?? null });
    if (answer === "accept") throw redirect(href("/venues/:venueId/submissions/:submissionId/rounds/:round/review", { venueId: ctx.venue.id, submissionId: ctx.submission.id, round: String(ctx.round.number) }));
    return { error: null, declined: true };
  } catch (error) {
    if (error instanceof StateConflict) return data({ error: error.message, declined: false }, { status: 409 });
    throw error;
  }
}

export default function Invitation({ loaderData: d, actionData }: Route.ComponentProps) {
  if (actionData?.declined) {
    return (
      <main className="mx-auto max-w-xl p-gutter">
        <h1 className="text-title">Invitation declined</h1>
        <p className="mt-2" role="status">Thank you for letting the editor know. This link no longer works.</p>
      </main>
    );
  }
  if (d.problem || !d.invitation) {
    return (
      <main className="mx-auto max-w-xl p-gutter">
        <h1 className="text-title">Invitation link</h1>
        <p className="mt-2" role="alert" data-testid="invitation-problem">{d.problem}</p>
      </main>
    );
  }
  const inv = d.invitation;
  const wrongAccount = d.signedInAs && d.signedInAs.toLowerCase() !== inv.email.toLowerCase();
  return (
    <main className="mx-auto max-w-xl p-gutter">
      <h1 className="text-title">Invitation to review</h1>
      <p className="mt-2">
        {inv.venue} asks you to review round {inv.round} of <strong>{inv.title}</strong>, due on {inv.dueAt}.
      </p>
      {actionData?.error ? <p role="alert" className="mt-3 rounded border border-ember bg-ember-wash p-2 text-ember">{actionData.error}</p> : null}
      {!d.signedInAs ? (
        <p className="mt-3 text-caption">
          To accept, <Link className="underline" to={`${href("/sign-in")}?next=${encodeURIComponent(d.next)}`}>sign in</Link> as {inv.email} (or{" "}
          <Link className="underline" to={`${href("/sign-up")}?next=${encodeURIComponent(d.next)}`}>create an account</Link> with that address; once you confirm it you come back here). Declining needs no account.
        </p>
      ) : wrongAccount ? (
        <p className="mt-3 text-caption">You are signed in as {d.signedInAs}; the invitation is for {inv.email}.</p>
      ) : null}
      <Form method="post" className="mt-4 flex gap-3">
        <button className={inv.answer === "decline" ? "btn-quiet" : "btn"} type="submit" name="answer" value="accept">
          Accept and open the review
        </button>
        <button className={inv.answer === "decline" ? "btn" : "btn-quiet"} type="submit" name="answer" value="decline">
          Decline
        </button>
      </Form>
    </main>
  );
}
