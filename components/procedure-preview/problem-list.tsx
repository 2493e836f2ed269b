import { describeFieldPath } from "@/components/procedure-editor/field-paths";
import type { FieldProblem } from "@/protocols";

/** Problems of the step list or of the cell specification, each with its field in words. */
export function ProblemList({
  title,
  problems,
  pathPrefix,
  announce = true,
}: {
  title: string;
  /** Announce as an alert; off while the list follows typing in the editor. */
  announce?: boolean;
  problems: readonly FieldProblem[];
  /** Prefix that turns a path into a form path, for the words ("definition" for a procedure). */
  pathPrefix?: string;
}) {
  if (problems.length === 0) return null;
  return (
    <div className="rounded border-l-4 border-deviates bg-white px-4 py-3 text-sm" role={announce ? "alert" : undefined}>
      <p className="font-semibold">
        <span aria-hidden="true">✕ </span>
        {title}
      </p>
      <ul className="mt-1 flex flex-col gap-1">
        {problems.map((problem) => (
          <li key={`${problem.path}:${problem.message}`}>
            <span className="font-medium">{pathPrefix ? describeFieldPath(problem.path ? `${pathPrefix}.${problem.path}` : pathPrefix) : describeFieldPath(problem.path || "form")}</span>
            {": "}
            {problem.message}
          </li>
        ))}
      </ul>
    </div>
  );
}
