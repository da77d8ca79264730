/**
 * The access policy, cell by cell. The table below is written out by hand from the product's
 * rules (brief: drafts private to their authors, reviewer identities and editor-only notes never
 * reach authors, double-blind hides authors from reviewers; a sent round is frozen). Columns of
 * each string: draft, sent, under review, decided, withdrawn; "x" allowed, "." refused.
 */
import { describe, expect, it } from "vitest";
import { ACTIONS, can, policyState, POLICY_STATES, RELATIONS, strongestRelation, type Action, type Relation } from "~/access/round-policy";

const TABLE: Record<Action, Record<Relation, string>> = {
  "open-round": { author: "xxxxx", "co-author": "xxxxx", editor: ".xxxx", reviewer: ".xxxx", invited: ".xx..", admin: ".xxxx", none: "....." },
  "read-runs": { author: "xxxxx", "co-author": "xxxxx", editor: ".xxxx", reviewer: ".xxx.", invited: ".....", admin: ".xxxx", none: "....." },
  "read-claims": { author: "xxxxx", "co-author": "xxxxx", editor: ".xxxx", reviewer: ".xxx.", invited: ".....", admin: ".xxxx", none: "....." },
  "read-flags": { author: "xxxxx", "co-author": "xxxxx", editor: ".xxxx", reviewer: ".xxx.", invited: ".....", admin: ".xxxx", none: "....." },
  "read-files": { author: "xxxxx", "co-author": "xxxxx", editor: ".xxxx", reviewer: ".xxx.", invited: ".....", admin: ".xxxx", none: "....." },
  "read-changes": { author: "xxxxx", "co-author": "xxxxx", editor: ".xxxx", reviewer: ".xxx.", invited: ".....", admin: ".xxxx", none: "....." },
  "read-packet": { author: ".....", "co-author": ".....", editor: ".xxxx", reviewer: ".xxx.", invited: ".....", admin: ".xxxx", none: "....." },
  "read-decision": { author: "...x.", "co-author": "...x.", editor: "...x.", reviewer: ".....", invited: ".....", admin: "...x.", none: "....." },
  "read-reports": { author: ".....", "co-author": ".....", editor: ".xxxx", reviewer: ".....", invited: ".....", admin: ".xxxx", none: "....." },
  "read-reviewer-identities": { author: ".....", "co-author": ".....", editor: ".xxxx", reviewer: ".....", invited: ".....", admin: ".xxxx", none: "....." },
  "read-editor-notes": { author: ".....", "co-author": ".....", editor: ".xxxx", reviewer: ".....", invited: ".....", admin: ".xxxx", none: "....." },
  "read-author-identities": { author: "xxxxx", "co-author": "xxxxx", editor: ".xxxx", reviewer: ".xxx.", invited: ".xx..", admin: ".xxxx", none: "....." },
  "read-own-review": { author: ".....", "co-author": ".....", editor: ".....", reviewer: ".xxxx", invited: ".....", admin: ".....", none: "....." },
  "read-details": { author: "xxxxx", "co-author": "xxxxx", editor: ".....", reviewer: ".....", invited: ".....", admin: ".....", none: "....." },
  "write-details": { author: "x....", "co-author": "x....", editor: ".....", reviewer: ".....", invited: ".....", admin: ".....", none: "....." },
  "write-runs": { author: "x....", "co-author": "x....", editor: ".....", reviewer: ".....", invited: ".....", admin: ".....", none: "....." },
  "write-claims": { author: "x....", "co-author": "x....", editor: ".....", reviewer: ".....", invited: ".....", admin: ".....", none: "....." },
  "answer-flags": { author: "x....", "co-author": "x....", editor: ".....", reviewer: ".....", invited: ".....", admin: ".....", none: "....." },
  "send-round": { author: "x....", "co-author": ".....", editor: ".....", reviewer: ".....", invited: ".....", admin: ".....", none: "....." },
  "delete-draft": { author: "x....", "co-author": ".....", editor: ".....", reviewer: ".....", invited: ".....", admin: ".....", none: "....." },
  "answer-remarks": { author: "...x.", "co-author": "...x.", editor: ".....", reviewer: ".....", invited: ".....", admin: ".....", none: "....." },
  "respond-invitation": { author: ".....", "co-author": ".....", editor: ".....", reviewer: ".....", invited: ".xx..", admin: ".....", none: "....." },
  "review": { author: ".....", "co-author": ".....", editor: ".....", reviewer: ".xx..", invited: ".....", admin: ".....", none: "....." },
  "invite": { author: ".....", "co-author": ".....", editor: ".xx..", reviewer: ".....", invited: ".....", admin: ".....", none: "....." },
  "decide": { author: ".....", "co-author": ".....", editor: ".xx..", reviewer: ".....", invited: ".....", admin: ".....", none: "....." },
  // The authors' digest, sent now by the venue's editors or the instance admin; never on a draft or a withdrawn submission.
  "send-digest": { author: ".....", "co-author": ".....", editor: ".xxx.", reviewer: ".....", invited: ".....", admin: ".xxx.", none: "....." },
};

describe("access policy", () => {
  it("has a hand-written expectation for every relation × state × action", () => {
    expect(Object.keys(TABLE).sort()).toEqual([...ACTIONS].sort());
    for (const action of ACTIONS) expect(Object.keys(TABLE[action]).sort()).toEqual([...RELATIONS].sort());
  });

  it("answers each cell as the table says (single-blind venue)", () => {
    let cells = 0;
    for (const action of ACTIONS) {
      for (const relation of RELATIONS) {
        POLICY_STATES.forEach((state, i) => {
          cells++;
          expect(can(relation, state, action), `${relation} / ${state} / ${action}`).toBe(TABLE[action][relation][i] === "x");
        });
      }
    }
    expect(cells).toBe(ACTIONS.length * RELATIONS.length * POLICY_STATES.length);
  });

  it("hides the authors from reviewers and invitees at a double-blind venue, and from nobody else", () => {
    for (const relation of RELATIONS) {
      POLICY_STATES.forEach((state, i) => {
        const single = TABLE["read-author-identities"][relation][i] === "x";
        const expected = relation === "reviewer" || relation === "invited" ? false : single;
        expect(can(relation, state, "read-author-identities", "double"), `${relation} / ${state}`).toBe(expected);
      });
    }
  });

  it("never lets anyone but the authors see a draft", () => {
    for (const relation of RELATIONS.filter((r) => r !== "author" && r !== "co-author")) {
      for (const action of ACTIONS) expect(can(relation, "draft", action), `${relation} / ${action}`).toBe(false);
    }
  });

  it("maps stored states onto the policy's states", () => {
    expect(policyState("draft", "withdrawn")).toBe("draft");
    expect(policyState("sent", "with-editor")).toBe("sent");
    expect(policyState("reviews-in", "in-review")).toBe("under-review");
    expect(policyState("under-review", "in-review")).toBe("under-review");
    expect(policyState("decided", "decided")).toBe("decided");
    expect(policyState("sent", "withdrawn")).toBe("withdrawn");
  });

  it("takes the strongest relation when a person holds several", () => {
    expect(strongestRelation(["editor", "author"])).toBe("author");
    expect(strongestRelation(["reviewer", "co-author"])).toBe("co-author");
    expect(strongestRelation(["admin", "editor"])).toBe("editor");
    expect(strongestRelation(["invited", "admin"])).toBe("invited");
    expect(strongestRelation([])).toBe("none");
  });
});
