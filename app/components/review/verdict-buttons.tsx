import { useFetcher } from "react-router";

const CHOICES = [
  { value: "agree", label: "Agree" },
  { value: "dispute", label: "Dispute" },
  { value: "ask-authors", label: "Ask the authors" },
] as const;

/** The reviewer's verdict on one flag, saved in place; the choice shows before the server answers. */
export function VerdictButtons({ flagId, saved, locked }: { flagId: string; saved?: string; locked: boolean }) {
  const fetcher = useFetcher<{ ok: boolean; error?: string }>();
  const pending = fetcher.formData?.get("verdict");
  const failed = fetcher.state === "idle" && fetcher.data && !fetcher.data.ok;
  // Optimistic: the pending choice shows at once; the loader's revalidation then confirms it.
  const current = typeof pending === "string" ? pending : saved;
  return (
    <fetcher.Form method="post" className="mt-1 flex flex-wrap items-center gap-1" aria-label="Your verdict on this flag">
      <input type="hidden" name="intent" value="verdict" />
      <input type="hidden" name="flagId" value={flagId} />
      {CHOICES.map((c) => (
        <button
          key={c.value}
          type="submit"
          name="verdict"
          value={c.value}
          disabled={locked}
          aria-pressed={current === c.value}
          className={`rounded px-2 py-0.5 text-caption ${current === c.value ? "bg-lichen text-vellum" : "bg-vellum-deep"}`}
        >
          {c.label}
        </button>
      ))}
      {failed ? <span role="alert" className="text-caption text-ember">{fetcher.data?.error}</span> : null}
    </fetcher.Form>
  );
}
