import "server-only";
import { headers } from "next/headers";
import { forbidden, redirect } from "next/navigation";
import { DomainError } from "@/lib/errors";
import { toErrorResponse } from "@/lib/api/error-response";
import { readUnstorableHeader, UNSTORABLE_HEADER } from "@/lib/security/unstorable-text";
import { getRequestPath } from "./request-info";
import {
  admits,
  areaAccess,
  routeAccess,
  type Access,
  type AccessOf,
  type ApiPattern,
  type MethodOf,
  type PagePattern,
} from "./route-access";
import { authenticateMachineToken, type MachineCaller } from "@/lib/machine-tokens/authenticate-machine-token";
import { getCurrentSession } from "./session";
import type { SignedInUser } from "./signed-in-user";

// The only ways into the server, each reading its access from ROUTE_ACCESS (lib/auth/route-access.ts):
// pages call requirePageAccess("/pattern"), layouts requireAreaAccess("/area"), route handlers are
// wrapped by apiRoute("/api/pattern", "GET", …), server actions by serverAction (lib/forms/server-action.ts).

/** Who a guard hands on: nobody may be signed in on a public route; a token route hands on the cycler PC. */
export type CallerOf<A> = A extends "public" ? SignedInUser | null : A extends "machine-token" ? MachineCaller : SignedInUser;

/** The dynamic segments of a route pattern as the handler's params: "/api/runs/[id]" → { id: string }. */
export type ParamsOf<R extends string> = R extends `${string}[${infer K}]${infer Rest}` ? { [P in K]: string } & ParamsOf<Rest> : unknown;

/** Signed in (and active), or sent to the sign-in page with a way back. */
export async function requirePageUser(): Promise<SignedInUser> {
  const session = await getCurrentSession();
  if (!session) {
    const path = await getRequestPath();
    redirect(path && path !== "/" ? `/sign-in?next=${encodeURIComponent(path)}` : "/sign-in");
  }
  return session.user;
}

async function requirePageAccessOf(access: Access | undefined, route: string): Promise<SignedInUser | null> {
  if (access === undefined) throw new Error(`No access is declared for ${route} in lib/auth/route-access.ts.`);
  if (access === "public") return (await getCurrentSession())?.user ?? null;
  const user = await requirePageUser();
  if (!admits(access, user.role)) forbidden();
  return user;
}

/** The first line of every page: the access ROUTE_ACCESS declares for the page's own route pattern. */
export async function requirePageAccess<R extends PagePattern>(route: R): Promise<CallerOf<AccessOf<R>>> {
  return (await requirePageAccessOf(routeAccess(route), route)) as CallerOf<AccessOf<R>>;
}

/**
 * The first line of an area's layout (outside its loading.tsx, so a refusal is a real 403): admits whoever
 * may open some page at or under the area; each page then checks its own access.
 */
export async function requireAreaAccess(area: string): Promise<SignedInUser> {
  return (await requirePageAccessOf(areaAccess(area), area)) as SignedInUser;
}

/**
 * The caller of a server action, refused in plain words when the access does not admit them, and
 * refused again when the proxy found text in the form that cannot be stored (proxy.ts).
 * Used by serverAction; call that, not this.
 */
export async function requireActionAccess(access: Access): Promise<SignedInUser | null> {
  const session = await getCurrentSession();
  if (access !== "public") {
    if (!session) throw new DomainError("unauthenticated", "Your session has ended. Sign in again.");
    if (!admits(access, session.user.role)) throw new DomainError("forbidden", "Your role does not allow this action.");
  }
  const unstorable = readUnstorableHeader((await headers()).get(UNSTORABLE_HEADER));
  if (unstorable) throw new DomainError("invalid", unstorable.message, { field: unstorable.field });
  return session?.user ?? null;
}

type RouteContext = { params: Promise<Record<string, string | string[]>> };

/**
 * Wraps a route handler: reads the access ROUTE_ACCESS declares for this route and method, establishes
 * the caller (none on a public route; the token's cycler PC on a token route, whose cookies are never
 * read), refuses with 401/403, and sends every error through the one error handler. The handler never
 * checks roles itself.
 */
export function apiRoute<R extends ApiPattern, M extends MethodOf<R>>(
  route: R,
  method: M,
  handler: (req: Request, ctx: { user: CallerOf<AccessOf<R, M>>; params: ParamsOf<R> }) => Promise<Response>,
): (req: Request, ctx: RouteContext) => Promise<Response> {
  const access = routeAccess(route, method);
  if (access === undefined) throw new Error(`No access is declared for ${method} ${route} in lib/auth/route-access.ts.`);
  return async (req, ctx) => {
    try {
      let user: SignedInUser | MachineCaller | null = null;
      if (access === "machine-token") {
        user = await authenticateMachineToken(req);
      } else if (access !== "public") {
        const session = await getCurrentSession();
        if (!session) throw new DomainError("unauthenticated", "Sign in first.");
        if (!admits(access, session.user.role)) throw new DomainError("forbidden", "Your role does not allow this.");
        user = session.user;
      }
      const params = (ctx?.params ? await ctx.params : {}) as ParamsOf<R>;
      return await handler(req, { user: user as CallerOf<AccessOf<R, M>>, params });
    } catch (error) {
      return toErrorResponse(error);
    }
  };
}
