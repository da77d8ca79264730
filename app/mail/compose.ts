/** A message ready for the outbox: both parts are always present. */
export type Composed = { subject: string; text: string; html: string };

const escapeHtml = (s: string) =>
  s.replace(/[&<>"']/g, (c) => ({ "&": "&amp;", "<": "&lt;", ">": "&gt;", '"': "&quot;", "'": "&#39;" })[c]!);

/** A paragraph: plain text, or a pre-rendered rich block (sanitised HTML with its text twin). */
export type MailBlock = string | { html: string; text: string };

const paragraphHtml = (p: MailBlock) =>
  typeof p === "string"
    ? p
        .split(/\n{2,}/)
        .map((para) => `<p>${escapeHtml(para).replace(/\n/g, "<br>")}</p>`)
        .join("\n")
    : `<div>${p.html}</div>`;

/**
 * Builds a plain message: a greeting, paragraphs, one optional button link.
 * Text and HTML come from the same pieces so they never say different things.
 */
export function compose(opts: {
  subject: string;
  greeting: string;
  paragraphs: MailBlock[];
  action?: { label: string; url: string };
  footer?: string;
}): Composed {
  const footer = opts.footer ?? "Runproof — the review workspace for simulation papers.";
  const text = [
    opts.greeting,
    "",
    ...opts.paragraphs.flatMap((p) => [typeof p === "string" ? p : p.text, ""]),
    ...(opts.action ? [`${opts.action.label}: ${opts.action.url}`, ""] : []),
    "--",
    footer,
  ].join("\n");
  const button = opts.action
    ? `<p><a href="${escapeHtml(opts.action.url)}" style="display:inline-block;padding:10px 16px;background:#1f5f5b;color:#fff;border-radius:6px;text-decoration:none">${escapeHtml(opts.action.label)}</a></p>`
    : "";
  const html = `<!doctype html><html><body style="font-family:Georgia,serif;color:#1d2330;line-height:1.5">
<p>${escapeHtml(opts.greeting)}</p>
${opts.paragraphs.map(paragraphHtml).join("\n")}
${button}
<hr style="border:none;border-top:1px solid #d8d3c6"><p style="font-size:12px;color:#5b6170">${escapeHtml(footer)}</p>
</body></html>`;
  return { subject: opts.subject, text, html };
}
