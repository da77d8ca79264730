import { describe, expect, it } from "vitest";
import { filterFlags, groupFlags, onlyFlagQueryChanged, parseFlagQuery, summariseGroups, withFlagQuery, type FlagGrouping } from "~/review/flag-table";
import { verdictSchema } from "~/review/review-forms";

type F = { id: string; severity: string; family: string; claimId: string | null; claimTitle: string | null; runLabel: string | null; rule: string; ruleTitle: string };
const flag = (id: string, severity: string, family: string, claimId: string | null, runLabel: string | null): F => ({
  id,
  severity,
  family,
  claimId,
  claimTitle: claimId ? `Fig. ${claimId}` : null,
  runLabel,
  rule: `${family}.rule`,
  ruleTitle: `Rule of family ${family}`,
});

const flags: F[] = [
  flag("1", "note", "B", "3", "ref-A"),
  flag("2", "mismatch", "A", null, "strat-B"),
  flag("3", "mismatch", "G", "3", "strat-B"),
  flag("4", "caution", "D", null, "strat-B"),
  flag("5", "mismatch", "G", "10", null),
];

describe("the flags table's query", () => {
  it("reads grouping and filters from the address and ignores what it does not know", () => {
    expect(parseFlagQuery(new URLSearchParams("group=run&severity=caution&family=D&verdict=dispute"))).toEqual({ group: "run", severity: "caution", family: "D", verdict: "dispute" });
    expect(parseFlagQuery(new URLSearchParams("group=nonsense&severity=fatal&family=AB&verdict=maybe"))).toEqual({ group: "claim", severity: "", family: "", verdict: "" });
  });

  it("writes only what differs from the defaults and keeps other parameters", () => {
    const out = withFlagQuery(new URLSearchParams("page=2&severity=note"), { group: "claim", severity: "", family: "G", verdict: "none" });
    expect(out.toString()).toBe("page=2&family=G&verdict=none");
  });

  it("filters by severity, family and verdict; 'none' keeps flags nobody judged", () => {
    const verdicts: Record<string, string[]> = { "2": ["dispute"], "3": ["agree", "dispute"] };
    const of = (id: string) => verdicts[id] ?? [];
    const ids = (q: string) => filterFlags(flags, parseFlagQuery(new URLSearchParams(q)), of).map((f) => f.id);
    expect(ids("severity=mismatch")).toEqual(["2", "3", "5"]);
    expect(ids("family=G")).toEqual(["3", "5"]);
    expect(ids("verdict=dispute")).toEqual(["2", "3"]);
    expect(ids("verdict=agree")).toEqual(["3"]);
    expect(ids("verdict=none")).toEqual(["1", "4", "5"]);
    expect(ids("severity=mismatch&verdict=none")).toEqual(["5"]);
  });

  it("groups by claim or by run with counts, in natural label order, unattached last, mismatches first", () => {
    const byClaim = groupFlags(flags, "claim");
    expect(byClaim.map((g) => g.label)).toEqual(["Fig. 3", "Fig. 10", "Not tied to a claim"]);
    expect(byClaim[0]!.flags.map((f) => f.id)).toEqual(["3", "1"]);
    expect(byClaim[0]!.counts).toEqual({ mismatch: 1, caution: 0, note: 1 });
    const byRun = groupFlags(flags, "run");
    expect(byRun.map((g) => [g.label, g.flags.length])).toEqual([["Run ref-A", 1], ["Run strat-B", 3], ["Not tied to one run", 1]]);
    expect(byRun[1]!.counts).toEqual({ mismatch: 2, caution: 1, note: 0 });
    // Every flag lands in exactly one group.
    expect(byRun.flatMap((g) => g.flags).length).toBe(flags.length);
  });

  it("groups by rule too, and a view offering other groupings starts from its own default", () => {
    expect(groupFlags(flags, "rule").map((g) => [g.key, g.flags.length])).toEqual([["A.rule", 1], ["B.rule", 1], ["D.rule", 1], ["G.rule", 2]]);
    const panel: FlagGrouping[] = ["rule", "claim", "run"];
    expect(parseFlagQuery(new URLSearchParams(""), panel).group).toBe("rule");
    expect(parseFlagQuery(new URLSearchParams("group=run"), panel).group).toBe("run");
    // The reviewers' table offers no rule grouping: the address cannot ask for one.
    expect(parseFlagQuery(new URLSearchParams("group=rule")).group).toBe("claim");
    expect(withFlagQuery(new URLSearchParams("group=run"), { group: "rule", severity: "", family: "", verdict: "" }, "rule").toString()).toBe("");
  });

  it("counts groups from counted rows exactly as from the flags themselves", () => {
    // Rows of n alike flags, as SQL's GROUP BY gives them; expanded, they must group the same way.
    const counted = [
      { ...flag("-", "mismatch", "G", "3", "strat-B"), n: 4 },
      { ...flag("-", "note", "B", "3", "ref-A"), n: 2 },
      { ...flag("-", "caution", "D", null, "strat-B"), n: 3 },
      { ...flag("-", "mismatch", "A", null, null), n: 1 },
    ];
    const expanded = counted.flatMap((r) => Array.from({ length: r.n }, (_, i) => ({ ...r, id: `${r.rule}-${i}` })));
    for (const by of ["claim", "run", "rule"] as const) {
      expect(summariseGroups(counted, by)).toEqual(groupFlags(expanded, by).map((g) => ({ key: g.key, label: g.label, total: g.flags.length, counts: g.counts })));
    }
    expect(summariseGroups(counted, "run").map((g) => [g.label, g.total])).toEqual([["Run ref-A", 2], ["Run strat-B", 7], ["Not tied to one run", 1]]);
  });

  it("tells a change of filters from a change of page", () => {
    const u = (s: string) => new URL(`http://x.example/venues/v/review${s}`);
    expect(onlyFlagQueryChanged(u("?group=claim"), u("?group=run&verdict=none"))).toBe(true);
    expect(onlyFlagQueryChanged(u("?page=1"), u("?page=2&group=run"))).toBe(false);
    expect(onlyFlagQueryChanged(u(""), u(""))).toBe(false);
    expect(onlyFlagQueryChanged(u("?group=run"), new URL("http://x.example/venues/v/desk?group=run"))).toBe(false);
  });
});

describe("a verdict's reason", () => {
  const base = { intent: "verdict", flagId: "0b6c9a0e-3f7e-4a8b-9c1d-2e3f4a5b6c7d" } as const;
  it("is required to dispute or to ask the authors, not to agree", () => {
    expect(verdictSchema.safeParse({ ...base, verdict: "agree" }).success).toBe(true);
    const dispute = verdictSchema.safeParse({ ...base, verdict: "dispute" });
    expect(dispute.success).toBe(false);
    expect(dispute.error!.issues[0]!.message).toContain("Say why you dispute this flag");
    expect(verdictSchema.safeParse({ ...base, verdict: "ask-authors", reason: "   " }).success).toBe(false);
    expect(verdictSchema.safeParse({ ...base, verdict: "ask-authors", reason: "Which η?" }).success).toBe(true);
  });
  it("is bounded", () => {
    expect(verdictSchema.safeParse({ ...base, verdict: "dispute", reason: "x".repeat(2000) }).success).toBe(true);
    const long = verdictSchema.safeParse({ ...base, verdict: "dispute", reason: "x".repeat(2001) });
    expect(long.success).toBe(false);
    expect(long.error!.issues[0]!.message).toContain("2,000 characters");
  });
});
