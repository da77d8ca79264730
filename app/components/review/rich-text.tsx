/** Shows rich text rendered and sanitised on the server (app/review/tiptap/render.server.ts). */
export function RichText({ html, className = "" }: { html: string; className?: string }) {
  return <div className={`prose-remark ${className}`} dangerouslySetInnerHTML={{ __html: html }} />;
}
