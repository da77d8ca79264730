import { getInputProps, type FieldMetadata } from "@conform-to/react";

type Props = {
  meta: FieldMetadata<string | undefined>;
  label: string;
  type?: "text" | "email" | "password" | "url";
  autoComplete?: string;
  hint?: string;
};

/** Label, hint and error line around any control, wired for screen readers by the field's ids. */
export function FieldFrame({
  meta,
  label,
  hint,
  children,
}: {
  meta: FieldMetadata<string | undefined>;
  label: string;
  hint?: string;
  children: React.ReactNode;
}) {
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
      {children}
      <p id={meta.errorId} className="field-error" role={meta.errors ? "alert" : undefined}>
        {meta.errors?.join(" ")}
      </p>
    </div>
  );
}

/** A labelled input with its hint and errors. */
export function TextField({ meta, label, type = "text", autoComplete, hint }: Props) {
  return (
    <FieldFrame meta={meta} label={label} hint={hint}>
      <input {...getInputProps(meta, { type })} key={meta.key} autoComplete={autoComplete} className="field-input" />
    </FieldFrame>
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
