import { renderToHTMLString } from "@tiptap/static-renderer/pm/html-string";
import katex from "katex";
import sanitizeHtml from "sanitize-html";
import { richTextExtensions } from "./extensions";
import { docReadable } from "./readable";

// Only what our schema can produce survives; anything else in a stored document is dropped.
const allowed: sanitizeHtml.IOptions = {
  allowedTags: ["p", "h2", "h3", "h4", "strong", "em", "s", "code", "pre", "ul", "ol", "li", "a", "br", "blockquote"],
  allowedAttributes: { a: ["href", "rel", "target"], code: ["class"], ol: ["start"] },
  allowedClasses: { code: ["tex"] },
  allowedSchemes: ["http", "https", "mailto"],
  transformTags: { a: sanitizeHtml.simpleTransform("a", { rel: "noopener noreferrer nofollow", target: "_blank" }) },
};

const MAX_TEX = 2000;
const unescape = (s: string) => s.replace(/&lt;/g, "<").replace(/&gt;/g, ">").replace(/&quot;/g, '"').replace(/&#39;/g, "'").replace(/&amp;/g, "&");

/**
 * Typesets one TeX fragment with KaTeX. `trust: false` keeps \href, \url and HTML-producing
 * commands off; maxExpand/maxSize bound what a macro or size can make KaTeX do. A fragment KaTeX
 * cannot read stays visible as its source, marked as an error.
 */
function typeset(tex: string, output: "htmlAndMathml" | "mathml") {
  if (tex.length > MAX_TEX) return `<code class="tex">${sanitizeHtml(tex, { allowedTags: [] })}</code>`;
  const html = katex.renderToString(tex, { output, throwOnError: false, trust: false, strict: "ignore", maxExpand: 200, maxSize: 20, displayMode: false });
  // The TeX annotation would show as raw source in mail readers that do not draw MathML.
  return output === "mathml" ? html.replace(/<annotation[^>]*>[\s\S]*?<\/annotation>/g, "") : html;
}

// Stored documents do not change, and building the renderer from the extensions costs a few
// milliseconds per document: the result is kept per document text (most recently used first).
const RENDERED_MAX_ENTRIES = 2000;
const RENDERED_MAX_KEY = 256 * 1024;
const rendered = new Map<string, string>();

function render(doc: unknown, output: "htmlAndMathml" | "mathml"): string {
  if (!doc || typeof doc !== "object") return "";
  const key = `${output}\u0000${JSON.stringify(doc)}`;
  const hit = rendered.get(key);
  if (hit !== undefined) {
    rendered.delete(key);
    rendered.set(key, hit);
    return hit;
  }
  const html = renderOnce(doc, output);
  if (key.length <= RENDERED_MAX_KEY) {
    rendered.set(key, html);
    if (rendered.size > RENDERED_MAX_ENTRIES) rendered.delete(rendered.keys().next().value!);
  }
  return html;
}

function renderOnce(doc: object, output: "htmlAndMathml" | "mathml"): string {
  let html: string;
  try {
    html = renderToHTMLString({ content: doc as never, extensions: richTextExtensions });
  } catch {
    // A document that does not fit the schema is shown as nothing rather than half-rendered.
    return "";
  }
  // KaTeX runs on the sanitised TeX text and escapes what it prints, so its markup is added after sanitising.
  return sanitizeHtml(html, allowed).replace(/<code class="tex">([\s\S]*?)<\/code>/g, (_m, tex: string) => typeset(unescape(tex), output));
}

/** Tiptap JSON → sanitised HTML through the same extensions the editor uses; TeX typeset by KaTeX. */
export function renderRichText(doc: unknown): string {
  return render(doc, "htmlAndMathml");
}

/**
 * A document for a mail: HTML with the formulas as MathML (no stylesheet needed) and the plain
 * text part with readable Unicode maths and list numbers.
 */
export function richMailPart(doc: unknown): { html: string; text: string } {
  return { html: render(doc, "mathml"), text: docReadable(doc) };
}
