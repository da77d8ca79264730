// KaTeX's stylesheet (and its fonts, bundled by Vite) for the formulas the server typeset.
import "katex/dist/katex.min.css";

/** Shows rich text rendered and sanitised on the server (app/review/tiptap/render.server.ts), formulas typeset by KaTeX. */
export function RichText({ html, className = "" }: { html: string; className?: string }) {
  return <div className={`prose-remark ${className}`} dangerouslySetInnerHTML={{ __html: html }} />;
}
