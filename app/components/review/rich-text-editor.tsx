import type { Editor } from "@tiptap/react";
import { lazy, Suspense, useEffect, useState, type ReactNode } from "react";
import { docText, emptyDoc } from "~/review/tiptap/doc";

/**
 * The editor of remarks, notes and letters. Tiptap is a chunk of its own, fetched once the page is
 * on screen and interactive, so it is not part of any page's initial JavaScript; until it is in
 * (and in the server's HTML) a frame of the same size stands in, showing the text it starts with
 * and carrying it in the form, so a form sent meanwhile loses nothing.
 */
export type RichTextEditorProps = { name: string; label: string; initial?: unknown; id: string };

const Impl = lazy(() => import("./rich-text-editor-impl"));

type Tool = { label: string; active: (e: Editor) => boolean; run: (e: Editor) => void };

const TOOLS: Tool[] = [
  { label: "Heading", active: (e) => e.isActive("heading", { level: 3 }), run: (e) => e.chain().focus().toggleHeading({ level: 3 }).run() },
  { label: "Bold", active: (e) => e.isActive("bold"), run: (e) => e.chain().focus().toggleBold().run() },
  { label: "Italic", active: (e) => e.isActive("italic"), run: (e) => e.chain().focus().toggleItalic().run() },
  { label: "List", active: (e) => e.isActive("bulletList"), run: (e) => e.chain().focus().toggleBulletList().run() },
  { label: "Numbered", active: (e) => e.isActive("orderedList"), run: (e) => e.chain().focus().toggleOrderedList().run() },
  { label: "Code", active: (e) => e.isActive("code"), run: (e) => e.chain().focus().toggleCode().run() },
  { label: "TeX", active: (e) => e.isActive("tex"), run: (e) => e.chain().focus().toggleMark("tex").run() },
  {
    label: "Link",
    active: (e) => e.isActive("link"),
    run: (e) => {
      const href = window.prompt("Link address (https://…)");
      if (href) e.chain().focus().extendMarkRange("link").setLink({ href }).run();
      else e.chain().focus().unsetLink().run();
    },
  },
];

/** The label, the formatting buttons (disabled until there is an editor) and the writing area. */
export function EditorFrame({ id, label, editor, children }: { id: string; label: string; editor: Editor | null; children: ReactNode }) {
  return (
    <div className="flex flex-col gap-1">
      <span id={`${id}-label`} className="font-semibold">
        {label}
      </span>
      <div className="rounded border border-rule bg-white">
        <div className="flex flex-wrap gap-1 border-b border-rule p-1" role="toolbar" aria-label={`${label}: formatting`}>
          {TOOLS.map((t) => {
            const active = editor ? t.active(editor) : false;
            return (
              <button
                key={t.label}
                type="button"
                className={`rounded px-2 py-0.5 text-caption ${active ? "bg-lichen text-vellum" : "bg-vellum-deep"}`}
                aria-pressed={active}
                disabled={!editor}
                onClick={() => editor && t.run(editor)}
              >
                {t.label}
              </button>
            );
          })}
        </div>
        {children}
      </div>
    </div>
  );
}

/** The writing area while the editor loads: the same size, the starting text as plain text. */
export function EditorPlaceholder({ initial }: { initial?: unknown }) {
  const text = initial ? docText(initial) : "";
  return (
    <div className="prose-remark min-h-24 whitespace-pre-wrap p-2 text-basalt-soft" aria-busy="true" data-testid="rich-text-loading">
      {text || "Loading the editor…"}
    </div>
  );
}

function Standin({ name, label, initial, id }: RichTextEditorProps) {
  return (
    <>
      <EditorFrame id={id} label={label} editor={null}>
        <EditorPlaceholder initial={initial} />
      </EditorFrame>
      <input type="hidden" name={name} value={JSON.stringify(initial ?? emptyDoc)} />
    </>
  );
}

export function RichTextEditor(props: RichTextEditorProps) {
  const [ready, setReady] = useState(false);
  useEffect(() => setReady(true), []);
  if (!ready) return <Standin {...props} />;
  return (
    <Suspense fallback={<Standin {...props} />}>
      <Impl {...props} />
    </Suspense>
  );
}
