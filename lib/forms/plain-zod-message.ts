import type { z } from "zod";

/** An issue as zod hands it to an error map (raw, with its input) or in a ZodError (without). */
type Issue = z.core.$ZodRawIssue | z.core.$ZodIssue;

// zod's own English messages ("Invalid input: expected string, received null") name types and
// schemas; a lab technician reads these instead. A message the schema wrote itself is kept.
const ZOD_DEFAULT = /^(Invalid|Too (small|big)|Unrecognized key|Expected|Required)\b/;

/** Whether a message is one of zod's defaults rather than one a schema wrote. */
export function isZodDefaultMessage(message: string): boolean {
  return ZOD_DEFAULT.test(message);
}

const count = (n: number | bigint, one: string, many: string) => `${n} ${Number(n) === 1 ? one : many}`;

/** A plain sentence for a zod issue, by what went wrong and never by field path or type name. */
export function plainZodMessage(issue: Issue): string {
  switch (issue.code) {
    case "invalid_type": {
      const input = "input" in issue ? issue.input : undefined;
      const missing = input === undefined || input === null || input === "";
      if (issue.expected === "number" || issue.expected === "int" || issue.expected === "bigint") return missing ? "Enter a number." : "Enter a number here.";
      if (issue.expected === "date") return "Enter a date.";
      return "Fill this in.";
    }
    case "too_small": {
      const min = issue.minimum;
      if (issue.origin === "string") return Number(min) <= 1 ? "Fill this in." : `Use at least ${count(min, "character", "characters")}.`;
      if (issue.origin === "array" || issue.origin === "set") return Number(min) <= 1 ? "Choose at least one." : `Choose at least ${min}.`;
      if (issue.origin === "date") return "This date is too early.";
      return issue.inclusive === false ? `Enter more than ${min}.` : `Enter ${min} or more.`;
    }
    case "too_big": {
      const max = issue.maximum;
      if (issue.origin === "string") return `Use at most ${count(max, "character", "characters")}.`;
      if (issue.origin === "array" || issue.origin === "set") return `Choose at most ${max}.`;
      if (issue.origin === "date") return "This date is too late.";
      return issue.inclusive === false ? `Enter less than ${max}.` : `Enter ${max} or less.`;
    }
    case "invalid_format":
      if (issue.format === "email") return "Enter an e-mail address.";
      if (issue.format === "uuid" || issue.format === "guid") return "This record is not known here; reload the page and try again.";
      if (issue.format === "date" || issue.format === "datetime") return "Enter a date.";
      return "This is not written the way it should be.";
    case "invalid_value":
      return "Choose one of the options offered.";
    case "not_multiple_of":
      return `Enter a multiple of ${issue.divisor}.`;
    case "unrecognized_keys":
      return "The form sent something it should not; reload the page and try again.";
    default:
      return "Check this value.";
  }
}

/** For parsing: zod's default messages become plain sentences; a schema's own messages win over this. */
export const plainZodErrors = { error: (issue: z.core.$ZodRawIssue) => plainZodMessage(issue) };
