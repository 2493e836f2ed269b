"use server";

import { redirect } from "next/navigation";
import { z } from "zod";
import { isDomainError } from "@/lib/errors";
import type { ActionState } from "@/lib/forms/action-state";
import { serverAction } from "@/lib/forms/server-action";
import { createProcedure } from "@/lib/procedures/lifecycle";
import { procedureDraftSchema } from "@/lib/procedures/procedure-input";
import { procedureHeaderSchema } from "@/protocols";
import { buildStartingProcedure, startingCautions, startKeys } from "./start-procedure";

const newProcedureSchema = z.object({
  start: z.enum(startKeys, { error: "Choose a template or a blank procedure." }),
  code: procedureHeaderSchema.shape.code,
});

function showCodeProblems(state: ActionState, error: unknown): ActionState {
  // A code already in use is a problem of the code field, so it is shown next to it.
  if (isDomainError(error) && error.code === "conflict") return { ok: false, message: error.message, fieldErrors: { code: [error.message] } };
  // The code is checked inside the header, so its problem comes back as definition.header.code.
  const codeErrors = state.fieldErrors?.["definition.header.code"];
  return codeErrors ? { ...state, fieldErrors: { ...state.fieldErrors, code: codeErrors } } : state;
}

/** Creates version 1 of a new procedure from a template (or blank) under the chosen code, then opens its editor. */
export const createProcedureAction = serverAction(
  { access: "/procedures/new", input: newProcedureSchema, refused: showCodeProblems },
  async ({ user: actor, input: { start, code } }) => {
    const draft = procedureDraftSchema.parse({
      definition: buildStartingProcedure(start, code),
      instructions: null,
      cautions: startingCautions,
      acknowledgedCautions: [],
    });
    const created = await createProcedure(actor, draft);
    redirect(`/procedures/${created.procedureId}/versions/${created.number}/edit`);
  },
);
