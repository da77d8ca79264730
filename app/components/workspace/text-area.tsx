import type { FieldMetadata } from "@conform-to/react";
import type { TextareaHTMLAttributes } from "react";

/** A labelled textarea in the same shape as TextField (hint and errors wired for screen readers). */
export function TextArea({
  meta,
  label,
  hint,
  rows = 4,
  textarea,
}: {
  meta: FieldMetadata<string | undefined>;
  label: string;
  hint?: string;
  rows?: number;
  textarea: TextareaHTMLAttributes<HTMLTextAreaElement> & { key?: string };
}) {
  const { key, ...props } = textarea;
  return (
    <div className="flex flex-col gap-1">
      <label htmlFor={meta.id} className="font-semibold">
        {label}
      </label>
      {hint ? (
        <p id={`${meta.id}-hint`} className="text-caption text-basalt-soft">
          {hint}
        </p>
      ) : null}
      <textarea key={key} {...props} rows={rows} className="field-input" />
      <p id={meta.errorId} className="field-error" role={meta.errors ? "alert" : undefined}>
        {meta.errors?.join(" ")}
      </p>
    </div>
  );
}
