import { useEffect, useState } from "react";
import { useFetcher } from "react-router";
import { RichTextEditor } from "./rich-text-editor";

export type AnchorOption = { value: string; label: string };

/**
 * A remark: anchored to what it sits beside (`fixedAnchor`), or to a choice among `anchors`;
 * write it, save; the editor clears after a save.
 */
export function RemarkForm({
  anchors = [],
  fixedAnchor,
  locked,
  defaultAnchor = "round:",
  remark,
  onDone,
  editorId,
}: {
  anchors?: AnchorOption[];
  /** The claim, run, flag or round the remark is about, already chosen by where it was opened. */
  fixedAnchor?: AnchorOption;
  locked: boolean;
  defaultAnchor?: string;
  /** Distinguishes several composers on one page. */
  editorId?: string;
  /** When given, the form edits this remark instead of adding one. */
  remark?: { id: string; body: unknown };
  onDone?: () => void;
}) {
  const fetcher = useFetcher<{ ok: boolean; error?: string }>();
  const [generation, setGeneration] = useState(0);
  const [chosen, setAnchor] = useState(defaultAnchor);
  const anchor = fixedAnchor?.value ?? chosen;
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
      {fixedAnchor ? (
        <p className="text-caption" data-testid="remark-anchor">
          Remark on <strong>{fixedAnchor.label}</strong>
        </p>
      ) : (
        <label className="flex flex-col gap-1 text-caption">
          <span className="font-semibold">The remark is about</span>
          <select className="field-input" value={anchor} onChange={(e) => setAnchor(e.target.value)} name="anchor">
            {anchors.map((a) => (
              <option key={a.value} value={a.value}>{a.label}</option>
            ))}
          </select>
        </label>
      )}
      <RichTextEditor
        key={generation}
        id={editorId ?? (remark ? `remark-${remark.id}` : "remark")}
        name="body"
        label="Remark (released to the authors with the decision; $…$ is typeset as TeX)"
        initial={remark?.body}
      />
      <div className="flex gap-2">
        <button type="submit" className="btn self-start" disabled={fetcher.state !== "idle"}>
          {remark ? "Save changes" : "Save remark"}
        </button>
        {onDone ? (
          <button type="button" className="btn-quiet" onClick={onDone}>
            Cancel
          </button>
        ) : null}
      </div>
      {fetcher.data && !fetcher.data.ok ? <p role="alert" className="field-error">{fetcher.data.error}</p> : null}
    </fetcher.Form>
  );
}
