import { describe, expect, it } from "vitest";
import { docText } from "~/review/tiptap/extensions";
import { renderRichText } from "~/review/tiptap/render.server";

const para = (...content: unknown[]) => ({ type: "doc", content: [{ type: "paragraph", content }] });

describe("rich text rendered on the server", () => {
  it("renders the schema's marks and nodes, TeX as code.tex", () => {
    const html = renderRichText({
      type: "doc",
      content: [
        { type: "heading", attrs: { level: 3 }, content: [{ type: "text", text: "Run length" }] },
        { type: "bulletList", content: [{ type: "listItem", content: [{ type: "paragraph", content: [{ type: "text", text: "one", marks: [{ type: "bold" }] }] }] }] },
        { type: "paragraph", content: [{ type: "text", text: "\\mathrm{Pm} = \\nu/\\eta", marks: [{ type: "tex" }] }, { type: "text", text: " see", marks: [{ type: "link", attrs: { href: "https://example.org/a" } }] }] },
      ],
    });
    expect(html).toContain("<h3>Run length</h3>");
    expect(html).toContain("<ul><li><p><strong>one</strong></p></li></ul>");
    expect(html).toContain('<code class="tex">\\mathrm{Pm} = \\nu/\\eta</code>');
    const link = html.match(/<a [^>]*>/)?.[0] ?? "";
    expect(link).toContain('href="https://example.org/a"');
    expect(link).toContain('rel="noopener noreferrer nofollow"');
  });

  it("lets no script, handler or javascript: link through", () => {
    const html = renderRichText(
      para(
        { type: "text", text: "<script>alert(1)</script><img src=x onerror=alert(1)>" },
        { type: "text", text: "click", marks: [{ type: "link", attrs: { href: "javascript:alert(1)" } }] },
        { type: "text", text: "x", marks: [{ type: "code", attrs: { class: "evil", onclick: "alert(1)" } }] },
      ),
    );
    // Typed markup stays text (escaped); no tag carries a handler, a script URL or a foreign class.
    const tags = html.match(/<[^>]+>/g) ?? [];
    expect(tags.length).toBeGreaterThan(0);
    for (const tag of tags) expect(tag).not.toMatch(/^<(script|img)|\son\w+=|javascript:|evil/i);
    expect(html).toContain("&lt;script&gt;");
    expect(html).toContain("<a ");
    expect(html).not.toContain("href=");
  });

  it("shows a document that does not fit the schema as nothing", () => {
    expect(renderRichText({ type: "doc", content: [{ type: "iframe", attrs: { src: "https://evil.example" } }] })).not.toContain("iframe");
    expect(renderRichText("not a doc")).toBe("");
    expect(renderRichText(null)).toBe("");
  });

  it("gives plain text for mail and PDFs, TeX between dollars", () => {
    expect(docText(para({ type: "text", text: "Pm is " }, { type: "text", text: "\\nu/\\eta", marks: [{ type: "tex" }] }))).toBe("Pm is $\\nu/\\eta$");
  });
});
