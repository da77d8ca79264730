/**
 * Who may see and do what in a round: the one access policy of Runproof. Pure data and one
 * function, no I/O, so every page, resource route and API call asks the same question and the
 * whole table can be read (and tested) at once.
 *
 * A relation is what the person is to this one round; a reviewer of round 1 is nobody to round 2
 * until invited again. A draft is private to its authors; a sent round is frozen.
 */

export const RELATIONS = ["author", "co-author", "editor", "reviewer", "invited", "admin", "none"] as const;
export type Relation = (typeof RELATIONS)[number];

/** States as the policy sees them: "withdrawn" is a sent round of a withdrawn submission. */
export const POLICY_STATES = ["draft", "sent", "under-review", "decided", "withdrawn"] as const;
export type PolicyState = (typeof POLICY_STATES)[number];

export const ACTIONS = [
  "open-round", // see that the round exists: its header and the tabs below
  "read-runs",
  "read-claims",
  "read-flags",
  "read-files",
  "read-changes",
  "read-packet",
  "read-decision", // the released letter and the remarks by "Reviewer N"
  "read-reports", // every reviewer's report before release, with verdicts
  "read-reviewer-identities",
  "read-editor-notes",
  "read-author-identities",
  "read-own-review",
  "read-details", // the authors' working copy: manuscript details, co-authors and their e-mail
  "write-details",
  "write-runs",
  "write-claims",
  "answer-flags",
  "send-round",
  "delete-draft", // delete the whole submission while its only round is an unsent draft
  "answer-remarks", // the authors' answers to released remarks, carried into the next round
  "respond-invitation",
  "review",
  "invite",
  "decide",
  "send-digest", // mail the authors this submission's digest now, outside its schedule
] as const;
export type Action = (typeof ACTIONS)[number];

export type Blinding = "single" | "double";

const READ_CONTENT: Action[] = ["open-round", "read-runs", "read-claims", "read-flags", "read-files", "read-changes"];
const AUTHOR_WRITES: Action[] = ["write-runs", "write-claims", "answer-flags", "write-details"];
const AUTHOR_READS: Action[] = ["open-round", "read-runs", "read-claims", "read-flags", "read-files", "read-changes", "read-details", "read-author-identities"];
const EDITOR_READS: Action[] = [
  ...READ_CONTENT,
  "read-packet",
  "read-reports",
  "read-reviewer-identities",
  "read-editor-notes",
  "read-author-identities",
];

type Grants = Partial<Record<PolicyState, readonly Action[]>>;

/** What each relation may do in each state; anything not listed is refused. */
const GRANTS: Record<Relation, Grants> = {
  author: {
    draft: [...AUTHOR_READS, ...AUTHOR_WRITES, "send-round", "delete-draft"],
    sent: AUTHOR_READS,
    "under-review": AUTHOR_READS,
    decided: [...AUTHOR_READS, "read-decision", "answer-remarks"],
    withdrawn: AUTHOR_READS,
  },
  "co-author": {
    draft: [...AUTHOR_READS, ...AUTHOR_WRITES],
    sent: AUTHOR_READS,
    "under-review": AUTHOR_READS,
    decided: [...AUTHOR_READS, "read-decision", "answer-remarks"],
    withdrawn: AUTHOR_READS,
  },
  editor: {
    sent: [...EDITOR_READS, "invite", "decide", "send-digest"],
    "under-review": [...EDITOR_READS, "invite", "decide", "send-digest"],
    decided: [...EDITOR_READS, "read-decision", "send-digest"],
    withdrawn: EDITOR_READS,
  },
  // The instance's administrator oversees but does not handle: reads what an editor reads.
  // …and may send a submission's digest out of schedule, as its editors may.
  admin: {
    sent: [...EDITOR_READS, "send-digest"],
    "under-review": [...EDITOR_READS, "send-digest"],
    decided: [...EDITOR_READS, "read-decision", "send-digest"],
    withdrawn: EDITOR_READS,
  },
  reviewer: {
    sent: [...READ_CONTENT, "read-packet", "read-own-review", "read-author-identities", "review"],
    "under-review": [...READ_CONTENT, "read-packet", "read-own-review", "read-author-identities", "review"],
    decided: [...READ_CONTENT, "read-packet", "read-own-review", "read-author-identities"],
    withdrawn: ["open-round", "read-own-review"],
  },
  // Invited, not yet accepted: sees the invitation (title, abstract, due date) and answers it.
  invited: {
    sent: ["open-round", "respond-invitation", "read-author-identities"],
    "under-review": ["open-round", "respond-invitation", "read-author-identities"],
  },
  none: {},
};

/** Double-blind venues hide who wrote the manuscript from those who review it. */
const BLINDED: ReadonlySet<Relation> = new Set(["reviewer", "invited"]);

export function can(relation: Relation, state: PolicyState, action: Action, blinding: Blinding = "single"): boolean {
  if (action === "read-author-identities" && blinding === "double" && BLINDED.has(relation)) return false;
  return GRANTS[relation][state]?.includes(action) ?? false;
}

/** The policy's state of a stored round (the database keeps "reviews-in" apart; the policy need not). */
export function policyState(roundState: string, submissionStage: string): PolicyState {
  if (roundState === "draft") return "draft";
  if (submissionStage === "withdrawn") return "withdrawn";
  if (roundState === "decided") return "decided";
  if (roundState === "sent") return "sent";
  return "under-review";
}

/** A person's relations to a round, strongest first: an author who also edits the venue is an author here. */
export function strongestRelation(held: Iterable<Relation>): Relation {
  const set = new Set(held);
  return RELATIONS.find((r) => set.has(r)) ?? "none";
}

/** Venue level: the desk lists sent rounds to the venue's editors (and the instance admin). */
export type VenueRelation = "editor" | "admin" | "none";
export function canAtVenue(relation: VenueRelation, action: "read-desk"): boolean {
  return action === "read-desk" && relation !== "none";
}
