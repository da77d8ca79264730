import { describe, expect, it } from "vitest";
import { groupDigests, periodKey, type DigestEvent, type DigestFrequency } from "~/review/digest-grouping";

const at = new Date("2026-12-01T08:00:00Z");
const ev = (email: string, submissionId: string, text: string): DigestEvent => ({ email, submissionId, submissionTitle: `Paper ${submissionId}`, kind: "flags", text, at });

describe("digest grouping", () => {
  it("makes one message per person per period even across several submissions", () => {
    const events = [ev("a@x.example", "s1", "2 flags"), ev("a@x.example", "s2", "1 decision"), ev("a@x.example", "s1", "3 remarks"), ev("b@x.example", "s1", "2 flags")];
    const prefs = new Map<string, DigestFrequency>([["a@x.example", "daily"], ["b@x.example", "weekly"]]);
    const out = groupDigests(events, prefs, at);
    expect(out.map((m) => m.email).sort()).toEqual(["a@x.example", "b@x.example"]);
    const a = out.find((m) => m.email === "a@x.example")!;
    expect(a.bySubmission.map((s) => s.submissionId).sort()).toEqual(["s1", "s2"]);
    expect(a.bySubmission.find((s) => s.submissionId === "s1")!.lines).toEqual(["2 flags", "3 remarks"]);
    expect(a.period).toBe("2026-12-01");
  });

  it("sends nothing to people who chose no digest", () => {
    expect(groupDigests([ev("c@x.example", "s1", "x")], new Map([["c@x.example", "none"]]), at)).toEqual([]);
  });

  // ISO 8601 week numbers, checked against published calendars: 2026-12-01 is a Tuesday of
  // week 49; 2021-01-01 (a Friday) belongs to 2020-W53; 2024-12-30 (a Monday) to 2025-W01.
  it("names weekly periods by ISO week", () => {
    expect(periodKey("weekly", at)).toBe("2026-W49");
    expect(periodKey("weekly", new Date("2021-01-01T12:00:00Z"))).toBe("2020-W53");
    expect(periodKey("weekly", new Date("2024-12-30T12:00:00Z"))).toBe("2025-W01");
    expect(periodKey("weekly", new Date("2026-12-06T23:00:00Z"))).toBe("2026-W49");
    expect(periodKey("weekly", new Date("2026-12-07T00:00:00Z"))).toBe("2026-W50");
  });
});
