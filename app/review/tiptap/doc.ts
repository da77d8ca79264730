/**
 * Tiptap documents as data: the empty document and plain text of one. No editor code, so pages
 * and the server use it without loading the editor.
 */
export type RichDoc = { type: "doc"; content?: unknown[] };

export const emptyDoc: RichDoc = { type: "doc", content: [{ type: "paragraph" }] };

/** Plain text of a Tiptap document, for mail text parts, PDFs and search. */
export function docText(doc: unknown): string {
  const out: string[] = [];
  const walk = (node: unknown) => {
    if (!node || typeof node !== "object") return;
    const n = node as { type?: string; text?: string; content?: unknown[]; marks?: { type: string }[] };
    if (typeof n.text === "string") out.push(n.marks?.some((m) => m.type === "tex") ? `$${n.text}$` : n.text);
    if (n.type === "hardBreak") out.push("\n");
    n.content?.forEach(walk);
    if (n.type && ["paragraph", "heading", "listItem", "codeBlock", "blockquote"].includes(n.type)) out.push("\n");
  };
  walk(doc);
  return out.join("").replace(/\n{3,}/g, "\n\n").trim();
}

/** A document is empty when it holds no text at all. */
export function isEmptyDoc(doc: unknown) {
  return docText(doc).length === 0;
}
