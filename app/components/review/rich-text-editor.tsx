import { EditorContent, useEditor, type Editor } from "@tiptap/react";
import { useState } from "react";
import { emptyDoc, richTextExtensions } from "~/review/tiptap/extensions";

function Tool({ editor, label, run, active }: { editor: Editor | null; label: string; run: (e: Editor) => void; active?: boolean }) {
  return (
    <button
      type="button"
      className={`rounded px-2 py-0.5 text-caption ${active ? "bg-lichen text-vellum" : "bg-vellum-deep"}`}
      aria-pressed={active}
      disabled={!editor}
      onClick={() => editor && run(editor)}
    >
      {label}
    </button>
  );
}

/**
 * The Tiptap editor of remarks, notes and letters. Its value travels as Tiptap JSON in a hidden
 * input named `name`, so it posts with an ordinary form or fetcher; the schema is the shared one.
 */
export function RichTextEditor({ name, label, initial, id }: { name: string; label: string; initial?: unknown; id: string }) {
  const [json, setJson] = useState(() => JSON.stringify(initial ?? emptyDoc));
  const editor = useEditor({
    extensions: richTextExtensions,
    content: (initial as object) ?? emptyDoc,
    immediatelyRender: false,
    editorProps: { attributes: { class: "prose-remark min-h-24 p-2 focus:outline-none", "aria-labelledby": `${id}-label`, role: "textbox", "aria-multiline": "true", "data-testid": `${id}-editor` } },
    onUpdate: ({ editor }) => setJson(JSON.stringify(editor.getJSON())),
  });
  const is = (n: string, attrs?: object) => editor?.isActive(n, attrs) ?? false;
  return (
    <div className="flex flex-col gap-1">
      <span id={`${id}-label`} className="font-semibold">
        {label}
      </span>
      <div className="rounded border border-rule bg-white">
        <div className="flex flex-wrap gap-1 border-b border-rule p-1" role="toolbar" aria-label={`${label}: formatting`}>
          <Tool editor={editor} label="Heading" active={is("heading", { level: 3 })} run={(e) => e.chain().focus().toggleHeading({ level: 3 }).run()} />
          <Tool editor={editor} label="Bold" active={is("bold")} run={(e) => e.chain().focus().toggleBold().run()} />
          <Tool editor={editor} label="Italic" active={is("italic")} run={(e) => e.chain().focus().toggleItalic().run()} />
          <Tool editor={editor} label="List" active={is("bulletList")} run={(e) => e.chain().focus().toggleBulletList().run()} />
          <Tool editor={editor} label="Numbered" active={is("orderedList")} run={(e) => e.chain().focus().toggleOrderedList().run()} />
          <Tool editor={editor} label="Code" active={is("code")} run={(e) => e.chain().focus().toggleCode().run()} />
          <Tool editor={editor} label="TeX" active={is("tex")} run={(e) => e.chain().focus().toggleMark("tex").run()} />
          <Tool
            editor={editor}
            label="Link"
            active={is("link")}
            run={(e) => {
              const href = window.prompt("Link address (https://…)");
              if (href) e.chain().focus().extendMarkRange("link").setLink({ href }).run();
              else e.chain().focus().unsetLink().run();
            }}
          />
        </div>
        <EditorContent editor={editor} />
      </div>
      <input type="hidden" name={name} value={json} />
    </div>
  );
}
