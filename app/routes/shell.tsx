import { Outlet, useRouteLoaderData } from "react-router";
import { sessionUser } from "~/access/session.server";
import { requestRoleSummary, roleLabels } from "~/auth/roles.server";
import { dbContext } from "~/db.server";
import { ErrorView } from "~/components/error-view";
import { SiteHeader } from "~/components/site-header";
import type { Route } from "./+types/shell";

// The header only: who is signed in and what they hold. Child routes guard themselves.
export async function loader({ request, context }: Route.LoaderArgs) {
  const user = await sessionUser({ request, context });
  if (!user) return { viewer: null };
  const summary = await requestRoleSummary(context, context.get(dbContext), user);
  return { viewer: { name: user.name, email: user.email, roles: roleLabels(summary), admin: summary.admin } };
}

export default function Shell({ loaderData }: Route.ComponentProps) {
  return (
    <>
      <SiteHeader viewer={loaderData.viewer} />
      <Outlet />
    </>
  );
}

export function ErrorBoundary({ error }: Route.ErrorBoundaryProps) {
  const data = useRouteLoaderData<typeof loader>("routes/shell");
  return (
    <>
      <SiteHeader viewer={data?.viewer ?? null} />
      <ErrorView error={error} />
    </>
  );
}
