import { useEffect, useState } from "react";
import { useFetcher } from "react-router";
import { RichTextEditor } from "./rich-text-editor";

export type AnchorOption = { value: string; label: string };

/** A new remark: choose what it is about, write it, save; the editor clears after a save. */
export function RemarkForm({
  anchors,
  locked,
  defaultAnchor = "round:",
  remark,
  onDone,
}: {
  anchors: AnchorOption[];
  locked: boolean;
  defaultAnchor?: string;
  /** When given, the form edits this remark instead of adding one. */
  remark?: { id: string; body: unknown };
  onDone?: () => void;
}) {
  const fetcher = useFetcher<{ ok: boolean; error?: string }>();
  const [generation, setGeneration] = useState(0);
  const [anchor, setAnchor] = useState(defaultAnchor);
  useEffect(() => {
    if (fetcher.state === "idle" && fetcher.data?.ok) {
      setGeneration((g) => g + 1);
      onDone?.();
    }
  }, [fetcher.state, fetcher.data, onDone]);
  if (locked) return null;
  const [kind, ref] = anchor.split(/:(.*)/s) as [string, string];
  return (
    <fetcher.Form method="post" className="flex flex-col gap-2" data-testid={remark ? "remark-edit-form" : "remark-form"}>
      <input type="hidden" name="intent" value="remark" />
      {remark ? <input type="hidden" name="remarkId" value={remark.id} /> : null}
      <input type="hidden" name="anchorKind" value={kind} />
      <input type="hidden" name="anchorRef" value={ref ?? ""} />
      <label className="flex flex-col gap-1 text-caption">
        <span className="font-semibold">The remark is about</span>
        <select className="field-input" value={anchor} onChange={(e) => setAnchor(e.target.value)} name="anchor">
          {anchors.map((a) => (
            <option key={a.value} value={a.value}>{a.label}</option>
          ))}
        </select>
      </label>
      <RichTextEditor key={generation} id={remark ? `remark-${remark.id}` : "remark"} name="body" label="Remark (released to the authors with the decision)" initial={remark?.body} />
      <div className="flex gap-2">
        <button type="submit" className="btn self-start" disabled={fetcher.state !== "idle"}>
          {remark ? "Save changes" : "Save remark"}
        </button>
        {remark && onDone ? (
          <button type="button" className="btn-quiet" onClick={onDone}>
            Cancel
          </button>
        ) : null}
      </div>
      {fetcher.data && !fetcher.data.ok ? <p role="alert" className="field-error">{fetcher.data.error}</p> : null}
    </fetcher.Form>
  );
}
