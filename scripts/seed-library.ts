import { getDb } from "../db";
import { getProcedureIdByCode } from "../db/procedures";
import type { SignedInUser } from "../lib/auth/signed-in-user";
import { createProcedure, releaseVersion, submitForReview } from "../lib/procedures/lifecycle";
import { procedureDraftSchema } from "../lib/procedures/procedure-input";
import { plainToRichText } from "../lib/rich-text";
import { attachDatasheet, createCellSpecification, cellSpecificationInputSchema } from "../lib/specs/cell-specifications";
import { procedureTemplates } from "../protocols";
import { renderDemoDatasheet } from "./demo-datasheet";
import { DEMO_CELL_SPECIFICATIONS } from "./demo-scenario";

const STANDARD_CAUTIONS = plainToRichText(
  [
    "Lithium cells can vent, burn or explode. Test inside the fire-safe enclosure with the extraction on.",
    "Never exceed the cell's maximum charge current, maximum continuous discharge current or charge voltage from its specification.",
    "Do not charge below 0 °C. Stop the step and call the engineer on an abnormal temperature rise, swelling, smell or leakage.",
    "This procedure does not replace the lab's safety rules, local codes or the text of the standard.",
  ].join("\n\n"),
);

async function asUser(email: string): Promise<SignedInUser> {
  const r = await getDb().selectFrom("app_user").select(["id", "email", "display_name", "role"]).where("email", "=", email).executeTakeFirstOrThrow();
  return { id: r.id, email: r.email, displayName: r.display_name, role: r.role };
}

/** Cell specifications and the built-in templates, released by a second engineer. Idempotent. */
export async function seedLibrary(): Promise<string[]> {
  const done: string[] = [];
  const author = await asUser("engineer@brackwater.example");
  const releaser = await asUser("engineer2@brackwater.example");

  for (const spec of DEMO_CELL_SPECIFICATIONS) {
    const exists = await getDb().selectFrom("cell_specification").select("id").where("maker", "=", spec.maker).where("model", "=", spec.model).executeTakeFirst();
    if (exists) continue;
    const id = await createCellSpecification(author, cellSpecificationInputSchema.parse(spec));
    const fileName = `${spec.model.toLowerCase()}-datasheet.pdf`;
    await attachDatasheet(author, id, { name: fileName, bytes: renderDemoDatasheet(spec.maker, spec.model, spec.data) });
    done.push(`${spec.maker} ${spec.model}`);
  }

  for (const template of procedureTemplates) {
    if (await getProcedureIdByCode(getDb(), template.procedure.header.code)) continue;
    const input = procedureDraftSchema.parse({
      definition: template.procedure,
      instructions: plainToRichText(template.procedure.header.scope),
      cautions: STANDARD_CAUTIONS,
    });
    const { versionId } = await createProcedure(author, input);
    await submitForReview(author, versionId);
    await releaseVersion(releaser, versionId);
    done.push(template.procedure.header.code);
  }
  return done;
}
