import { Mark, markInputRule, markPasteRule, mergeAttributes, type Extensions } from "@tiptap/core";
import StarterKit from "@tiptap/starter-kit";

/**
 * Inline maths stored as TeX source. It renders as `<code class="tex">…</code>` on the page and
 * in mail; we keep the TeX text rather than typeset it, so nothing is lost and nothing executes.
 */
export const Tex = Mark.create({
  name: "tex",
  excludes: "_",
  code: true,
  parseHTML: () => [{ tag: "code.tex" }],
  renderHTML: ({ HTMLAttributes }) => ["code", mergeAttributes(HTMLAttributes, { class: "tex" }), 0],
  // Typing or pasting $…$ turns the text between the dollars into TeX.
  addInputRules() {
    return [markInputRule({ find: /(?:^|\s)(\$([^$\s][^$]*)\$)$/, type: this.type })];
  },
  addPasteRules() {
    return [markPasteRule({ find: /(?:^|\s)(\$([^$\s][^$]*)\$)/g, type: this.type })];
  },
});

/**
 * The one schema of remarks and letters: the editor component and the server renderer both use
 * it, so what a reviewer typed is exactly what the server can render (and nothing more).
 */
export const richTextExtensions: Extensions = [
  StarterKit.configure({
    heading: { levels: [2, 3, 4] },
    link: { openOnClick: false, autolink: true, protocols: ["http", "https", "mailto"] },
    underline: false,
    horizontalRule: false,
  }),
  Tex,
];
