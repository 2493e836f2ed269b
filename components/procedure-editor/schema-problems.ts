import type { z } from "zod";
import type { PathMessage } from "./field-paths";

/**
 * The problems of a zod result, one per field, by dot path. When none of a union's forms fits,
 * zod reports the union as a whole; if exactly one form has every key the value has (no
 * "unrecognized key" among its problems), that form is the one meant, so its own problems are
 * reported at their own fields ("required" at `…current.multipleOfIt`, not a sentence about every
 * form a current may take).
 */
export function listSchemaProblems(issues: readonly z.core.$ZodIssue[], base: readonly PropertyKey[] = []): PathMessage[] {
  return issues.flatMap((issue) => {
    const path = [...base, ...issue.path];
    if (issue.code === "invalid_union") {
      const fitting = issue.errors.filter((branch) => !branch.some((inner) => inner.code === "unrecognized_keys"));
      const [only] = fitting;
      if (fitting.length === 1 && only) return listSchemaProblems(only, path);
    }
    return [{ path: path.map(String).join("."), message: issue.message }];
  });
}

/** One entry per path, several messages joined, as react-hook-form keeps errors. */
export function groupProblemsByPath(problems: readonly PathMessage[]): Record<string, { type: string; message: string }> {
  const grouped: Record<string, { type: string; message: string }> = {};
  for (const { path, message } of problems) {
    const existing = grouped[path];
    if (existing === undefined) grouped[path] = { type: "schema", message };
    else if (!existing.message.split(" · ").includes(message)) existing.message = `${existing.message} · ${message}`;
  }
  return grouped;
}
