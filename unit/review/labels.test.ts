import { describe, expect, it } from "vitest";
import { decisionEnum, recommendationEnum, roundStateEnum, submissionStageEnum, invitationStateEnum } from "~db/schema";
import { auditEntryLabel, decisionLabel, invitationStateLabel, recommendationLabel, roundStateLabel, submissionStageLabel } from "~/review/labels";

// Every value the database can hold has words written for it (not the fallback that only re-cases the slug).
describe("labels", () => {
  const worded = (fn: (v: string) => string, values: readonly string[], capital = true) => {
    for (const v of values) {
      const label = fn(v);
      expect(label, v).not.toMatch(/[-_.]/);
      if (capital) expect(label[0], v).toBe(label[0]!.toUpperCase());
    }
  };

  it("words every round state, stage, decision, recommendation and invitation state", () => {
    worded(roundStateLabel, roundStateEnum.enumValues, false);
    worded(submissionStageLabel, submissionStageEnum.enumValues);
    worded(decisionLabel, decisionEnum.enumValues);
    worded(recommendationLabel, recommendationEnum.enumValues);
    worded(invitationStateLabel, invitationStateEnum.enumValues);
    expect(decisionLabel("major-revision")).toBe("Major revision");
  });

  it("writes audit entries as sentences", () => {
    expect(auditEntryLabel("round.sent", { round: 1 })).toBe("Round 1 sent to the editor");
    expect(auditEntryLabel("decision.made", { round: 2, decision: "major-revision" })).toBe("Decision on round 2: Major revision");
    expect(auditEntryLabel("review.submitted", { round: 1, reviewer: "Reviewer 2" })).toBe("Reviewer 2 submitted a report on round 1");
    expect(auditEntryLabel("something.new")).toBe("Something new");
  });
});
