import { href } from "react-router";
import { POLICY_FIELD_INFO } from "~/review/policy-form";

/** The venue's checker thresholds, each named in words with its unit, its default and the rules it governs. */
export function PolicyFields({ policy, errors }: { policy: Record<string, unknown>; errors?: Record<string, string> }) {
  return (
    <>
      {POLICY_FIELD_INFO.map((f) => {
        const error = errors?.[f.key];
        const current = policy[f.key];
        return (
          <div key={f.key} className="flex flex-col gap-1" data-testid={`policy-${f.key}`}>
            <label htmlFor={`policy-${f.key}`} className="text-caption font-semibold">
              {f.label}
            </label>
            <p id={`policy-${f.key}-hint`} className="text-caption text-basalt-soft">
              In {f.unit}; default {f.defaultValue}.{" "}
              {f.rules.length ? (
                <>
                  Governs{" "}
                  {f.rules.map((r, i) => (
                    <span key={r.id}>
                      {i ? ", " : ""}
                      <a className="underline" href={`${href("/help/checks")}#${r.id}`}>
                        {r.title}
                      </a>
                    </span>
                  ))}
                  .
                </>
              ) : null}
            </p>
            <input
              id={`policy-${f.key}`}
              name={f.key}
              inputMode="decimal"
              maxLength={40}
              defaultValue={current === undefined ? "" : String(current)}
              className="field-input"
              aria-invalid={error ? true : undefined}
              aria-describedby={error ? `policy-${f.key}-hint policy-${f.key}-error` : `policy-${f.key}-hint`}
            />
            {error ? (
              <p id={`policy-${f.key}-error`} className="field-error" role="alert">
                {error}
              </p>
            ) : null}
          </div>
        );
      })}
    </>
  );
}
