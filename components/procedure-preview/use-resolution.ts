import { keepPreviousData, useQuery } from "@tanstack/react-query";
import { useMemo } from "react";
import { validateProcedure, type FieldProblem, type ProcedureResolution, type ResolveProcedureResult } from "@/protocols";
import { ApiRequestError, postJson } from "./post-json";
import { useDebouncedValue } from "./use-debounced-value";

/** What the preview resolves: the editor's unsaved values, or a stored version. */
export type PreviewSource =
  | { kind: "draft"; definition: unknown; acknowledgedCautions: readonly string[] }
  | { kind: "version"; procedureId: string; number: number };

export interface PreviewAnswer {
  specification: { id: string; maker: string; model: string; designation: string };
  result: ResolveProcedureResult;
}

export type ResolutionView =
  | { state: "no-spec" }
  | { state: "loading" }
  | { state: "failed"; message: string }
  /** The step list itself has problems (paths relative to the procedure), so nothing resolves. */
  | { state: "invalid"; procedureProblems: FieldProblem[]; cellProblems: FieldProblem[] }
  | { state: "resolved"; specification: PreviewAnswer["specification"]; resolution: ProcedureResolution; updating: boolean };

const stripDefinition = (problems: FieldProblem[]) =>
  problems.map((p) => ({ ...p, path: p.path.replace(/^definition\.?/, "") }));

async function fetchAnswer(source: PreviewSource, specId: string, draftJson: string, signal: AbortSignal) {
  if (source.kind === "version") {
    return postJson<PreviewAnswer>(`/api/procedures/${source.procedureId}/versions/${source.number}/resolve`, { specId }, signal);
  }
  return postJson<PreviewAnswer>("/api/procedures/preview", { specId, ...JSON.parse(draftJson) }, signal);
}

/**
 * Resolves the source against one cell specification. A draft is first checked in the browser with
 * the same schema, so an unfinished step list shows its problems without a request; the request
 * waits until typing pauses.
 */
export function useResolution(source: PreviewSource, specId: string | null): ResolutionView {
  const draftJson = source.kind === "draft" ? JSON.stringify({ definition: source.definition, acknowledgedCautions: source.acknowledgedCautions }) : "";
  const settledJson = useDebouncedValue(draftJson, 400);
  const localProblems = useMemo(() => {
    if (source.kind !== "draft" || settledJson === "") return [];
    const check = validateProcedure((JSON.parse(settledJson) as { definition: unknown }).definition);
    return check.ok ? [] : check.problems;
  }, [source.kind, settledJson]);

  const versionKey = source.kind === "version" ? `${source.procedureId}/${source.number}` : "draft";
  const query = useQuery({
    queryKey: ["procedure-resolution", versionKey, specId, settledJson],
    queryFn: ({ signal }) => fetchAnswer(source, specId ?? "", settledJson, signal),
    enabled: specId !== null && localProblems.length === 0,
    placeholderData: keepPreviousData,
    retry: false,
  });

  if (specId === null) return { state: "no-spec" };
  if (localProblems.length > 0) return { state: "invalid", procedureProblems: localProblems, cellProblems: [] };
  if (query.error) {
    const error = query.error;
    if (error instanceof ApiRequestError && error.fields.length > 0) {
      return { state: "invalid", procedureProblems: stripDefinition(error.fields), cellProblems: [] };
    }
    return { state: "failed", message: error.message };
  }
  if (!query.data) return { state: "loading" };
  const { result, specification } = query.data;
  if (!result.ok) {
    return { state: "invalid", procedureProblems: result.procedureProblems, cellProblems: result.cellSpecificationProblems };
  }
  const updating = query.isFetching || settledJson !== draftJson || query.data.specification.id !== specId;
  return { state: "resolved", specification, resolution: result.resolution, updating };
}
