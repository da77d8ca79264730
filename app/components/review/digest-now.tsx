import { href, useFetcher } from "react-router";

/** What the digest action answers. */
export type DigestNowResult = { ok: boolean; message: string };

/**
 * The editor's "Send the digest now" for a submission: asks once, naming who will get it, then
 * says who got it (or why nobody did).
 */
export function DigestNow({ params, recipients }: { params: { venueId: string; submissionId: string; round: string }; recipients: { name: string; email: string }[] }) {
  const fetcher = useFetcher<DigestNowResult>();
  const who = recipients.map((r) => `${r.name} (${r.email})`).join(", ");
  return (
    <section className="card mt-6" aria-labelledby="digest-now-h" data-testid="digest-now">
      <h2 id="digest-now-h" className="text-lead">Authors' digest</h2>
      <p className="text-caption">
        {recipients.length
          ? `Mails the authors who get digests — ${who} — this submission's new flags, released remarks and decisions since their last digest, now instead of at their next daily or weekly digest.`
          : "No author of this submission gets digests (each has turned them off)."}
      </p>
      <fetcher.Form
        method="post"
        action={href("/venues/:venueId/submissions/:submissionId/rounds/:round/digest", params)}
        className="mt-2"
        onSubmit={(e) => {
          if (!window.confirm(`Send this submission's digest now to ${who || "nobody (no author gets digests)"}?`)) e.preventDefault();
        }}
      >
        <button type="submit" className="btn-quiet" disabled={fetcher.state !== "idle" || recipients.length === 0}>
          Send the digest now
        </button>
      </fetcher.Form>
      {fetcher.data ? (
        <p role={fetcher.data.ok ? "status" : "alert"} className={`mt-2 rounded p-2 ${fetcher.data.ok ? "bg-lichen-wash" : "border border-ember bg-ember-wash text-ember"}`}>
          {fetcher.data.message}
        </p>
      ) : null}
    </section>
  );
}
