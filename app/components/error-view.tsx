import { isRouteErrorResponse, Link } from "react-router";

const byStatus: Record<number, { title: string; hint: string }> = {
  400: { title: "That request could not be read", hint: "Check the form or file and try again." },
  401: { title: "Please sign in", hint: "This page needs a signed-in account." },
  403: { title: "Not open to your account", hint: "Your roles do not include this page. Ask an administrator if you need it." },
  404: { title: "Nothing here", hint: "The address may be mistyped, or the item is not shared with you." },
  409: { title: "Someone changed this first", hint: "Reload the page to see the latest version, then try again." },
  413: { title: "That upload is too large", hint: "Split the file or ask for a higher limit." },
  503: { title: "Not available for a moment", hint: "Nothing is wrong with your request; reload the page in a few seconds." },
};

/** Shown by the root error boundary and by nested layouts, so a failure never hides the header. */
export function ErrorView({ error }: { error: unknown }) {
  if (isRouteErrorResponse(error)) {
    const known = byStatus[error.status] ?? { title: `Error ${error.status}`, hint: "" };
    const detail = typeof error.data === "string" ? error.data : null;
    return (
      <main className="mx-auto max-w-2xl p-gutter" data-status={error.status}>
        <p className="font-mono text-caption text-basalt-soft">status {error.status}</p>
        <h1 className="text-title mt-2">{known.title}</h1>
        {detail && detail !== "Not found" ? <p className="mt-3">{detail}</p> : null}
        <p className="mt-3 text-basalt-soft">{known.hint}</p>
        <p className="mt-6">
          <Link to="/">Back to the start page</Link>
        </p>
      </main>
    );
  }
  const message = error instanceof Error ? error.message : "Unknown error";
  return (
    <main className="mx-auto max-w-2xl p-gutter" data-status={500}>
      <h1 className="text-title">Something went wrong on our side</h1>
      <p className="mt-3">The error was recorded. Try again in a moment.</p>
      {import.meta.env.DEV ? <pre className="mt-4 overflow-auto text-caption">{message}</pre> : null}
    </main>
  );
}
