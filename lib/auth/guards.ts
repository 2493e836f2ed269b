import "server-only";
import { headers } from "next/headers";
import { forbidden, redirect } from "next/navigation";
import { DomainError } from "@/lib/errors";
import { toErrorResponse } from "@/lib/api/error-response";
import { readUnstorableHeader, UNSTORABLE_HEADER } from "@/lib/security/unstorable-text";
import { can, type Permission } from "./permissions";
import { getRequestPath } from "./request-info";
import { getCurrentSession } from "./session";
import type { SignedInUser } from "./signed-in-user";

// The only ways into the server: pages call requirePageUser / requirePagePermission, route handlers
// are wrapped by apiRoute, server actions call requireActionPermission first.

export async function requirePageUser(): Promise<SignedInUser> {
  const session = await getCurrentSession();
  if (!session) {
    const path = await getRequestPath();
    redirect(path && path !== "/" ? `/sign-in?next=${encodeURIComponent(path)}` : "/sign-in");
  }
  return session.user;
}

export async function requirePagePermission(permission: Permission): Promise<SignedInUser> {
  const user = await requirePageUser();
  if (!can(user.role, permission)) forbidden();
  return user;
}

export async function requireActionPermission(permission: Permission): Promise<SignedInUser> {
  const session = await getCurrentSession();
  if (!session) throw new DomainError("unauthenticated", "Your session has ended. Sign in again.");
  if (!can(session.user.role, permission)) {
    throw new DomainError("forbidden", "Your role does not allow this action.");
  }
  // The proxy found text that cannot be stored in this action's form (proxy.ts): refuse before anything is written.
  const unstorable = readUnstorableHeader((await headers()).get(UNSTORABLE_HEADER));
  if (unstorable) throw new DomainError("invalid", unstorable.message, { field: unstorable.field });
  return session.user;
}

type Access = Permission | "signed-in";
type RouteContext<P> = { params: Promise<P> };

/**
 * Wraps a route handler: establishes the caller, checks the permission, and sends every error
 * through the one error handler. `"signed-in"` admits any active user.
 */
export function apiRoute<P = Record<string, string>>(
  access: Access,
  handler: (req: Request, ctx: { user: SignedInUser; params: P }) => Promise<Response>,
): (req: Request, ctx: RouteContext<P>) => Promise<Response> {
  return async (req, ctx) => {
    try {
      const session = await getCurrentSession();
      if (!session) throw new DomainError("unauthenticated", "Sign in first.");
      if (access !== "signed-in" && !can(session.user.role, access)) {
        throw new DomainError("forbidden", "Your role does not allow this.");
      }
      return await handler(req, { user: session.user, params: await ctx.params });
    } catch (error) {
      return toErrorResponse(error);
    }
  };
}
