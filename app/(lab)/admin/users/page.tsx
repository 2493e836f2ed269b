import type { Metadata } from "next";
import { PageHeader } from "@/components/ui/page-header";
import { Cell, HeaderCell, Row, Table, TableHead } from "@/components/ui/table";
import { TextLink } from "@/components/ui/text-link";
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
            <TextLink href="/admin/security">
              Sign-in security
            </TextLink>
            .
          </>
        }
      />
      <section aria-labelledby="people" className="mb-8 overflow-x-auto">
        <h2 id="people" className="sr-only">
          People
        </h2>
        <Table>
          <TableHead>
            <HeaderCell>Name</HeaderCell>
            <HeaderCell>E-mail</HeaderCell>
            <HeaderCell>Role</HeaderCell>
            <HeaderCell>Status</HeaderCell>
            <HeaderCell>Change</HeaderCell>
            <HeaderCell>Password and sessions</HeaderCell>
          </TableHead>
          <tbody>
            {users.map((u, i) => (
              <Row key={u.id} data-testid={`user-${u.email}`} top>
                <Cell className="font-medium">{u.displayName}</Cell>
                <Cell>{u.email}</Cell>
                <Cell>{ROLE_LABELS[u.role]}</Cell>
                <Cell>{u.active ? "active" : <span className="text-deviates">deactivated</span>}</Cell>
                <Cell>
                  <UserRowControls userId={u.id} name={u.displayName} role={u.role} active={u.active} isSelf={u.id === me.id} />
                </Cell>
                <Cell>
                  <UserAccessControls userId={u.id} name={u.displayName} sessions={sessions[i] ?? 0} isSelf={u.id === me.id} />
                </Cell>
              </Row>
            ))}
          </tbody>
        </Table>
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
