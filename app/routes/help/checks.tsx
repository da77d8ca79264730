import { rules } from "~/checker/registry";
import type { Route } from "./+types/checks";

export const meta: Route.MetaFunction = () => [{ title: "Checks reference · Runproof" }];

export function loader() {
  return { rules };
}

export default function ChecksReference({ loaderData }: Route.ComponentProps) {
  return (
    <main className="mx-auto max-w-6xl p-gutter">
      <h1 className="text-title">What the checker looks at</h1>
      <p className="mt-3 max-w-3xl rounded border border-amber bg-amber-wash p-3" role="note">
        Flags are advisory. They are computed from what the authors entered, under the conventions they declared;
        the reviewer's judgement decides.
      </p>
      <pre>{JSON.stringify(loaderData.rules.length)}</pre>
    </main>
  );
}
