import { describe, expect, it } from "vitest";
import { docText } from "~/review/tiptap/doc";
import { compose } from "~/mail/compose";
import { renderRichText, richMailPart } from "~/review/tiptap/render.server";

const para = (...content: unknown[]) => ({ type: "doc", content: [{ type: "paragraph", content }] });

describe("rich text rendered on the server", () => {
  it("renders the schema's marks and nodes, TeX typeset", () => {
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
    // TeX is typeset by KaTeX (HTML plus MathML), not left as source in a code element.
    expect(html).not.toContain('<code class="tex">');
    expect(html).toContain('class="katex"');
    expect(html).toMatch(/<mi>ν<\/mi>|<mi>\u03bd<\/mi>/);
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

describe("formulas in rich text", () => {
  it("typesets TeX with KaTeX and keeps TeX commands from making links", () => {
    const html = renderRichText(para({ type: "text", text: "\\href{javascript:alert(1)}{x} + \\url{https://evil.example}", marks: [{ type: "tex" }] }));
    expect(html).not.toMatch(/href=|<script|javascript:[^<]*"/i);
  });

  it("gives mail MathML without the TeX annotation, and a text part in Unicode with list numbers", () => {
    const doc = {
      type: "doc",
      content: [
        { type: "paragraph", content: [{ type: "text", text: "Check " }, { type: "text", text: "Ro = Re\\,E", marks: [{ type: "tex" }] }] },
        {
          type: "orderedList",
          attrs: { start: 1 },
          content: ["run length", "resolution", "N/\\Omega"].map((t, i) => ({ type: "listItem", content: [{ type: "paragraph", content: [{ type: "text", text: t, marks: i === 2 ? [{ type: "tex" }] : [] }] }] })),
        },
      ],
    };
    const part = richMailPart(doc);
    expect(part.html).toContain("<ol>");
    expect(part.html.match(/<li>/g)).toHaveLength(3);
    expect(part.html).toContain("<math");
    expect(part.html).not.toContain("<annotation");
    expect(part.html).not.toContain("\\Omega");
    expect(part.text).toContain("Check Ro = Re\u2009E");
    expect(part.text).toContain("1. run length\n2. resolution\n3. N/Ω");
  });

  it("keeps paragraphs and lists apart in the composed HTML mail", () => {
    const mail = compose({ subject: "s", greeting: "Hello,", paragraphs: ["First.\n\nSecond.", richMailPart({ type: "doc", content: [{ type: "bulletList", content: [{ type: "listItem", content: [{ type: "paragraph", content: [{ type: "text", text: "a" }] }] }] }] })] });
    expect(mail.html).toContain("<p>First.</p>");
    expect(mail.html).toContain("<p>Second.</p>");
    expect(mail.html).toContain("<ul><li><p>a</p></li></ul>");
    expect(mail.text).toContain("• a");
  });
});

describe("rendered documents are kept per document text", () => {
  it("gives the same HTML for the same document and follows any change of the text", () => {
    const doc = (text: string) => ({ type: "doc", content: [{ type: "paragraph", content: [{ type: "text", text }] }] });
    const first = renderRichText(doc("Stated Pm = 2"));
    expect(renderRichText(doc("Stated Pm = 2"))).toBe(first);
    expect(first).toContain("Stated Pm = 2");
    const changed = renderRichText(doc("Stated Pm = 3"));
    expect(changed).toContain("Stated Pm = 3");
    expect(changed).not.toContain("Pm = 2");
    // The mail form of the same document is its own entry (MathML only, no KaTeX HTML).
    const tex = { type: "doc", content: [{ type: "paragraph", content: [{ type: "text", text: "Ro = Re\\,E", marks: [{ type: "tex" }] }] }] };
    expect(renderRichText(tex)).toContain("katex-html");
    expect(richMailPart(tex).html).not.toContain("katex-html");
  });
});
