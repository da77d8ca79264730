import { data } from "react-router";
import { requireRound } from "~/access/page-guards.server";
import { sendDigestNow } from "~/review/digest.server";
import { RULES, takeAttempt, waitInWords } from "~/throttle/limits.server";
import type { DigestNowResult } from "~/components/review/digest-now";
import type { Route } from "./+types/digest";


const names = (list: { name: string; email: string }[]) => list.map((p) => `${p.name} (${p.email})`).join(", ");

/**
 * "Send the digest now" for the round's submission (editors of the venue and the admin, policy
 * action `send-digest`): each author and co-author who gets digests is mailed this submission's
 * news since their last digest. A few times an hour per submission at most.
 */
export async function action(args: Route.ActionArgs) {
  const { db, access } = await requireRound(args, "send-digest");
  const submissionId = access.submission.id;
  const wait = await takeAttempt(db, [{ rule: RULES.digestNowPerSubmission, key: submissionId }]);
  if (wait !== null) {
    return data<DigestNowResult>({ ok: false, message: `This submission's digest was sent several times in the last hour; try again in ${waitInWords(wait)}.` }, { status: 429 });
  }
  const out = await sendDigestNow(db, { submissionId });
  if (out.people === 0) return data<DigestNowResult>({ ok: true, message: "No author of this submission gets digests (each has turned them off), so nothing was sent." });
  const parts = [
    out.sentTo.length ? `Digest sent to ${names(out.sentTo)}.` : "Nothing was sent.",
    out.nothingNew.length ? `Nothing new since their last digest for ${names(out.nothingNew)}.` : "",
  ];
  return data<DigestNowResult>({ ok: true, message: parts.filter(Boolean).join(" ") });
}
