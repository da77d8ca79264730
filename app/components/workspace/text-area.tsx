import type { FieldMetadata } from "@conform-to/react";
import type { TextareaHTMLAttributes } from "react";
import { FieldFrame } from "~/components/field";

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
    <FieldFrame meta={meta} label={label} hint={hint}>
      <textarea key={key} {...props} rows={rows} className="field-input" />
    </FieldFrame>
  );
}
