import fontkit from "@pdf-lib/fontkit";
import { readFile } from "node:fs/promises";
import { createRequire } from "node:module";
import { dirname, join } from "node:path";
import { PDFDocument, rgb, type PDFFont, type PDFPage } from "pdf-lib";
import type { Block, Span } from "../tiptap/readable";
import { woffToSfnt } from "./woff-sfnt.server";

const require = createRequire(import.meta.url);
// DejaVu Sans: Fontsource ships it whole (Latin, Greek, maths operators, sub- and superscripts) in
// one file per style, so one font prints ν, η, Ω, ≤, ≈ and ² without a fallback chain.
const fontDir = join(dirname(require.resolve("@fontsource/dejavu-sans/package.json")), "files");
const FONT_FILES = {
  regular: "dejavu-sans-latin-400-normal.woff",
  bold: "dejavu-sans-latin-700-normal.woff",
  italic: "dejavu-sans-latin-400-italic.woff",
  boldItalic: "dejavu-sans-latin-700-italic.woff",
} as const;
type Face = keyof typeof FONT_FILES;
let fontBytes: Promise<Record<Face, Buffer>> | undefined;

// Parsing a font is the slow part of embedding it; each document makes its own subset of the one parsed font.
const parsed = new Map<Uint8Array, ReturnType<typeof fontkit.create>>();
const cachedFontkit: typeof fontkit = {
  ...fontkit,
  create(data: Uint8Array, postscriptName?: string) {
    if (postscriptName) return fontkit.create(data, postscriptName);
    let font = parsed.get(data);
    if (!font) parsed.set(data, (font = fontkit.create(data)));
    return font;
  },
};

const A4: [number, number] = [595.28, 841.89];
const MARGIN = 56;
const INK: [number, number, number] = [0.11, 0.14, 0.19];
/** A document longer than this many pages is cut with a note, so no input sets an unbounded loop. */
const MAX_PAGES = 400;

type TextOpts = { size?: number; bold?: boolean; italic?: boolean; indent?: number; gapAfter?: number; colour?: [number, number, number] };
type Piece = { text: string; font: PDFFont; space: boolean; breakBefore?: boolean };

/** A small flowing-text writer over pdf-lib: headings, wrapped styled paragraphs, lists, new pages as needed. */
export class PdfWriter {
  private page!: PDFPage;
  private y = 0;
  private cut = false;
  private constructor(
    readonly doc: PDFDocument,
    private fonts: Record<Face, PDFFont>,
    private glyphs: Set<number>,
  ) {
    this.addPage();
  }

  static async create(title: string) {
    fontBytes ??= Promise.all(Object.entries(FONT_FILES).map(async ([k, f]) => [k, woffToSfnt(await readFile(join(fontDir, f)))] as const)).then((e) => Object.fromEntries(e) as Record<Face, Buffer>);
    const bytes = await fontBytes;
    const doc = await PDFDocument.create();
    doc.registerFontkit(cachedFontkit);
    doc.setTitle(title);
    doc.setProducer("Runproof");
    // Subsetting keeps each PDF small; the WOFF is unwrapped to its sfnt once (see woff-sfnt.server.ts).
    const fonts = {} as Record<Face, PDFFont>;
    for (const face of Object.keys(FONT_FILES) as Face[]) fonts[face] = await doc.embedFont(bytes[face], { subset: true });
    return new PdfWriter(doc, fonts, new Set(fonts.regular.getCharacterSet()));
  }

  /** A character the font lacks is drawn as U+FFFD (visible, never a silent "?"). */
  safe(text: string) {
    let out = "";
    for (const ch of text.replace(/\t/g, "    ")) {
      const cp = ch.codePointAt(0)!;
      out += ch === "\n" || this.glyphs.has(cp) ? ch : cp < 0x20 ? "" : "\ufffd";
    }
    return out;
  }

  private addPage() {
    if (this.doc.getPageCount() >= MAX_PAGES) {
      this.cut = true;
      return;
    }
    this.page = this.doc.addPage(A4);
    this.y = A4[1] - MARGIN;
  }

  private face(bold?: boolean, italic?: boolean): PDFFont {
    return this.fonts[bold ? (italic ? "boldItalic" : "bold") : italic ? "italic" : "regular"];
  }

  /** Splits styled spans into words; a word glued to the previous one (no space between) never wraps apart. */
  private pieces(spans: Span[], base: { bold?: boolean; italic?: boolean }) {
    const lines: Piece[][] = [[]];
    for (const s of spans) {
      const font = this.face(base.bold || s.bold, base.italic || s.italic);
      this.safe(s.text)
        .split("\n")
        .forEach((part, i) => {
          if (i > 0) lines.push([]);
          const words = part.split(/(\s+)/);
          let space = false;
          for (const w of words) {
            if (!w) continue;
            if (/^\s+$/.test(w)) space = true;
            else {
              lines[lines.length - 1]!.push({ text: w, font, space });
              space = false;
            }
          }
          if (space) lines[lines.length - 1]!.push({ text: "", font, space: true });
        });
    }
    return lines;
  }

  /**
   * A word wider than the column (a long address, a run of symbols) is cut into pieces that fit,
   * each starting a new line; drawn whole it would run off the page and out of the text layer.
   */
  private fitted(para: Piece[], size: number, width: number): Piece[] {
    const out: Piece[] = [];
    for (const p of para) {
      if (p.font.widthOfTextAtSize(p.text, size) <= width) {
        out.push(p);
        continue;
      }
      let chunk = "";
      let first = true;
      for (const ch of p.text) {
        if (chunk && p.font.widthOfTextAtSize(chunk + ch, size) > width) {
          out.push({ ...p, text: chunk, space: first ? p.space : false, breakBefore: true });
          first = false;
          chunk = "";
        }
        chunk += ch;
      }
      if (chunk) out.push({ ...p, text: chunk, space: first ? p.space : false, breakBefore: true });
    }
    return out;
  }

  /** Draws styled spans wrapped to the column. */
  spans(spans: Span[], opts: TextOpts & { marker?: string } = {}) {
    if (this.cut) return;
    const size = opts.size ?? 10;
    const indent = opts.indent ?? 0;
    const width = A4[0] - 2 * MARGIN - indent;
    const colour = rgb(...(opts.colour ?? INK));
    let markerPending = opts.marker;
    for (const para of this.pieces(spans, opts)) {
      // Lay the words out in lines.
      const lines: Piece[][] = [];
      let line: Piece[] = [];
      let used = 0;
      for (const p of this.fitted(para, size, width)) {
        const gap = p.space && line.length ? p.font.widthOfTextAtSize(" ", size) : 0;
        const w = p.font.widthOfTextAtSize(p.text, size);
        if (line.length && (p.space || p.breakBefore) && used + gap + w > width) {
          lines.push(line);
          line = [{ ...p, space: false }];
          used = w;
        } else {
          line.push(line.length ? p : { ...p, space: false });
          used += gap + w;
        }
      }
      lines.push(line);
      for (const l of lines) {
        if (this.y - size < MARGIN) this.addPage();
        if (this.cut) return;
        this.y -= size * 1.4;
        if (markerPending) {
          const mw = this.fonts.regular.widthOfTextAtSize(markerPending, size);
          this.page.drawText(markerPending, { x: MARGIN + indent - mw - 4, y: this.y, size, font: this.fonts.regular, color: colour });
          markerPending = undefined;
        }
        // Consecutive words in one font are drawn as one string, so extracted text keeps its spaces.
        let x = MARGIN + indent;
        let run = "";
        let runFont: PDFFont | null = null;
        const flush = () => {
          if (!run || !runFont) return;
          this.page.drawText(run, { x, y: this.y, size, font: runFont, color: colour });
          x += runFont.widthOfTextAtSize(run, size);
          run = "";
        };
        for (const p of l) {
          const text = (p.space ? " " : "") + p.text;
          if (p.font !== runFont) {
            flush();
            runFont = p.font;
          }
          run += text;
        }
        flush();
      }
    }
    this.y -= opts.gapAfter ?? 4;
  }

  text(text: string, opts: TextOpts = {}) {
    this.spans([{ text }], opts);
  }

  /** Vertical space between sections, in points. */
  gap(points: number) {
    this.y -= Math.min(Math.max(points, 0), 72);
  }

  heading(text: string, size = 14) {
    this.y -= 6;
    this.text(text, { size, bold: true, gapAfter: 6 });
  }

  /** A rich-text document (see docBlocks): headings, paragraphs, numbered and bulleted lists. */
  blocks(blocks: Block[], opts: { indent?: number; size?: number } = {}) {
    const base = opts.indent ?? 0;
    const size = opts.size ?? 10;
    for (const b of blocks) {
      const indent = base + b.depth * 18;
      if (b.kind === "heading") {
        this.y -= 4;
        this.spans(b.spans, { size: b.level === 2 ? 13 : b.level === 3 ? 12 : 11, bold: true, indent, gapAfter: 4 });
      } else if (b.kind === "item") this.spans(b.spans, { size, indent, marker: b.marker, gapAfter: 2 });
      else if (b.kind === "quote") this.spans(b.spans, { size, indent: indent + 6, italic: true, colour: [0.29, 0.32, 0.38] });
      else this.spans(b.spans, { size, indent, gapAfter: 6 });
    }
  }

  async bytes() {
    if (this.cut) {
      const last = this.doc.getPage(this.doc.getPageCount() - 1);
      last.drawText(`Cut at ${MAX_PAGES} pages.`, { x: MARGIN, y: MARGIN / 2, size: 8, font: this.fonts.italic, color: rgb(...INK) });
    }
    return this.doc.save();
  }
}
