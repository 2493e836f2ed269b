import "server-only";
import { unstable_rethrow } from "next/navigation";
import type { z } from "zod";
import { runWithAuditContext, type AuditContext } from "@/db/audit-context";
import { requireActionAccess, type CallerOf } from "@/lib/auth/guards";
import type { Permission } from "@/lib/auth/permissions";
import { readRequestOrigin } from "@/lib/auth/request-info";
import { routeAccess, type Access, type AccessOf, type PagePattern } from "@/lib/auth/route-access";
import { toActionState, type ActionState } from "./action-state";
import { plainZodErrors } from "./plain-zod-message";

/**
 * Who may run an action: the page route whose access it shares ("/runs/[id]") or a permission from
 * lib/auth/permissions.ts. Either way the access is read from where it is written once.
 */
export type ActionAccess = PagePattern | Permission;
type AccessOfAction<A extends ActionAccess> = A extends PagePattern ? AccessOf<A> : A;

export interface ActionSpec<A extends ActionAccess, S extends z.ZodType | undefined> {
  access: A;
  /** The schema the form (or the argument) is checked against; zod's default messages come out plain. */
  input?: S;
  /** How the form becomes the schema's input; by default every field by its name (Object.fromEntries). */
  read?: (form: FormData) => unknown;
  /** Adjusts the form state of a failure, e.g. to say that nothing was signed. */
  refused?: (state: ActionState, error: unknown) => ActionState;
}

export interface ActionContext<A extends ActionAccess, S extends z.ZodType | undefined> {
  /** The caller; null only on a public action (sign-in). */
  user: CallerOf<AccessOfAction<A>>;
  input: S extends z.ZodType ? z.output<S> : undefined;
  form: FormData;
  /** The caller's address and browser, read once; recordAuditEvent fills the address in by itself. */
  origin: AuditContext;
}

type Body<A extends ActionAccess, S extends z.ZodType | undefined, R> = (ctx: ActionContext<A, S>) => Promise<R>;

function accessOf(access: ActionAccess): Access {
  if (!access.startsWith("/")) return access as Permission;
  const declared = routeAccess(access);
  if (declared === undefined) throw new Error(`No access is declared for ${access} in lib/auth/route-access.ts.`);
  return declared;
}

/** The one path every server action takes: access, unstorable text, parse, audit context, errors → form state. */
async function run<A extends ActionAccess, S extends z.ZodType | undefined, R>(
  spec: ActionSpec<A, S>,
  raw: unknown,
  form: FormData,
  body: Body<A, S, R>,
): Promise<R> {
  const origin = await readRequestOrigin();
  return runWithAuditContext(origin, async () => {
    const user = (await requireActionAccess(accessOf(spec.access))) as CallerOf<AccessOfAction<A>>;
    const input = (spec.input ? spec.input.parse(raw, plainZodErrors) : undefined) as ActionContext<A, S>["input"];
    return body({ user, input, form, origin });
  });
}

function fail(error: unknown): ActionState {
  // redirect(), notFound() and forbidden() travel as errors: they are answers, not failures.
  unstable_rethrow(error);
  return toActionState(error);
}

/**
 * A server action for a form used with useActionState: `(previous state, form data) → state`.
 * A refusal, a DomainError, a refused constraint or a zod issue comes back as plain words in the
 * form state; anything else is logged and answered generically. The body may call redirect().
 *
 * export const saveThingAction = serverAction({ access: "/things/new", input: thingSchema }, async ({ user, input }) => { … });
 */
export function serverAction<A extends ActionAccess, S extends z.ZodType | undefined = undefined>(
  spec: ActionSpec<A, S>,
  body: Body<A, S, ActionState>,
): (previous: ActionState, form: FormData) => Promise<ActionState> {
  return async (_previous, form) => {
    try {
      return await run(spec, spec.read ? spec.read(form) : Object.fromEntries(form), form, body);
    } catch (error) {
      const state = fail(error);
      return spec.refused ? spec.refused(state, error) : state;
    }
  };
}

/** A server action called with one argument (an object the client builds, not a form): `(argument) → state`. */
serverAction.withArgument = function withArgument<A extends ActionAccess, S extends z.ZodType>(
  spec: ActionSpec<A, S> & { input: S },
  body: Body<A, S, ActionState>,
): (argument: z.input<S>) => Promise<ActionState> {
  return async (argument) => {
    try {
      return await run(spec, argument, new FormData(), body);
    } catch (error) {
      const state = fail(error);
      return spec.refused ? spec.refused(state, error) : state;
    }
  };
};

/**
 * A plain `<form action={…}>` with no state to show (sign out): `(form data) → nothing`. A failure is
 * logged; the body is expected to end in redirect().
 */
serverAction.plain = function plain<A extends ActionAccess>(
  spec: ActionSpec<A, undefined>,
  body: Body<A, undefined, void>,
): (form: FormData) => Promise<void> {
  return async (form) => {
    try {
      await run(spec, undefined, form, body);
    } catch (error) {
      const state = fail(error);
      console.error("a form action failed:", state.message);
    }
  };
};

/**
 * A read-only action called with one argument that answers data rather than a form state (the findings
 * of one step, opened on the results page): `(argument) → data | { message }`. Failures come back as
 * plain words, as for the other kinds.
 */
serverAction.read = function read<A extends ActionAccess, S extends z.ZodType, R>(
  spec: ActionSpec<A, S> & { input: S },
  body: Body<A, S, R>,
): (argument: z.input<S>) => Promise<R | { message: string }> {
  return async (argument) => {
    try {
      return await run(spec, argument, new FormData(), body);
    } catch (error) {
      return { message: fail(error).message ?? "The server could not answer. Try again." };
    }
  };
};
