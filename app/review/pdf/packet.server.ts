import { PdfWriter } from "./writer.server";

export type PacketInput = {
  venueName: string;
  title: string;
  authors: string | null;
  roundNumber: number;
  claims: { figure: string | null; statement: string; record: unknown }[];
  runs: { label: string; version: number; record: unknown }[];
  flags: { rule: string; severity: string; runLabel: string | null; message: string; detail: Record<string, unknown>; authorAnswer: string | null }[];
};

const ADVISORY = "Flags are advisory: computed from what the authors entered, under the conventions they declared; the reviewer's judgement decides.";

function controlsLine(record: unknown) {
  const c = ((record as { controls?: Record<string, unknown> })?.controls ?? {}) as Record<string, unknown>;
  return Object.entries(c).map(([k, v]) => `${k} = ${String(v)}`).join(", ");
}

/** The reviewer packet: claims, the runs table and every flag with its explanation. */
export async function reviewerPacketPdf(input: PacketInput) {
  const w = await PdfWriter.create(`Reviewer packet: ${input.title}`);
  w.text(input.venueName, { size: 9, colour: [0.29, 0.32, 0.38] });
  w.heading(`Reviewer packet, round ${input.roundNumber}`, 16);
  w.text(input.title, { bold: true });
  if (input.authors) w.text(input.authors, { size: 9 });
  w.heading("Claims");
  if (!input.claims.length) w.text("No claims.");
  for (const c of input.claims) {
    w.text(`${c.figure ? `${c.figure}: ` : ""}${(c.record as { title?: string })?.title ?? ""}`, { bold: true });
    if (c.statement) w.text(c.statement, { indent: 12 });
  }
  w.heading("Runs");
  for (const r of input.runs) w.text(`${r.label} (version ${r.version}): ${controlsLine(r.record)}`);
  w.heading("Flags");
  w.text(ADVISORY, { size: 9, gapAfter: 8 });
  if (!input.flags.length) w.text("The checker raised no flags.");
  for (const f of input.flags) {
    w.text(`[${f.severity}] ${f.rule}${f.runLabel ? ` on ${f.runLabel}` : ""}`, { bold: true });
    w.text(f.message, { indent: 12 });
    const d = f.detail;
    const bits = [d.expected !== undefined ? `expected ${String(d.expected)}` : "", d.found !== undefined ? `found ${String(d.found)}` : "", d.tolerance !== undefined ? `tolerance ${String(d.tolerance)}` : "", d.source ? `source: ${String(d.source)}` : ""].filter(Boolean);
    if (bits.length) w.text(bits.join("; "), { indent: 12, size: 9 });
    if (f.authorAnswer) w.text(`Authors' answer: ${f.authorAnswer}`, { indent: 12, size: 9, gapAfter: 6 });
  }
  return w.bytes();
}
