import { NavLink, Outlet, href } from "react-router";
import { requireAdmin } from "~/access/session.server";
import type { Route } from "./+types/layout";

// This guard only decides whether the tabs render; each child loader and action checks again.
export async function loader(args: Route.LoaderArgs) {
  await requireAdmin(args);
  return null;
}

export default function AdminLayout() {
  const tab = ({ isActive }: { isActive: boolean }) =>
    `px-3 py-1.5 rounded-t border-b-2 ${isActive ? "border-lichen font-semibold" : "border-transparent"}`;
  return (
    <main className="mx-auto max-w-5xl p-gutter">
      <h1 className="text-title">Instance</h1>
      <nav aria-label="Instance sections" className="mt-4 flex gap-2 border-b border-rule">
        <NavLink to={href("/admin")} end className={tab}>
          Overview
        </NavLink>
        <NavLink to={href("/admin/venues")} className={tab}>
          Venues and editors
        </NavLink>
        <NavLink to={href("/admin/users")} className={tab}>
          Accounts
        </NavLink>
      </nav>
      <div className="mt-6">
        <Outlet />
      </div>
    </main>
  );
}
