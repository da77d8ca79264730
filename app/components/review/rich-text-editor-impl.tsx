import { EditorContent, useEditor } from "@tiptap/react";
import { useState } from "react";
import { emptyDoc } from "~/review/tiptap/doc";
import { richTextExtensions } from "~/review/tiptap/extensions";
import { EditorFrame, EditorPlaceholder, type RichTextEditorProps } from "./rich-text-editor";

/**
 * The Tiptap editor itself (loaded on demand by `RichTextEditor`). Its value travels as Tiptap JSON
 * in a hidden input named `name`, so it posts with an ordinary form or fetcher; the schema is the
 * shared one.
 */
export default function RichTextEditorImpl({ name, label, initial, id }: RichTextEditorProps) {
  const [json, setJson] = useState(() => JSON.stringify(initial ?? emptyDoc));
  const editor = useEditor({
    extensions: richTextExtensions,
    content: (initial as object) ?? emptyDoc,
    immediatelyRender: false,
    editorProps: { attributes: { class: "prose-remark min-h-24 p-2 focus:outline-none", "aria-labelledby": `${id}-label`, role: "textbox", "aria-multiline": "true", "data-testid": `${id}-editor` } },
    onUpdate: ({ editor }) => setJson(JSON.stringify(editor.getJSON())),
  });
  return (
    <>
      <EditorFrame id={id} label={label} editor={editor}>
        {editor ? <EditorContent editor={editor} /> : <EditorPlaceholder initial={initial} />}
      </EditorFrame>
      <input type="hidden" name={name} value={json} />
    </>
  );
}
