import { decisionLabel } from "../labels";
import { docBlocks } from "../tiptap/readable";
import { PdfWriter } from "./writer.server";

export type LetterPdfInput = {
  venueName: string;
  title: string;
  roundNumber: number;
  decision: string;
  decidedAt: Date | null;
  letter: unknown;
  remarks: { reviewer: string; anchor: string; body: unknown }[];
};

/**
 * The decision letter with the released remarks; reviewers appear only as "Reviewer N". The
 * letter keeps its headings, bold, italics and lists; formulas print as Unicode maths.
 */
export async function decisionLetterPdf(input: LetterPdfInput) {
  const w = await PdfWriter.create(`Decision on ${input.title}`);
  w.text(input.venueName, { size: 9, colour: [0.29, 0.32, 0.38] });
  w.heading(`Decision on round ${input.roundNumber}: ${decisionLabel(input.decision)}`, 16);
  w.text(input.title, { bold: true, gapAfter: 10 });
  if (input.decidedAt) w.text(`Decided on ${input.decidedAt.toISOString().slice(0, 10)}`, { size: 9, gapAfter: 10 });
  const letter = docBlocks(input.letter);
  if (letter.length) w.blocks(letter);
  else w.text("(no letter)", { gapAfter: 12 });
  if (input.remarks.length) {
    w.heading("Reviewers' remarks");
    for (const r of input.remarks) {
      w.text(`${r.reviewer}, on ${r.anchor}`, { bold: true, size: 10 });
      w.blocks(docBlocks(r.body), { indent: 12 });
      w.gap(6);
    }
  }
  return w.bytes();
}
