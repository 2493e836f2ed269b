"use server";

import { redirect } from "next/navigation";
import { z } from "zod";
import { requireActionPermission } from "@/lib/auth/guards";
import { isDomainError } from "@/lib/errors";
import { toActionState, type ActionState } from "@/lib/forms/action-state";
import { createProcedure } from "@/lib/procedures/lifecycle";
import { procedureDraftSchema } from "@/lib/procedures/procedure-input";
import { procedureHeaderSchema } from "@/protocols";
import { buildStartingProcedure, startingCautions, startKeys } from "./start-procedure";

const newProcedureSchema = z.object({
  start: z.enum(startKeys, { error: "Choose a template or a blank procedure." }),
  code: procedureHeaderSchema.shape.code,
});

/** Creates version 1 of a new procedure from a template (or blank) under the chosen code, then opens its editor. */
export async function createProcedureAction(_prev: ActionState, form: FormData): Promise<ActionState> {
  let created: { procedureId: string; number: number };
  try {
    const actor = await requireActionPermission("procedure.author");
    const { start, code } = newProcedureSchema.parse(Object.fromEntries(form));
    const draft = procedureDraftSchema.parse({
      definition: buildStartingProcedure(start, code),
      instructions: null,
      cautions: startingCautions,
      acknowledgedCautions: [],
    });
    created = await createProcedure(actor, draft);
  } catch (error) {
    // A code already in use is a problem of the code field, so it is shown next to it.
    if (isDomainError(error) && error.code === "conflict") return { ok: false, message: error.message, fieldErrors: { code: [error.message] } };
    const state = toActionState(error);
    // The code is checked inside the header, so its problem comes back as definition.header.code.
    const codeErrors = state.fieldErrors?.["definition.header.code"];
    return codeErrors ? { ...state, fieldErrors: { ...state.fieldErrors, code: codeErrors } } : state;
  }
  redirect(`/procedures/${created.procedureId}/versions/${created.number}/edit`);
}
