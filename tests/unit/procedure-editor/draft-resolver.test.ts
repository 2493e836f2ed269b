import { describe, expect, it } from "vitest";
import type { ResolverOptions } from "react-hook-form";
import { draftResolver } from "@/components/procedure-editor/draft-resolver";
import type { DraftFormValues } from "@/components/procedure-editor/draft-values";
import { flattenFieldErrors } from "@/components/procedure-editor/field-paths";
import { ratedCapacityAt20cTemplate } from "@/protocols";

const options: ResolverOptions<DraftFormValues> = { fields: {}, names: [], shouldUseNativeValidation: false };

describe("draftResolver", () => {
  it("hands over the parsed draft when it is valid", async () => {
    const definition = structuredClone(ratedCapacityAt20cTemplate);
    definition.header.title = "  Rated capacity  ";
    const result = await draftResolver({ definition } as DraftFormValues, undefined, options);
    expect(result.errors).toEqual({});
    expect(result.values).toMatchObject({ definition: { header: { title: "Rated capacity" } }, instructions: null, acknowledgedCautions: [] });
  });

  it("nests each problem at its field, the same paths the server reports", async () => {
    const definition = structuredClone(ratedCapacityAt20cTemplate) as unknown as { steps: Record<string, unknown>[]; header: Record<string, unknown> };
    definition.steps[3] = { ...definition.steps[3], current: { multipleOfIt: -0.2 } };
    definition.header.title = " ";
    const result = await draftResolver({ definition } as unknown as DraftFormValues, undefined, options);
    expect(result.values).toEqual({});
    expect(flattenFieldErrors(result.errors)).toEqual([
      { path: "definition.header.title", message: "the title is required" },
      { path: "definition.steps.3.current.multipleOfIt", message: "a multiple of It must be greater than 0" },
    ]);
  });
});
