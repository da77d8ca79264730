import { texToUnicode } from "./tex-unicode";

/** A stretch of text in one style; TeX is already turned into Unicode. */
export type Span = { text: string; bold?: boolean; italic?: boolean; mono?: boolean; math?: boolean };

/**
 * One line-starting block of a rich-text document, flattened for writers that cannot nest:
 * headings, paragraphs and list items (with their marker, "3." or "•", and depth).
 */
export type Block = { kind: "heading" | "paragraph" | "item" | "quote" | "code"; level?: number; marker?: string; depth: number; spans: Span[] };

type Node = { type?: string; text?: string; attrs?: Record<string, unknown>; content?: Node[]; marks?: { type: string; attrs?: Record<string, unknown> }[] };

const MAX_BLOCKS = 5000;

function spansOf(node: Node, out: Span[]) {
  for (const child of node.content ?? []) {
    if (child.type === "hardBreak") out.push({ text: "\n" });
    else if (typeof child.text === "string") {
      const marks = new Set((child.marks ?? []).map((m) => m.type));
      const href = child.marks?.find((m) => m.type === "link")?.attrs?.href;
      const text = marks.has("tex") ? texToUnicode(child.text) : child.text;
      out.push({ text, bold: marks.has("bold"), italic: marks.has("italic") || marks.has("tex"), mono: marks.has("code"), math: marks.has("tex") });
      if (typeof href === "string" && href !== child.text) out.push({ text: ` (${href})` });
    } else spansOf(child, out);
  }
  return out;
}

/** Flattens a Tiptap document into blocks; anything unknown contributes its text as a paragraph. */
export function docBlocks(doc: unknown): Block[] {
  const blocks: Block[] = [];
  const walk = (node: Node, depth: number, marker?: string) => {
    if (blocks.length >= MAX_BLOCKS || !node || typeof node !== "object") return;
    switch (node.type) {
      case "doc":
        node.content?.forEach((c) => walk(c, depth));
        return;
      case "heading":
        blocks.push({ kind: "heading", level: Number(node.attrs?.level ?? 2), depth, spans: spansOf(node, []) });
        return;
      case "paragraph":
        blocks.push({ kind: marker ? "item" : "paragraph", marker, depth, spans: spansOf(node, []) });
        return;
      case "codeBlock":
        blocks.push({ kind: "code", depth, spans: spansOf(node, []).map((s) => ({ ...s, mono: true })) });
        return;
      case "blockquote":
        for (const c of node.content ?? []) {
          const before = blocks.length;
          walk(c, depth + 1);
          for (const b of blocks.slice(before)) if (b.kind === "paragraph") b.kind = "quote";
        }
        return;
      case "bulletList":
      case "orderedList": {
        const start = Number(node.attrs?.start ?? 1);
        (node.content ?? []).forEach((item, i) => {
          const mark = node.type === "orderedList" ? `${(Number.isFinite(start) ? start : 1) + i}.` : "•";
          // The marker goes on the item's first block; later blocks of the item are indented under it.
          (item.content ?? []).forEach((c, j) => walk(c, depth + 1, j === 0 ? mark : ""));
        });
        return;
      }
      default:
        if (node.content) blocks.push({ kind: "paragraph", depth, spans: spansOf(node, []) });
    }
  };
  walk(doc as Node, 0);
  return blocks.filter((b) => b.spans.some((s) => s.text.trim()));
}

/** Plain text of a document for mail text parts: list numbers kept, maths as Unicode. */
export function docReadable(doc: unknown): string {
  const blocks = docBlocks(doc);
  return blocks
    .map((b, i) => {
      const gap = i === 0 ? "" : b.kind === "item" && blocks[i - 1]!.kind === "item" ? "\n" : "\n\n";
      const text = b.spans.map((s) => s.text).join("");
      const pad = "   ".repeat(Math.max(0, b.depth - 1));
      if (b.kind === "item") return `${gap}${pad}${b.marker ? `${b.marker} ` : "   "}${text}`;
      if (b.kind === "quote") return `${gap}> ${text}`;
      return gap + text;
    })
    .join("")
    .trim();
}
