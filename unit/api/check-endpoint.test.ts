/**
 * POST /api/v1/check gives what the checker gives (and the CLI prints): derived.series
 * included, an unknown quantity refused with 400 and its path.
 */
import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { check } from "~/checker";
import { parseSeriesCsv } from "~/checker/csv";
import * as checkRoute from "~/routes/api/v1/check";
import { call } from "./fixture";

const read = (f: string) => JSON.parse(readFileSync(f, "utf8")) as Record<string, unknown>;
const body = {
  runs: [read("examples/runs/ref-A.json"), read("examples/runs/strat-B.json")],
  claim: read("examples/claims/layer-zonal-flow.json"),
  series: { "strat-B": parseSeriesCsv(readFileSync("examples/series/strat-B.csv", "utf8")) },
};
const post = (b: unknown) => call(checkRoute, null as never, { method: "POST", url: "/api/v1/check", params: {}, body: JSON.stringify(b) });

describe("POST /api/v1/check", () => {
  it("answers with the checker's output, derived.series included", async () => {
    const res = await post(body);
    expect(res.status).toBe(200);
    expect(res.body).toEqual(JSON.parse(JSON.stringify(check(body))));
    const s = res.body.runs[1].derived.series;
    expect(Object.keys(s)).toEqual(["kineticEnergy", "Re", "Rm"]);
    for (const k of ["mean", "stderr", "tauInt", "effectiveSamples", "transientEnd"]) expect(typeof s.Re[k]).toBe("number");
  });
  it("refuses an unknown quantity with 400 and the row's path", async () => {
    const bad = { ...body, claim: { ...(body.claim as object), stated: [{ quantity: "Elsasser", value: "≈ 1.3" }] } };
    const res = await post(bad);
    expect(res.status).toBe(400);
    expect(res.body.error.details.map((d: { path: string }) => d.path)).toEqual(["claim.stated[0].quantity"]);
    expect(res.body.error.details[0].message).toMatch(/did you mean "Lambda"/);
  });
});
