import fontkit from "@pdf-lib/fontkit";
import { readFile } from "node:fs/promises";
import { createRequire } from "node:module";
import { dirname, join } from "node:path";
import { PDFDocument, rgb, type PDFFont, type PDFPage } from "pdf-lib";

const require = createRequire(import.meta.url);
const fontDir = join(dirname(require.resolve("@fontsource/merriweather/package.json")), "files");
let fontBytes: Promise<[Buffer, Buffer]> | undefined;

// The latin subset of Merriweather lacks a few maths signs authors type; spell them out.
const SUBSTITUTES: Record<string, string> = { "≥": ">=", "≤": "<=", "×": "x", "≈": "~", "−": "-", "–": "-", "—": "-", "→": "->", "·": ".", "…": "...", "’": "'", "‘": "'", "“": '"', "”": '"' };
export function pdfSafe(text: string) {
  return text.replace(/[^\n\x20-\x7e\u00a0-\u00ff]/g, (c) => SUBSTITUTES[c] ?? "?");
}

const A4: [number, number] = [595.28, 841.89];
const MARGIN = 56;

/** A small flowing-text writer over pdf-lib: headings, wrapped paragraphs, new pages as needed. */
export class PdfWriter {
  private page!: PDFPage;
  private y = 0;
  private constructor(
    readonly doc: PDFDocument,
    private regular: PDFFont,
    private bold: PDFFont,
  ) {
    this.addPage();
  }

  static async create(title: string) {
    fontBytes ??= Promise.all([
      readFile(join(fontDir, "merriweather-latin-400-normal.woff")),
      readFile(join(fontDir, "merriweather-latin-700-normal.woff")),
    ]);
    const [regularBytes, boldBytes] = await fontBytes;
    const doc = await PDFDocument.create();
    doc.registerFontkit(fontkit);
    doc.setTitle(pdfSafe(title));
    doc.setProducer("Runproof");
    // WOFF with subsetting: the combination known to embed correctly (see stack notes).
    const regular = await doc.embedFont(regularBytes, { subset: true });
    const bold = await doc.embedFont(boldBytes, { subset: true });
    return new PdfWriter(doc, regular, bold);
  }

  private addPage() {
    this.page = this.doc.addPage(A4);
    this.y = A4[1] - MARGIN;
  }

  private lines(text: string, font: PDFFont, size: number, width: number) {
    const out: string[] = [];
    for (const para of pdfSafe(text).split("\n")) {
      let line = "";
      for (const word of para.split(/\s+/).filter(Boolean)) {
        const next = line ? `${line} ${word}` : word;
        if (font.widthOfTextAtSize(next, size) > width && line) {
          out.push(line);
          line = word;
        } else line = next;
      }
      out.push(line);
    }
    return out;
  }

  text(text: string, opts: { size?: number; bold?: boolean; indent?: number; gapAfter?: number; colour?: [number, number, number] } = {}) {
    const size = opts.size ?? 10;
    const font = opts.bold ? this.bold : this.regular;
    const indent = opts.indent ?? 0;
    for (const line of this.lines(text, font, size, A4[0] - 2 * MARGIN - indent)) {
      if (this.y - size < MARGIN) this.addPage();
      this.y -= size * 1.4;
      this.page.drawText(line, { x: MARGIN + indent, y: this.y, size, font, color: rgb(...(opts.colour ?? [0.11, 0.14, 0.19])) });
    }
    this.y -= opts.gapAfter ?? 4;
  }

  heading(text: string, size = 14) {
    this.y -= 6;
    this.text(text, { size, bold: true, gapAfter: 6 });
  }

  async bytes() {
    return this.doc.save();
  }
}
