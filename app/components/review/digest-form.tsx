import { useFetcher, href } from "react-router";

const OPTIONS = [
  { value: "daily", label: "Daily" },
  { value: "weekly", label: "Weekly" },
  { value: "none", label: "No digest" },
] as const;

/** How often the digest of new flags, released remarks and decisions arrives (one mail per period). */
export function DigestForm({ current }: { current: string }) {
  const fetcher = useFetcher<{ ok: boolean; error: string | null }>();
  return (
    <fetcher.Form method="post" action={href("/account/digest")} className="card mt-6 flex flex-col gap-2" data-testid="digest-form">
      <fieldset>
        <legend className="font-semibold">Digest e-mail</legend>
        <p className="text-caption text-basalt-soft">New flags, released reviewer remarks and decisions on the submissions you are listed on, in one mail per period.</p>
        <div className="mt-2 flex gap-4">
          {OPTIONS.map((o) => (
            <label key={o.value} className="flex items-center gap-1">
              <input type="radio" name="digest" value={o.value} defaultChecked={current === o.value} /> {o.label}
            </label>
          ))}
        </div>
      </fieldset>
      <button type="submit" className="btn-quiet self-start">Save digest choice</button>
      {fetcher.state === "idle" && fetcher.data?.ok ? <p role="status" className="text-caption">Digest choice saved.</p> : null}
      {fetcher.data?.error ? <p role="alert" className="field-error">{fetcher.data.error}</p> : null}
    </fetcher.Form>
  );
}
