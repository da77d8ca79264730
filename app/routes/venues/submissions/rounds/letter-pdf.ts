import { data } from "react-router";
import { requireRound } from "~/access/page-guards.server";
import { letterFor, pdfResponse } from "~/review/documents.server";
import type { Route } from "./+types/letter-pdf";

/** The released decision letter with remarks: authors, co-authors and the venue's editors. */
export async function loader(args: Route.LoaderArgs) {
  const { db, access: ctx } = await requireRound(args, "read-decision");
  if (!ctx.round.releasedAt) throw data("No decision has been released for this round yet.", { status: 404 });
  return pdfResponse(await letterFor(db, ctx), `decision-round-${ctx.round.number}.pdf`);
}
