/**
 * The claim editor: known quantities suggested with their names, the interval a stated value
 * means shown as it is typed (family B's precision rules), and ratio / scaling rows that
 * round-trip through runproof.claim/1.
 */
import { createElement } from "react";
import { renderToString } from "react-dom/server";
import { createRoutesStub } from "react-router";
import { describe, expect, it } from "vitest";
import { claimSchema } from "~/checker/schema";
import { ClaimEditor, claimDraftOf, recordOf } from "~/components/workspace/claim-editor";

const record = {
  format: "runproof.claim/1",
  title: "Layer",
  runs: [{ label: "ref-A", part: "reference" }, { label: "strat-B", part: "varied" }],
  stated: [
    { quantity: "E", value: "3.0e-5" },
    { quantity: "Elsasser", value: "≈ 1.3" },
    { quantity: "Lambda", ratio: ["strat-B", "ref-A"] as [string, string], value: "≈ 1.3" },
    { quantity: "Ro", scalesWith: "RaBuoyancy", value: "0.41 ± 0.03" },
    { quantity: "Pm", value: "two", run: "strat-B" },
  ],
};

function html() {
  const Stub = createRoutesStub([{ path: "/", Component: () => createElement(ClaimEditor, { initial: claimDraftOf({ figure: null, statement: "", record }), runLabels: ["ref-A", "strat-B"], intent: "create" }) }]);
  return renderToString(createElement(Stub, { initialEntries: ["/"] }));
}

describe("claim editor", () => {
  const page = html();
  it("shows the interval a value means as it is typed: 3.0e-5 → [2.95e-5, 3.05e-5)", () => {
    expect(page).toContain("3.0e-5 → [2.95e-5, 3.05e-5)");
    expect(page).toContain("0.41 ± 0.03 → [0.38, 0.44]");
    expect(page).toMatch(/cannot read &quot;two&quot; as a number/);
  });
  it("names known quantities and suggests one for an unknown name", () => {
    expect(page).toContain("Ekman number E");
    expect(page).toContain("not a known quantity — did you mean Lambda (Elsasser number Λ)?");
    expect(page).toContain('<datalist id="claim-quantities">');
  });
  it("ratio and scaling rows round-trip into a record the shared schema accepts (once the name is fixed)", () => {
    const back = recordOf(claimDraftOf({ figure: null, statement: "", record }));
    expect(back.stated).toEqual(record.stated);
    const fixed = { ...back, stated: back.stated!.filter((s) => s.quantity !== "Elsasser" && s.value !== "two") };
    expect(claimSchema.safeParse(fixed).success).toBe(true);
    expect(claimSchema.safeParse(back).success).toBe(false);
  });
});
