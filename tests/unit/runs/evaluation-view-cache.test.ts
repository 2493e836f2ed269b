import { describe, expect, it } from "vitest";
import { evaluateRun } from "@/lib/conformance";
import { createEvaluationViewCache, type StoredEvaluation } from "@/lib/runs/evaluation-view-cache";
import { buildRatedCapacityRun } from "@/scenarios/rated-capacity-run";

const result = evaluateRun(buildRatedCapacityRun({ sampleIntervalS: 10 }).input);
if (!result.ok) throw new Error("the built run should evaluate");
const evaluation = result.evaluation;

function fakeStore(ids: string[]) {
  const reads: string[] = [];
  const load = async (id: string): Promise<StoredEvaluation | null> => {
    reads.push(id);
    await new Promise((r) => setTimeout(r, 5));
    return ids.includes(id) ? { id, runId: `run-of-${id}`, evaluation } : null;
  };
  return { reads, load };
}

describe("evaluation views cached by evaluation id", () => {
  it("reads a stored evaluation once, however often and however concurrently the page asks", async () => {
    const store = fakeStore(["e1"]);
    const cache = createEvaluationViewCache(store.load);
    const views = await Promise.all(Array.from({ length: 20 }, () => cache.read("e1")));
    await cache.read("e1");
    expect(store.reads).toEqual(["e1"]);
    expect(new Set(views).size).toBe(1);
    expect(views[0]).toMatchObject({ evaluationId: "e1", runId: "run-of-e1" });
    expect(views[0]?.groups.flatMap((g) => g.findings).length).toBe(evaluation.runFindings.length + evaluation.steps.reduce((n, s) => n + s.findings.length, 0));
    expect(views[0]?.resultRows).toHaveLength(evaluation.steps.length);
  });

  it("answers null for an id that is not stored, and asks again next time (it may be stored by then)", async () => {
    const store = fakeStore([]);
    const cache = createEvaluationViewCache(store.load);
    expect(await cache.read("missing")).toBeNull();
    expect(await cache.read("missing")).toBeNull();
    expect(store.reads).toEqual(["missing", "missing"]);
  });

  it("keeps at most max views, dropping the least recently used", async () => {
    const store = fakeStore(["a", "b", "c"]);
    const cache = createEvaluationViewCache(store.load, 2);
    await cache.read("a");
    await cache.read("b");
    await cache.read("a");
    await cache.read("c"); // drops b, read longest ago
    expect(cache.size).toBe(2);
    await cache.read("a");
    await cache.read("b");
    expect(store.reads).toEqual(["a", "b", "c", "b"]);
  });

  it("states the decision rule the evaluation recorded, or simple acceptance for older stored ones", async () => {
    const older = { ...evaluation, decisionRule: undefined, acceptance: [] };
    const cache = createEvaluationViewCache(async (id) => ({ id, runId: "r", evaluation: id === "old" ? older : evaluation }));
    expect((await cache.read("old"))?.decisionRule).toBe("simple acceptance");
    expect((await cache.read("new"))?.decisionRule).toBe(evaluation.decisionRule ?? evaluation.acceptance[0]?.rule ?? "simple acceptance");
  });
});
