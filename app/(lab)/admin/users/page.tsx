import type { Metadata } from "next";
import Link from "next/link";
import { PageHeader } from "@/components/ui/page-header";
import { getDb } from "@/db";
import { countUserSessions } from "@/db/sessions";
import { listUsers } from "@/db/users";
import { requirePageAccess } from "@/lib/auth/guards";
import { ROLE_LABELS } from "@/lib/auth/permissions";
import { CreateUserForm } from "./create-user-form";
import { UserAccessControls } from "./user-access-controls";
import { UserRowControls } from "./user-row-controls";

export const metadata: Metadata = { title: "Users" };

export default async function UsersPage() {
  const me = await requirePageAccess("/admin/users");
  const users = await listUsers(getDb());
  const sessions = await Promise.all(users.map((u) => countUserSessions(getDb(), u.id)));
  return (
    <>
      <PageHeader
        title="Users"
        lead={
          <>
            Everyone who may sign in, with one role each. Deactivating someone, or setting a new password for them, signs them out at once; their records stay.
            Slowed-down and refused sign-ins, and requests refused from other sites:{" "}
            <Link href="/admin/security" className="text-copper-deep underline">
              Sign-in security
            </Link>
            .
          </>
        }
      />
      <section aria-labelledby="people" className="mb-8 overflow-x-auto">
        <h2 id="people" className="sr-only">
          People
        </h2>
        <table className="w-full border-collapse text-sm">
          <thead>
            <tr className="border-b border-rule text-left">
              <th className="py-2 pr-3">Name</th>
              <th className="py-2 pr-3">E-mail</th>
              <th className="py-2 pr-3">Role</th>
              <th className="py-2 pr-3">Status</th>
              <th className="py-2 pr-3">Change</th>
              <th className="py-2">Password and sessions</th>
            </tr>
          </thead>
          <tbody>
            {users.map((u, i) => (
              <tr key={u.id} className="border-b border-rule align-top" data-testid={`user-${u.email}`}>
                <td className="py-2 pr-3 font-medium">{u.displayName}</td>
                <td className="py-2 pr-3">{u.email}</td>
                <td className="py-2 pr-3">{ROLE_LABELS[u.role]}</td>
                <td className="py-2 pr-3">{u.active ? "active" : <span className="text-deviates">deactivated</span>}</td>
                <td className="py-2">
                  <UserRowControls userId={u.id} name={u.displayName} role={u.role} active={u.active} isSelf={u.id === me.id} />
                </td>
                <td className="py-2">
                  <UserAccessControls userId={u.id} name={u.displayName} sessions={sessions[i] ?? 0} isSelf={u.id === me.id} />
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      </section>
      <section aria-labelledby="add" className="rounded border border-rule bg-white p-5">
        <h2 id="add" className="mb-3 text-lg font-bold">
          Add a person
        </h2>
        <CreateUserForm />
      </section>
    </>
  );
}
