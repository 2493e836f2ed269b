import { describe, expect, it } from "vitest";
import {
  BLANK_START,
  buildStartingProcedure,
  createBlankProcedure,
  startingCautions,
  startKeys,
  suggestProcedureCode,
} from "@/app/(lab)/procedures/new/start-procedure";
import { procedureDraftSchema } from "@/lib/procedures/procedure-input";
import { richTextDocSchema, richTextToPlain } from "@/lib/rich-text";
import { procedureTemplates } from "@/protocols";

describe("buildStartingProcedure", () => {
  it.each([...startKeys])("starts %s as a draft the server accepts, under the chosen code", (key) => {
    const definition = buildStartingProcedure(key, "LAB-X1");
    const parsed = procedureDraftSchema.safeParse({ definition, cautions: startingCautions });
    expect(parsed.success).toBe(true);
    expect(parsed.data?.definition.header.code).toBe("LAB-X1");
  });

  it("copies a template without changing the template itself", () => {
    const template = procedureTemplates[0]!;
    const started = buildStartingProcedure(template.key, "LAB-RC20");
    expect(started?.steps).toEqual(template.procedure.steps);
    expect(template.procedure.header.code).toBe("TPL-RC20");
  });

  it("knows no start it was not given", () => {
    expect(buildStartingProcedure("no-such-template", "LAB-1")).toBeUndefined();
  });

  it("starts blank with one rest step and says its values are placeholders", () => {
    const blank = createBlankProcedure("LAB-NEW");
    expect(blank.steps.map((s) => s.kind)).toEqual(["rest"]);
    expect(blank.acceptance).toEqual([]);
    expect(blank.header.notes?.[0]).toMatch(/placeholders/);
  });
});

describe("suggestProcedureCode", () => {
  it("puts the lab's prefix in place of the template's", () => {
    expect(suggestProcedureCode({ start: "rated-capacity-20c", existingCodes: [] })).toBe("LAB-RC20");
    expect(suggestProcedureCode({ start: "rated-capacity-20c", existingCodes: [], prefix: "BW" })).toBe("BW-RC20");
    expect(suggestProcedureCode({ start: BLANK_START, existingCodes: [] })).toBe("LAB-NEW");
  });

  it("does not suggest a code already in use (whatever its case)", () => {
    expect(suggestProcedureCode({ start: "rated-capacity-20c", existingCodes: ["TPL-RC20", "lab-rc20"] })).toBe("LAB-RC20-2");
    expect(suggestProcedureCode({ start: "rated-capacity-20c", existingCodes: ["LAB-RC20", "LAB-RC20-2"] })).toBe("LAB-RC20-3");
  });
});

describe("startingCautions", () => {
  it("is a rich-text document, never HTML, that names the limits and says the lab's rules prevail", () => {
    expect(richTextDocSchema.safeParse(startingCautions).success).toBe(true);
    const text = richTextToPlain(startingCautions);
    expect(text).toContain("below 0 °C");
    expect(text).toContain("prevail");
    expect(text).not.toMatch(/<[a-z]/i);
  });
});
