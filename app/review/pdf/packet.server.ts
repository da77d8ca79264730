import type { Derived } from "~/checker/types";
import { roundNumbersIn, showValue } from "~/lib/sig-figs";
import { severityLabel } from "../labels";
import { derivedLines, recordLines } from "./run-record";
import { PdfWriter } from "./writer.server";

export type PacketInput = {
  venueName: string;
  title: string;
  authors: string | null;
  roundNumber: number;
  claims: { figure: string | null; statement: string; record: unknown }[];
  runs: { label: string; version: number; record: unknown; derived?: Derived }[];
  flags: { rule: string; severity: string; runLabel: string | null; message: string; detail: Record<string, unknown>; authorAnswer: string | null }[];
};

const ADVISORY = "Flags are advisory: computed from what the authors entered, under the conventions they declared; the reviewer's judgement decides.";
const GREY: [number, number, number] = [0.29, 0.32, 0.38];

/** The reviewer packet: claims, every run's full record with its recomputed values, and every flag with its explanation. */
export async function reviewerPacketPdf(input: PacketInput) {
  const w = await PdfWriter.create(`Reviewer packet: ${input.title}`);
  w.text(input.venueName, { size: 9, colour: GREY });
  w.heading(`Reviewer packet, round ${input.roundNumber}`, 16);
  w.text(input.title, { bold: true });
  if (input.authors) w.text(input.authors, { size: 9 });
  w.heading("Claims");
  if (!input.claims.length) w.text("No claims.");
  for (const c of input.claims) {
    w.text(`${c.figure ? `${c.figure}: ` : ""}${(c.record as { title?: string })?.title ?? ""}`, { bold: true });
    if (c.statement) w.text(c.statement, { indent: 12 });
    const stated = (c.record as { stated?: { quantity: string; value: unknown; run?: string }[] })?.stated ?? [];
    for (const s of stated) w.text(`States ${s.quantity} = ${showValue(s.value)}${s.run ? ` for ${s.run}` : ""}`, { indent: 12, size: 9 });
  }
  w.heading("Runs");
  if (!input.runs.length) w.text("No runs.");
  for (const r of input.runs) {
    w.text(`${r.label} (version ${r.version})`, { bold: true, size: 11 });
    for (const { group, line } of recordLines(r.record)) w.spans([{ text: `${group}: `, bold: true }, { text: line }], { indent: 12, size: 9 });
    const derived = derivedLines(r.derived);
    if (derived.length) {
      w.text("Recomputed by the checker:", { indent: 12, size: 9, bold: true });
      for (const line of derived) w.text(line, { indent: 24, size: 9 });
    }
    w.gap(8);
  }
  w.heading("Flags");
  w.text(ADVISORY, { size: 9, gapAfter: 8 });
  if (!input.flags.length) w.text("The checker raised no flags.");
  for (const f of input.flags) {
    w.text(`${severityLabel(f.severity)}: ${f.rule}${f.runLabel ? ` on ${f.runLabel}` : ""}`, { bold: true });
    w.text(roundNumbersIn(f.message), { indent: 12 });
    const d = f.detail;
    const bits = [
      d.expected !== undefined ? `expected ${showValue(d.expected)}` : "",
      d.found !== undefined ? `found ${showValue(d.found)}` : "",
      d.tolerance !== undefined ? `tolerance ${showValue(d.tolerance)}` : "",
      d.source ? `source: ${String(d.source)}` : "",
    ].filter(Boolean);
    if (bits.length) w.text(roundNumbersIn(bits.join("; ")), { indent: 12, size: 9 });
    if (f.authorAnswer) w.text(`Authors' answer: ${f.authorAnswer}`, { indent: 12, size: 9, gapAfter: 6 });
  }
  return w.bytes();
}
