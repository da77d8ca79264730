import { renderToHTMLString } from "@tiptap/static-renderer/pm/html-string";
import sanitizeHtml from "sanitize-html";
import { richTextExtensions } from "./extensions";

// Only what our schema can produce survives; anything else in a stored document is dropped.
const allowed: sanitizeHtml.IOptions = {
  allowedTags: ["p", "h2", "h3", "h4", "strong", "em", "s", "code", "pre", "ul", "ol", "li", "a", "br", "blockquote"],
  allowedAttributes: { a: ["href", "rel", "target"], code: ["class"], ol: ["start"] },
  allowedClasses: { code: ["tex"] },
  allowedSchemes: ["http", "https", "mailto"],
  transformTags: { a: sanitizeHtml.simpleTransform("a", { rel: "noopener noreferrer nofollow", target: "_blank" }) },
};

/** Tiptap JSON → sanitised HTML through the same extensions the editor uses. */
export function renderRichText(doc: unknown): string {
  if (!doc || typeof doc !== "object") return "";
  let html: string;
  try {
    html = renderToHTMLString({ content: doc as never, extensions: richTextExtensions });
  } catch {
    // A document that does not fit the schema is shown as nothing rather than half-rendered.
    return "";
  }
  return sanitizeHtml(html, allowed);
}
