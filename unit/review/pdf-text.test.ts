import { extractText, getDocumentProxy } from "unpdf";
import { describe, expect, it, vi } from "vitest";
import { demoRuns } from "~db/demo-data";
import { check } from "~/checker";
import { runSchema } from "~/checker/schema";
import { decisionLetterPdf } from "~/review/pdf/letter.server";
import { reviewerPacketPdf } from "~/review/pdf/packet.server";
import { PdfWriter } from "~/review/pdf/writer.server";
import { TEX_UNICODE_OUTPUT } from "~/review/tiptap/tex-unicode";

// Building and reading back several PDFs takes seconds on a busy two-core machine.
vi.setConfig({ testTimeout: 60_000 });

// Every PDF is read back with pdf.js (through unpdf), an independent reader: what it extracts is
// what a person's viewer shows and what copy-paste gives.
async function pages(bytes: Uint8Array) {
  const doc = await getDocumentProxy(new Uint8Array(bytes));
  const text = (await extractText(doc, { mergePages: true })).text;
  const items: { str: string; fontName: string }[] = [];
  for (let i = 1; i <= doc.numPages; i++) {
    const content = await (await doc.getPage(i)).getTextContent();
    for (const it of content.items) if ("str" in it && it.str.trim()) items.push({ str: it.str, fontName: it.fontName });
  }
  return { text, items };
}

const t = (text: string, ...marks: string[]) => ({ type: "text", text, marks: marks.map((type) => ({ type })) });
const p = (...content: unknown[]) => ({ type: "paragraph", content });
const li = (...content: unknown[]) => ({ type: "listItem", content: [p(...content)] });

const letter = {
  type: "doc",
  content: [
    { type: "heading", attrs: { level: 2 }, content: [t("Summary of the reports")] },
    p(t("The reviewers find the study "), t("careful", "bold"), t(" but "), t("incomplete", "italic"), t(". The Ekman number is "), t("E = \\nu/(\\Omega L^2)", "tex"), t(".")),
    {
      type: "orderedList",
      attrs: { start: 1 },
      content: [li(t("Extend strat-C to 1.5 magnetic diffusion times.")), li(t("State "), t("\\mathrm{Pm} = \\nu/\\eta", "tex"), t(" for strat-B.")), li(t("Compare "), t("N/\\Omega", "tex"), t(" between runs."))],
    },
  ],
};

describe("decision letter PDF", () => {
  it("prints Greek letters and maths as Unicode, never as '?' or TeX source", async () => {
    const bytes = await decisionLetterPdf({ venueName: "Annals", title: "A thin stable layer", roundNumber: 1, decision: "major-revision", decidedAt: new Date("2027-01-05T10:00:00Z"), letter, remarks: [{ reviewer: "Reviewer 1", anchor: "the round", body: { type: "doc", content: [p(t("Quote "), t("Ro = Re\\,E", "tex"))] } }] });
    const { text } = await pages(bytes);
    // ν U+03BD, η U+03B7, Ω U+03A9 (Unicode Greek and Coptic block).
    expect(text).toContain("\u03bd");
    expect(text).toContain("\u03b7");
    expect(text).toContain("\u03a9");
    expect(text).toContain("E = ν/(ΩL²)");
    expect(text).toContain("Pm = ν/η");
    expect(text).not.toContain("?");
    expect(text).not.toContain("\ufffd");
    expect(text).not.toMatch(/\\[A-Za-z]|\$/);
    expect(text).toContain("Decision on round 1: Major revision");
  });

  it("keeps a word wider than the page whole in the text layer, broken over lines", async () => {
    const long = `https://data.runproof.example/${"veyra-run-".repeat(30)}end`;
    const bytes = await decisionLetterPdf({ venueName: "Annals", title: "A thin stable layer", roundNumber: 1, decision: "accept", decidedAt: new Date("2027-01-05T10:00:00Z"), letter: { type: "doc", content: [p(t(`See ${long} for the data.`))] }, remarks: [] });
    const { text, items } = await pages(bytes);
    expect(text.replace(/\s+/g, "")).toContain(`See${long}forthedata.`);
    expect(items.filter((i) => i.str.includes("veyra-run-")).length).toBeGreaterThan(1);
  });

  it("keeps the heading, bold, italics and list numbering", async () => {
    const { text, items } = await pages(await decisionLetterPdf({ venueName: "Annals", title: "T", roundNumber: 2, decision: "accept", decidedAt: null, letter, remarks: [] }));
    expect(text).toMatch(/1\.\s*Extend strat-C/);
    expect(text).toMatch(/2\.\s*State Pm/);
    expect(text).toMatch(/3\.\s*Compare N\/Ω/);
    expect(text).toContain("Summary of the reports");
    const fontOf = (s: string) => items.find((i) => i.str.includes(s))?.fontName;
    const plain = fontOf("The reviewers find the study");
    expect(plain).toBeTruthy();
    expect(fontOf("careful"), "bold word in its own face").not.toBe(plain);
    expect(fontOf("incomplete"), "italic word in its own face").not.toBe(plain);
    expect(fontOf("incomplete")).not.toBe(fontOf("careful"));
    expect(fontOf("Summary of the reports"), "heading in bold").toBe(fontOf("careful"));
  });
});

describe("reviewer packet PDF", () => {
  const runs = demoRuns.map((r) => runSchema.parse(r));
  const derived = new Map(check({ runs }).runs.map((r) => [r.label, r.derived]));

  it("shows every parameter group and derived value of each run, numbers to four significant figures", async () => {
    const strat = runs.find((r) => r.label === "strat-B")!;
    const bytes = await reviewerPacketPdf({
      venueName: "Annals",
      title: "A thin stable layer",
      authors: null,
      roundNumber: 1,
      claims: [],
      runs: runs.map((r) => ({ label: r.label, version: 1, record: r, derived: derived.get(r.label) })),
      flags: [
        { rule: "A.pm-from-diffusivities", severity: "mismatch", runLabel: "strat-B", message: "Pm = 2 is stated, but ν/η gives 1.25000000001 and Ω is 7.426782210753407", detail: { expected: 1.2500000001, found: 7.426782210753407, tolerance: 0.05 }, authorAnswer: null },
      ],
    });
    const { text } = await pages(bytes);
    for (const group of ["Software:", "Geometry:", "Conventions:", "Controls:", "Material (with units):", "Boundaries:", "Stable layer:", "Resolution:", "Time (in the run's time unit):"]) expect(text, group).toContain(group);
    expect(text).toContain(`nu = ${strat.material!.nu}`);
    // Every derived number the checker produced for strat-B appears, rounded to 4 significant figures.
    expect(text).toContain("E, Ekman number = 10⁻⁴");
    // Shell geometry from the definitions (radius ratio χ = r_i/r_o, gap d = r_o − r_i): the tangent
    // cylinder meets the outer sphere at latitude arccos χ; the layer is r_o/d − edge gap units thick.
    const chi = strat.geometry.radiusRatio;
    expect(text).toContain(`tangent-cylinder latitude (°) = ${Number(((Math.acos(chi) * 180) / Math.PI).toPrecision(4))}`);
    const thicknessKm = (1 / (1 - chi) - strat.stableLayer!.edgeRadius) * 1830 * (1 - chi);
    expect(text).toContain(`layer thickness (km) = ${Number(thicknessKm.toPrecision(4))}`);
    expect(text).toContain("N/Ω, stratification over rotation = 2");
    const magnetic = derived.get("strat-B")!.runLength!.magnetic!;
    expect(text).toContain(`run length, magnetic diffusion times = ${Number(magnetic.toPrecision(4))}`);
    expect(text).toContain("found 7.427");
    expect(text).toContain("ν/η gives 1.25 and Ω is 7.427");
    expect(text).not.toMatch(/\d\.\d{5,}/);
    expect(text).not.toContain("?");
    expect(text).toContain("Mismatch: A.pm-from-diffusivities on strat-B");
  });
});

describe("the PDF font", () => {
  it("holds a glyph for every character the TeX mapping can produce", async () => {
    const w = await PdfWriter.create("coverage");
    expect(w.safe(TEX_UNICODE_OUTPUT)).toBe(TEX_UNICODE_OUTPUT);
    expect(w.safe("漢")).toBe("\ufffd");
  });
});
