import { useSearchParams } from "react-router";
import type { Route } from "./+types/check-email";

export const meta: Route.MetaFunction = () => [{ title: "Check your mail · Runproof" }];

export default function CheckEmail() {
  const [params] = useSearchParams();
  const to = params.get("to");
  return (
    <main className="mx-auto max-w-md p-gutter">
      <h1 className="text-title">Check your mail</h1>
      <p className="mt-3" role="status">
        We sent a confirmation link{to ? ` to ${to}` : ""}. Open it to activate the account; it expires in one hour.
      </p>
      <p className="mt-3 text-caption text-basalt-soft">
        Nothing arrived? Look in the spam folder, or sign in again to get a fresh link.
      </p>
    </main>
  );
}
