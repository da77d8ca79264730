/**
 * Words for every state, recommendation, decision, verdict and audit entry people see. Stored
 * values are slugs (`major-revision`, `round.sent`); pages, mail and PDFs show these words.
 */

/** Lower case: pages set them inside a sentence ("Round 1 · with the editor"). */
const ROUND_STATES: Record<string, string> = {
  draft: "draft, private to the authors",
  sent: "with the editor",
  "under-review": "with reviewers",
  "reviews-in": "reviews in",
  decided: "decided",
};

const SUBMISSION_STAGES: Record<string, string> = {
  draft: "Draft, not yet sent",
  "with-editor": "Waiting for the editor",
  "in-review": "Under review",
  decided: "Decided",
  withdrawn: "Withdrawn",
};

const OUTCOMES: Record<string, string> = {
  accept: "Accept",
  "minor-revision": "Minor revision",
  "major-revision": "Major revision",
  reject: "Reject",
};

const INVITATION_STATES: Record<string, string> = {
  pending: "Awaiting an answer",
  accepted: "Accepted",
  declined: "Declined",
  withdrawn: "Withdrawn by the editor",
  expired: "Expired",
};

const REVIEW_STATES: Record<string, string> = {
  "in-progress": "Report in progress",
  submitted: "Report submitted",
};

const VERDICTS: Record<string, string> = {
  agree: "Agrees",
  dispute: "Disputes",
  "ask-authors": "Asks the authors",
};

const SEVERITIES: Record<string, string> = {
  mismatch: "Mismatch",
  caution: "Caution",
  note: "Note",
};

/** A stated value of a claim against the recomputed one (the claim page). */
const STATED_OUTCOMES: Record<string, string> = {
  agrees: "Agrees",
  differs: "Differs",
  unverifiable: "Cannot be recomputed",
  undecided: "Cannot be decided",
};

/** Last resort for a value this module does not know yet: "reviews-in" → "Reviews in". */
export function humanize(slug: string) {
  const words = slug.replace(/[._-]+/g, " ").trim();
  return words ? words[0]!.toUpperCase() + words.slice(1) : "";
}

const pick = (table: Record<string, string>) => (value: string | null | undefined) => (value ? (table[value] ?? humanize(value)) : "");

export const roundStateLabel = pick(ROUND_STATES);
export const submissionStageLabel = pick(SUBMISSION_STAGES);
/** The editor's decision and a reviewer's recommendation share one vocabulary. */
export const decisionLabel = (value: string | null | undefined) => (value ? pick(OUTCOMES)(value) : "not decided yet");
export const recommendationLabel = pick(OUTCOMES);
export const invitationStateLabel = pick(INVITATION_STATES);
export const reviewStateLabel = pick(REVIEW_STATES);
export const verdictLabel = pick(VERDICTS);
export const severityLabel = pick(SEVERITIES);
export const statedOutcomeLabel = pick(STATED_OUTCOMES);

/** Choices for forms, in the order people expect them. */
export const OUTCOME_CHOICES = Object.entries(OUTCOMES).map(([value, label]) => ({ value, label }));

/**
 * One audit entry as a sentence, e.g. "Round 1 sent to the editor". Detail fields are read
 * defensively: old rows may lack them.
 */
export function auditEntryLabel(action: string, detail: Record<string, unknown> = {}) {
  const round = typeof detail.round === "number" ? `round ${detail.round}` : "the round";
  const Round = round[0]!.toUpperCase() + round.slice(1);
  const who = typeof detail.email === "string" ? detail.email : "A reviewer";
  const reviewer = typeof detail.reviewer === "string" ? detail.reviewer : "A reviewer";
  switch (action) {
    case "submission.created":
      return "Submission created";
    case "round.sent":
      return `${Round} sent to the editor`;
    case "round.opened":
      return `${Round} opened for the authors' revision`;
    case "reviewer.invited":
      return `${who} invited to review ${round}`;
    case "invitation.resent":
      return `Invitation to ${who} for ${round} sent again`;
    case "invitation.withdrawn":
      return `Invitation to ${who} for ${round} withdrawn`;
    case "invitation.accepted":
      return `${who} accepted the invitation to review ${round}`;
    case "invitation.declined":
      return `${who} declined the invitation to review ${round}`;
    case "review.submitted":
      return `${reviewer} submitted a report on ${round}`;
    case "decision.made":
      return `Decision on ${round}: ${decisionLabel(typeof detail.decision === "string" ? detail.decision : "")}`.replace(/: $/, "");
    case "decision.released":
      return `Decision on ${round} released to the authors`;
    default:
      return humanize(action);
  }
}
