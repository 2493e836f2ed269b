import "server-only";
import type { Executor } from "./index";
import type { Role } from "./schema";

/** What the rest of the app may know about a user: never the password hash. */
export interface UserView {
  id: string;
  email: string;
  displayName: string;
  role: Role;
  active: boolean;
  createdAt: Date;
}

const VIEW_COLUMNS = ["id", "email", "display_name", "role", "active", "created_at"] as const;

function toView(r: {
  id: string;
  email: string;
  display_name: string;
  role: Role;
  active: boolean;
  created_at: Date;
}): UserView {
  return { id: r.id, email: r.email, displayName: r.display_name, role: r.role, active: r.active, createdAt: r.created_at };
}

export async function listUsers(db: Executor): Promise<UserView[]> {
  const rows = await db.selectFrom("app_user").select(VIEW_COLUMNS).orderBy("role").orderBy("display_name").execute();
  return rows.map(toView);
}

export async function getUser(db: Executor, id: string, opts: { forUpdate?: boolean } = {}): Promise<UserView | null> {
  let q = db.selectFrom("app_user").select(VIEW_COLUMNS).where("id", "=", id);
  if (opts.forUpdate) q = q.forUpdate();
  const row = await q.executeTakeFirst();
  return row ? toView(row) : null;
}

/** For sign-in only: the one place the hash leaves the database. */
export async function getUserCredentials(
  db: Executor,
  email: string,
): Promise<(UserView & { passwordHash: string }) | null> {
  const row = await db
    .selectFrom("app_user")
    .select([...VIEW_COLUMNS, "password_hash"])
    .where("email", "=", email.toLowerCase())
    .executeTakeFirst();
  return row ? { ...toView(row), passwordHash: row.password_hash } : null;
}

export async function insertUser(
  db: Executor,
  user: { id: string; email: string; displayName: string; role: Role; passwordHash: string },
): Promise<UserView> {
  const row = await db
    .insertInto("app_user")
    .values({
      id: user.id,
      email: user.email.toLowerCase(),
      display_name: user.displayName,
      role: user.role,
      password_hash: user.passwordHash,
    })
    .returning(VIEW_COLUMNS)
    .executeTakeFirstOrThrow();
  return toView(row);
}

export async function updateUser(
  db: Executor,
  id: string,
  change: { role?: Role; active?: boolean; displayName?: string; passwordHash?: string },
): Promise<UserView> {
  const row = await db
    .updateTable("app_user")
    .set({
      ...(change.role !== undefined && { role: change.role }),
      ...(change.active !== undefined && { active: change.active }),
      ...(change.displayName !== undefined && { display_name: change.displayName }),
      ...(change.passwordHash !== undefined && { password_hash: change.passwordHash }),
      updated_at: new Date(),
    })
    .where("id", "=", id)
    .returning(VIEW_COLUMNS)
    .executeTakeFirstOrThrow();
  return toView(row);
}

export async function countActiveAdmins(db: Executor): Promise<number> {
  const row = await db
    .selectFrom("app_user")
    .select((eb) => eb.fn.countAll<string>().as("n"))
    .where("role", "=", "admin")
    .where("active", "=", true)
    .executeTakeFirstOrThrow();
  return Number(row.n);
}
