import { parseWithZod } from "@conform-to/zod/v4";
import { asc, eq } from "drizzle-orm";
import { data, useFetcher } from "react-router";
import { user } from "~db/schema";
import { setRoleSchema } from "~/admin/venue-forms";
import { requireAdmin } from "~/access/session.server";
import type { Route } from "./+types/users";

export async function loader(args: Route.LoaderArgs) {
  const { db, user: me } = await requireAdmin(args);
  const rows = await db
    .select({ id: user.id, name: user.name, email: user.email, role: user.role, verified: user.emailVerified, affiliation: user.affiliation })
    .from(user)
    .orderBy(asc(user.name));
  return { users: rows, me: me.id };
}

export async function action(args: Route.ActionArgs) {
  const { db, user: me } = await requireAdmin(args);
  const submission = parseWithZod(await args.request.formData(), { schema: setRoleSchema });
  if (submission.status !== "success") return data({ error: "That change could not be read." }, { status: 400 });
  if (submission.value.userId === me.id && submission.value.role !== "admin") {
    return data({ error: "You cannot remove your own administrator role; ask another administrator." }, { status: 400 });
  }
  await db.update(user).set({ role: submission.value.role }).where(eq(user.id, submission.value.userId));
  return { error: null };
}

function RoleToggle({ id, role, disabled }: { id: string; role: string | null; disabled: boolean }) {
  const fetcher = useFetcher<typeof action>();
  const pending = fetcher.formData?.get("role");
  const shown = typeof pending === "string" ? pending : (role ?? "user");
  return (
    <fetcher.Form method="post" className="flex items-center gap-2">
      <input type="hidden" name="intent" value="set-role" />
      <input type="hidden" name="userId" value={id} />
      <input type="hidden" name="role" value={shown === "admin" ? "user" : "admin"} />
      <span className="font-mono">{shown}</span>
      <button type="submit" className="btn btn-quiet py-0.5" disabled={disabled}>
        {shown === "admin" ? "Make ordinary" : "Make admin"}
      </button>
      {fetcher.data?.error ? <span className="field-error">{fetcher.data.error}</span> : null}
    </fetcher.Form>
  );
}

export default function AdminUsers({ loaderData }: Route.ComponentProps) {
  return (
    <table className="w-full text-left text-caption">
      <thead>
        <tr className="border-b border-rule">
          <th className="py-1">Name</th>
          <th>E-mail</th>
          <th>Affiliation</th>
          <th>Instance role</th>
        </tr>
      </thead>
      <tbody>
        {loaderData.users.map((u) => (
          <tr key={u.id} className="border-b border-rule">
            <td className="py-2">{u.name}</td>
            <td>
              {u.email} {u.verified ? null : <em className="text-amber">(unconfirmed)</em>}
            </td>
            <td>{u.affiliation}</td>
            <td>
              <RoleToggle id={u.id} role={u.role} disabled={u.id === loaderData.me} />
            </td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}
