import { describe, expect, it } from "vitest";
import { getDb } from "@/db";
import { listAuditEvents } from "@/db/audit";
import { authenticateMachineToken } from "@/lib/machine-tokens/authenticate-machine-token";
import { pushLogPart, type AppendPart } from "@/lib/machine-tokens/push-log-part";
import { issueMachineToken, listTokens, revokeMachineToken } from "@/lib/machine-tokens/token-admin";
import { rateWindowStart, TOKEN_REQUESTS_PER_MINUTE } from "@/lib/machine-tokens/token-policy";
import { hashTokenSecret } from "@/lib/machine-tokens/token-secret";
import { startRun } from "@/lib/runs/start-run";
import { createCellSpecification } from "@/lib/specs/cell-specifications";
import { inventedCell } from "@/scenarios/rated-capacity-run";
import { chunksOf, makeUser, releaseRatedCapacityProcedure } from "./fixtures";
import { withOwnerClient } from "../support/test-database";

const TODAY = "2026-12-01";

async function addChannel(identifier: string, createdBy: string, kind: "cycler-channel" | "thermometer" = "cycler-channel") {
  const row = await getDb()
    .insertInto("instrument")
    .values({ kind, identifier, serial: `S-${identifier}`, accuracy: "{}", calibration_certificate: "CAL-1", calibrated_on: "2026-01-10", due_on: "2027-01-10", created_by: createdBy })
    .returning("id")
    .executeTakeFirstOrThrow();
  return row.id;
}

async function setUp(tag: string) {
  const admin = await makeUser("admin", "Ada Admin");
  const engineer = await makeUser("engineer", "Eli Engineer");
  const second = await makeUser("engineer", "Sol Second");
  const operator = await makeUser("operator", "Oda Operator");
  const specId = await createCellSpecification(engineer, { maker: "Testmoor Cells", model: `TM-${tag}`, data: inventedCell });
  const { versionId } = await releaseRatedCapacityProcedure(engineer, second, `T-TOK-${tag}`);
  const channel = await addChannel(`CH-${tag}-1`, admin.id);
  const otherChannel = await addChannel(`CH-${tag}-2`, admin.id);
  const specimen = (
    await getDb()
      .insertInto("specimen")
      .values({ identifier: `SP-${tag}`, cell_specification_id: specId, received_on: "2026-11-20", condition_on_receipt: "intact, 3.4 V", created_by: engineer.id })
      .returning("id")
      .executeTakeFirstOrThrow()
  ).id;
  const run = await startRun(operator, { procedureVersionId: versionId, specimenId: specimen, instrumentIds: [channel] }, TODAY);
  const number = (await getDb().selectFrom("run").select("number").where("id", "=", run.id).executeTakeFirstOrThrow()).number;
  return { admin, operator, channel, otherChannel, runId: run.id, runNumber: number };
}

function tokenRequest(token: string | null, headers: Record<string, string> = {}) {
  return new Request("http://127.0.0.1/api/channel/log-parts?run=R-00001&name=a.csv", {
    method: "POST",
    headers: { ...(token ? { authorization: `Bearer ${token}` } : {}), "x-forwarded-for": "10.9.8.7", ...headers },
  });
}

/** Stands for the log-parts service: records what it was asked to append and answers as it would. */
function recordingAppend() {
  const calls: { sender: unknown; runId: string; name: string; bytes: number }[] = [];
  const append: AppendPart = async (sender, runId, part) => {
    let bytes = 0;
    for await (const c of part.chunks) bytes += c.byteLength;
    calls.push({ sender, runId, name: part.name, bytes });
    return { outcome: "queued", partId: "00000000-0000-4000-8000-000000000001", jobId: "00000000-0000-4000-8000-000000000002" };
  };
  return { calls, append };
}

const part = (name: string, text: string) => ({ name, chunks: chunksOf(text), sizeBytes: Buffer.byteLength(text) });

describe("cycler tokens", () => {
  it("issue → use → revoke → refused, each step audited, and only the hash is stored", async () => {
    const s = await setUp("A");
    const issued = await issueMachineToken(s.admin, { instrumentId: s.channel, label: "Cycler PC bay 1", days: 30 });
    expect(issued.token).toMatch(/^cwt_/);
    const row = await getDb().selectFrom("machine_token").selectAll().where("id", "=", issued.id).executeTakeFirstOrThrow();
    expect(row.secret_sha256).toBe(hashTokenSecret(issued.token));
    expect(JSON.stringify(row)).not.toContain(issued.token.slice(10));
    expect(row.expires_at.getTime() - row.issued_at.getTime()).toBe(30 * 86_400_000);

    const caller = await authenticateMachineToken(tokenRequest(issued.token));
    expect(caller).toMatchObject({ tokenId: issued.id, channel: "CH-A-1", address: "10.9.8.7" });
    const { calls, append } = recordingAppend();
    const outcome = await pushLogPart(caller, s.runNumber, part("part-001.csv", "Time (s),Voltage (V)\n0,3.6\n"), append);
    expect(outcome).toMatchObject({ outcome: "queued", run: s.runNumber });
    expect(calls).toEqual([{ sender: { kind: "machine", tokenId: issued.id, label: 'cycler token "Cycler PC bay 1" (CH-A-1)' }, runId: s.runId, name: "part-001.csv", bytes: 27 }]);
    expect((await listTokens())[0]).toMatchObject({ id: issued.id, state: "in-use" });
    expect((await listTokens())[0]!.lastUsedAt).not.toBeNull();

    await revokeMachineToken(s.admin, { tokenId: issued.id, reason: "PC replaced" });
    await expect(authenticateMachineToken(tokenRequest(issued.token))).rejects.toMatchObject({ status: 401, message: expect.stringContaining("revoked on") });
    await expect(revokeMachineToken(s.admin, { tokenId: issued.id, reason: "again" })).rejects.toMatchObject({ code: "conflict" });
    expect((await listTokens())[0]).toMatchObject({ state: "revoked", revokeReason: "PC replaced", revokedBy: "Ada Admin" });

    const actions = (await listAuditEvents(getDb(), { entityId: s.channel })).map((e) => [e.action, (e.detail as { reason?: string } | null)?.reason ?? null]);
    expect(actions).toEqual([
      ["machine-token.refused", "revoked"],
      ["machine-token.revoke", "PC replaced"],
      ["machine-token.issue", null],
    ]);
    const refusal = (await listAuditEvents(getDb(), { action: "machine-token.refused" }))[0]!;
    expect(refusal).toMatchObject({ actorLabel: 'cycler token "Cycler PC bay 1" (CH-A-1)', address: "10.9.8.7", entityLabel: "CH-A-1" });
  });

  it("refuses an expired token, audited", async () => {
    const s = await setUp("B");
    const issued = await issueMachineToken(s.admin, { instrumentId: s.channel, label: "Old PC", days: 1 }, new Date(Date.now() - 2 * 86_400_000));
    await expect(authenticateMachineToken(tokenRequest(issued.token))).rejects.toMatchObject({ status: 401, message: expect.stringContaining("expired on") });
    expect((await listTokens()).find((t) => t.id === issued.id)?.state).toBe("expired");
    const audit = await listAuditEvents(getDb(), { action: "machine-token.refused", entityId: s.channel });
    expect(audit.map((e) => (e.detail as { reason: string }).reason)).toEqual(["expired"]);
  });

  it("refuses a token for another channel, a closed run and an empty part, audited, and never calls append", async () => {
    const s = await setUp("C");
    const other = await issueMachineToken(s.admin, { instrumentId: s.otherChannel, label: "Bay 2", days: 10 });
    const mine = await issueMachineToken(s.admin, { instrumentId: s.channel, label: "Bay 1", days: 10 });
    const { calls, append } = recordingAppend();

    const otherCaller = await authenticateMachineToken(tokenRequest(other.token));
    await expect(pushLogPart(otherCaller, s.runNumber, part("p.csv", "x\n1\n"), append)).rejects.toMatchObject({
      status: 403,
      message: `This token is for CH-C-2, which run ${s.runNumber} does not use. Use the token of the run's cycler channel.`,
    });
    const caller = await authenticateMachineToken(tokenRequest(mine.token));
    await expect(pushLogPart(caller, s.runNumber, part("empty.csv", ""), append)).rejects.toMatchObject({ status: 422, message: 'The part "empty.csv" is empty (0 bytes). Nothing was stored.' });
    await expect(pushLogPart(caller, "R-99999", part("p.csv", "x\n1\n"), append)).rejects.toMatchObject({ status: 404 });

    await withOwnerClient((c) => c.query("update run set status = 'abandoned', abandoned_at = now(), abandoned_by = $2, abandon_reason = 'test' where id = $1", [s.runId, s.operator.id]));
    await expect(pushLogPart(caller, s.runNumber, part("p.csv", "x\n1\n"), append)).rejects.toMatchObject({ status: 409, message: expect.stringContaining("is abandoned; its log can no longer change") });

    expect(calls).toEqual([]);
    const refused = await listAuditEvents(getDb(), { action: "machine-token.part-refused" });
    expect(refused.map((e) => [e.actorLabel, (e.detail as { file: string }).file])).toEqual([
      ['cycler token "Bay 1" (CH-C-1)', "p.csv"],
      ['cycler token "Bay 1" (CH-C-1)', "p.csv"],
      ['cycler token "Bay 1" (CH-C-1)', "empty.csv"],
      ['cycler token "Bay 2" (CH-C-2)', "p.csv"],
    ]);
    expect(refused[0]!.entityId).toBe(s.runId);
  });

  it("refuses an unknown or missing token in plain words; a flood adds a count, not audit rows", async () => {
    const s = await setUp("D");
    await issueMachineToken(s.admin, { instrumentId: s.channel, label: "Bay 1", days: 10 });
    const guessed = "cwt_" + "A".repeat(43);
    await expect(authenticateMachineToken(tokenRequest(guessed))).rejects.toMatchObject({ status: 401, message: expect.stringContaining("not known here") });
    await expect(authenticateMachineToken(tokenRequest(null))).rejects.toMatchObject({ status: 401, message: expect.stringContaining("Authorization header") });
    for (let i = 0; i < 5; i += 1) await authenticateMachineToken(tokenRequest(`wrong-${i}`)).catch(() => undefined);
    expect(await listAuditEvents(getDb(), { action: "machine-token.unknown" })).toHaveLength(1);
    const tally = await getDb().selectFrom("refused_request_tally").selectAll().where("kind", "=", "unknown-token").execute();
    expect(tally.map((t) => [t.origin, t.count])).toEqual([["10.9.8.7", 7]]);
  });

  it("limits each token's requests per minute with a plain 429, audited once", async () => {
    const s = await setUp("E");
    const a = await issueMachineToken(s.admin, { instrumentId: s.channel, label: "Busy", days: 10 });
    const b = await issueMachineToken(s.admin, { instrumentId: s.channel, label: "Calm", days: 10 });
    const hourAhead = rateWindowStart(new Date(Date.now() + 3_600_000)).getTime();
    const minute = new Date(hourAhead + 5_000);
    for (let i = 0; i < TOKEN_REQUESTS_PER_MINUTE; i += 1) await authenticateMachineToken(tokenRequest(a.token), minute);
    for (let i = 0; i < 3; i += 1) {
      await expect(authenticateMachineToken(tokenRequest(a.token), minute)).rejects.toMatchObject({ status: 429, message: expect.stringContaining(`at most ${TOKEN_REQUESTS_PER_MINUTE} a minute`) });
    }
    // Another token is counted on its own, and the next minute starts afresh.
    await expect(authenticateMachineToken(tokenRequest(b.token), minute)).resolves.toMatchObject({ label: "Calm" });
    await expect(authenticateMachineToken(tokenRequest(a.token), new Date(hourAhead + 60_000))).resolves.toMatchObject({ label: "Busy" });
    const limited = await listAuditEvents(getDb(), { action: "machine-token.refused", entityId: s.channel });
    expect(limited.map((e) => (e.detail as { reason: string }).reason)).toEqual(["rate-limited"]);
  });

  it("refuses to issue for an instrument that is not a cycler channel, or for more than a year", async () => {
    const s = await setUp("F");
    const thermometer = await addChannel("TH-F", s.admin.id, "thermometer");
    await expect(issueMachineToken(s.admin, { instrumentId: thermometer, label: "x", days: 10 })).rejects.toMatchObject({ message: expect.stringContaining("cycler channels only") });
    await expect(issueMachineToken(s.admin, { instrumentId: s.channel, label: "x", days: 366 })).rejects.toThrow(/at most 365 days/);
    await expect(issueMachineToken(s.admin, { instrumentId: s.channel, label: " ", days: 10 })).rejects.toThrow(/Give the token a label/);
    expect((await listTokens()).filter((t) => t.instrument.id === s.channel || t.instrument.id === thermometer)).toEqual([]);
  });

  it("the database keeps what a token is and a revocation final, even for the app's own role", async () => {
    const s = await setUp("G");
    const issued = await issueMachineToken(s.admin, { instrumentId: s.channel, label: "Bay 1", days: 10 });
    await expect(getDb().updateTable("machine_token").set({ expires_at: new Date("2030-01-01") }).where("id", "=", issued.id).execute()).rejects.toThrow(/cannot be changed/);
    await expect(getDb().updateTable("machine_token").set({ instrument_id: s.otherChannel }).where("id", "=", issued.id).execute()).rejects.toThrow(/cannot be changed/);
    await expect(getDb().deleteFrom("machine_token").where("id", "=", issued.id).execute()).rejects.toThrow(/permission denied|kept for the record/);
    await revokeMachineToken(s.admin, { tokenId: issued.id, reason: "lost" });
    await expect(getDb().updateTable("machine_token").set({ revoked_at: null, revoked_by: null, revoke_reason: null }).where("id", "=", issued.id).execute()).rejects.toThrow(/already revoked/);
  });
});
