import { requireRound } from "~/access/page-guards.server";
import { packetFor, pdfResponse } from "~/review/documents.server";
import type { Route } from "./+types/packet-pdf";

/** The reviewer packet of a round: for the venue's editors and the round's reviewers, once sent. */
export async function loader(args: Route.LoaderArgs) {
  const { db, access } = await requireRound(args, "read-packet");
  return pdfResponse(await packetFor(db, access), `packet-round-${access.round.number}.pdf`);
}
