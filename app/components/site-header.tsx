import { Form, Link, NavLink, href } from "react-router";

export type Viewer = { name: string; email: string; roles: string[]; admin: boolean } | null;

export function SiteHeader({ viewer }: { viewer: Viewer }) {
  const nav = "px-2 py-1 rounded hover:bg-vellum-deep";
  return (
    <header className="border-b border-rule bg-white">
      <div className="mx-auto flex max-w-6xl flex-wrap items-center gap-4 px-gutter py-3">
        <Link to="/" className="font-serif text-lead font-bold text-basalt no-underline">
          Run<span className="text-lichen">proof</span>
        </Link>
        <nav aria-label="Main" className="flex gap-1 text-caption">
          {viewer ? (
            <NavLink to={href("/dashboard")} className={nav}>
              What needs me
            </NavLink>
          ) : null}
          <NavLink to={href("/help/checks")} className={nav}>
            Checks reference
          </NavLink>
          {viewer?.admin ? (
            <NavLink to={href("/admin")} className={nav}>
              Instance
            </NavLink>
          ) : null}
        </nav>
        <div className="ml-auto flex items-center gap-3 text-caption">
          {viewer ? (
            <>
              <Link to={href("/account")} className="text-basalt" data-testid="viewer-name">
                {viewer.name}
              </Link>
              <ul aria-label="Your roles" className="flex gap-1" data-testid="viewer-roles">
                {viewer.roles.map((r) => (
                  <li key={r} className="rounded-full bg-lichen-wash px-2 py-0.5 font-mono text-lichen">
                    {r}
                  </li>
                ))}
              </ul>
              <Form method="post" action="/sign-out">
                <button type="submit" className="btn-quiet btn py-1">
                  Sign out
                </button>
              </Form>
            </>
          ) : (
            <>
              <Link to={href("/sign-in")}>Sign in</Link>
              <Link to={href("/sign-up")} className="btn py-1">
                Create an account
              </Link>
            </>
          )}
        </div>
      </div>
    </header>
  );
}
