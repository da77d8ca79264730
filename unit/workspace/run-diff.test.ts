/** The run page's version diff: changed fields only, old → new, grouped by the record's parameter groups. */
import { describe, expect, it } from "vitest";
import { diffRunRecords } from "~/workspace/run-diff";
import { baseRun } from "../checker/helpers";

describe("version diff of a run record", () => {
  it("lists each changed, added and removed field under its group, and nothing else", () => {
    const a = baseRun({ material: { nu: "1e-6 m^2/s" }, boundaries: { inner: { velocity: "no-slip" } } });
    const b = baseRun({ controls: { Pm: 2 }, time: { end: 25 }, resolution: { radialPoints: 97 }, boundaries: { inner: { velocity: "stress-free" } } });
    const groups = diffRunRecords(a, b);
    expect(groups.map((g) => g.group)).toEqual(["Controls", "Material (with units)", "Boundaries", "Resolution", "Time (in the run's time unit)"]);
    expect(groups.find((g) => g.group === "Controls")!.changes).toEqual([{ path: "Pm", from: "5", to: "2" }]);
    expect(groups.find((g) => g.group === "Material (with units)")!.changes).toEqual([{ path: "nu", from: "1e-6 m^2/s", to: "absent" }]);
    expect(groups.find((g) => g.group === "Boundaries")!.changes).toEqual([{ path: "inner.velocity", from: "no-slip", to: "stress-free" }]);
    expect(groups.find((g) => g.group === "Resolution")!.changes).toEqual([{ path: "radialPoints", from: "absent", to: "97" }]);
  });

  it("finds no change between a record and itself, and keeps the digits of a change that four figures would hide", () => {
    expect(diffRunRecords(baseRun(), baseRun())).toEqual([]);
    const [g] = diffRunRecords(baseRun({ controls: { E: 1e-3 } }), baseRun({ controls: { E: 1.00001e-3 } }));
    expect(g!.changes[0]).toEqual({ path: "E", from: "0.001", to: "0.00100001" });
  });
});
