/** Round states of the review cycle, shared by server modules and pages. */
export const OPEN_STATES = ["sent", "under-review", "reviews-in"] as const;

export const QUEUE_GROUPS = [
  { state: "sent", label: "New" },
  { state: "under-review", label: "Under review" },
  { state: "reviews-in", label: "Reviews in" },
  { state: "decided", label: "Decided" },
] as const;

const ROUND_STATE_WORDS: Record<string, string> = {
  draft: "draft, private to the authors",
  sent: "with the editor",
  "under-review": "with reviewers",
  "reviews-in": "reviews in",
  decided: "decided",
};

/** A round's state in words, as every page shows it. */
export function roundStateLabel(state: string) {
  return ROUND_STATE_WORDS[state] ?? state.replace(/-/g, " ");
}

const DECISION_WORDS: Record<string, string> = {
  accept: "Accept",
  "minor-revision": "Minor revision",
  "major-revision": "Major revision",
  reject: "Reject",
};

/** A decision or recommendation in words ("Major revision"), never its stored slug. */
export function decisionLabel(decision: string | null | undefined) {
  if (!decision) return "not decided yet";
  return DECISION_WORDS[decision] ?? decision.replace(/-/g, " ");
}
