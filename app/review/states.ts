/** Round states of the review cycle, shared by server modules and pages. */
export const OPEN_STATES = ["sent", "under-review", "reviews-in"] as const;

export const QUEUE_GROUPS = [
  { state: "sent", label: "New" },
  { state: "under-review", label: "Under review" },
  { state: "reviews-in", label: "Reviews in" },
  { state: "decided", label: "Decided" },
] as const;

// Words for states and decisions live in one module; these names stay importable from here.
export { decisionLabel, roundStateLabel } from "./labels";
