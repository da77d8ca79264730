import { redirect, href } from "react-router";
import { auth } from "~/auth/auth.server";
import { forwardCookies } from "~/auth/cookies.server";
import type { Route } from "./+types/sign-out";

export async function loader() {
  throw redirect("/");
}

export async function action({ request }: Route.ActionArgs) {
  const res = await auth.api.signOut({ headers: request.headers, asResponse: true });
  throw redirect(href("/sign-in"), { headers: forwardCookies(res) });
}
