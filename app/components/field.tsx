import { getInputProps, type FieldMetadata } from "@conform-to/react";

type Props = {
  meta: FieldMetadata<string | undefined>;
  label: string;
  type?: "text" | "email" | "password" | "url";
  autoComplete?: string;
  hint?: string;
};

/** A labelled input with its hint and errors wired for screen readers. */
export function TextField({ meta, label, type = "text", autoComplete, hint }: Props) {
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
      <input
        {...getInputProps(meta, { type })}
        key={meta.key}
        autoComplete={autoComplete}
        className="field-input"
      />
      <p id={meta.errorId} className="field-error" role={meta.errors ? "alert" : undefined}>
        {meta.errors?.join(" ")}
      </p>
    </div>
  );
}

export function FormErrors({ errors, id }: { errors?: string[]; id?: string }) {
  if (!errors?.length) return null;
  return (
    <div id={id} role="alert" className="rounded border border-ember bg-ember-wash p-3 text-ember">
      {errors.join(" ")}
    </div>
  );
}
