import { auth } from "~/auth/auth.server";
import type { Route } from "./+types/auth";

// better-auth's own endpoints (verification links, sign-in from the client, session cookies).
export async function loader({ request }: Route.LoaderArgs) {
  return auth.handler(request);
}

export async function action({ request }: Route.ActionArgs) {
  return auth.handler(request);
}
