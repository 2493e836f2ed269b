// How a new procedure starts: a copy of a built-in template, or a blank procedure that is valid
// but made of placeholders, plus a first set of safety cautions. Pure: no database, no clock.
import type { RichTextDoc } from "@/lib/rich-text";
import { findProcedureTemplate, procedureTemplates, type Procedure } from "@/protocols";

export const BLANK_START = "blank";

/** The smallest procedure the schema accepts: one rest step, every value a placeholder to replace. */
export function createBlankProcedure(code: string): Procedure {
  return {
    header: {
      title: "New procedure",
      code,
      scope: "Say what this procedure measures, on which cells, and what it compares the result with.",
      standard: "to be named",
      clause: "to be named",
      ambient: { nominalC: 20, toleranceC: 5 },
      notes: ["Started blank: the title, standard, clause, ambient range and the rest step are placeholders to replace."],
    },
    steps: [{ kind: "rest", id: "rest", label: "Rest", minDuration: { value: 1, unit: "h" } }],
    acceptance: [],
    decisionRule: "simple acceptance",
  };
}

/** The procedure a new draft starts from, with the code the engineer chose; undefined for an unknown start. */
export function buildStartingProcedure(start: string, code: string): Procedure | undefined {
  if (start === BLANK_START) return createBlankProcedure(code);
  const template = findProcedureTemplate(start);
  if (!template) return undefined;
  return { ...template.procedure, header: { ...template.procedure.header, code } };
}

/**
 * A code for the new procedure: the template's code with the lab's prefix in place of "TPL-"
 * ("TPL-RC20" → "LAB-RC20"), made unique against the codes already in use.
 */
export function suggestProcedureCode({ start, existingCodes, prefix = "LAB" }: { start: string; existingCodes: readonly string[]; prefix?: string }): string {
  const templateCode = findProcedureTemplate(start)?.procedure.header.code;
  const base = templateCode ? templateCode.replace(/^TPL-/, `${prefix}-`) : `${prefix}-NEW`;
  const taken = new Set(existingCodes.map((code) => code.toUpperCase()));
  if (!taken.has(base.toUpperCase())) return base;
  let n = 2;
  while (taken.has(`${base}-${n}`.toUpperCase())) n += 1;
  return `${base}-${n}`;
}

export const startKeys = [BLANK_START, ...procedureTemplates.map((template) => template.key)] as const;

const createListItem = (text: string) => ({ type: "listItem", content: [{ type: "paragraph", content: [{ type: "text", text }] }] });

/** The safety cautions a new procedure starts with; the engineer adapts them to the lab. */
export const startingCautions: RichTextDoc = {
  type: "doc",
  content: [
    { type: "paragraph", content: [{ type: "text", text: "Lithium cells can vent, burn or explode. While this procedure runs:" }] },
    {
      type: "bulletList",
      content: [
        createListItem("Never exceed the cell's maximum charge or discharge current, nor its charge voltage."),
        createListItem("Do not charge a cell below 0 °C."),
        createListItem("Run the test in a fire-safe enclosure."),
        createListItem("Stop the test on an abnormal temperature rise, swelling, smoke or smell."),
        createListItem("The lab's own safety rules and the text of the standard prevail over this procedure."),
      ],
    },
  ],
};
