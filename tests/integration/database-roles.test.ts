import { mkdtempSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { sql } from "kysely";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { getDb } from "@/db";
import { upsertLab } from "@/db/lab";
import { closePool } from "@/db/pool";
import { formatLogCsv } from "@/lib/analysis";
import type { SignedInUser } from "@/lib/auth/signed-in-user";
import { issueRunCertificate } from "@/lib/certificates/issue-certificate";
import { acceptRun } from "@/lib/reviews/accept-run";
import { returnRun } from "@/lib/reviews/return-run";
import { evaluateStoredRun } from "@/lib/runs/evaluate-stored-run";
import { ingestLog } from "@/lib/runs/ingest-log";
import { recordStep } from "@/lib/runs/record-step";
import { startRun } from "@/lib/runs/start-run";
import { submitRun } from "@/lib/runs/submit-run";
import { createCellSpecification } from "@/lib/specs/cell-specifications";
import { buildRatedCapacityRun, inventedCell } from "@/scenarios/rated-capacity-run";
import { withOwnerClient } from "../support/test-database";
import { chunksOf, ELAPSED_LOG_MAPPING as MAPPING, makeUser, releaseRatedCapacityProcedure, setPassword } from "./fixtures";

// The trust rule (RULES.md): the app's database role is never a superuser, and what must not change is
// refused by the database. Every statement here is sent on the app's own connection (getDb(), the
// role in DATABASE_URL), as the code under attack would send it.

const signingDir = mkdtempSync(join(tmpdir(), "cellwright-signing-"));
process.env.CELLWRIGHT_SIGNING_DIR = signingDir;
afterAll(async () => {
  rmSync(signingDir, { recursive: true, force: true });
  await closePool();
  await new Promise((resolve) => setTimeout(resolve, 300));
});

const PASSWORD = "a reviewer's long passphrase";
const TODAY = "2026-12-01";

type Lab = { engineer: SignedInUser; reviewer: SignedInUser; operator: SignedInUser; specId: string; versionId: string; channel: string };
let lab: Lab;

/** A rated-capacity run recorded, logged, evaluated and submitted through the app's own services. */
async function submittedRun(tag: string): Promise<string> {
  const specimen = (
    await getDb()
      .insertInto("specimen")
      .values({ identifier: `SP-${tag}`, cell_specification_id: lab.specId, received_on: "2026-11-20", condition_on_receipt: "intact", created_by: lab.engineer.id })
      .returning("id")
      .executeTakeFirstOrThrow()
  ).id;
  const run = await startRun(lab.operator, { procedureVersionId: lab.versionId, specimenId: specimen, instrumentIds: [lab.channel] }, TODAY);
  const built = buildRatedCapacityRun({ sampleIntervalS: 20 });
  for (const record of built.input.stepRecords) await recordStep(lab.operator, run.id, record);
  const csv = formatLogCsv(built.log.columns, { columns: ["time", "voltage", "current"] });
  if (!csv.ok) throw new Error(csv.error.message);
  const ingested = await ingestLog(lab.operator, run.id, { name: `${tag}.csv`, chunks: chunksOf(csv.value), mapping: MAPPING });
  if (!ingested.ok) throw new Error(ingested.error.message);
  await evaluateStoredRun(lab.operator, run.id, { columns: ingested.columns });
  await submitRun(lab.operator, run.id);
  return run.id;
}

/** The ids of everything a run's certificate rests on. */
async function chainOf(runId: string) {
  const db = getDb();
  const log = await db.selectFrom("run_log").select(["id", "stored_file_id"]).where("run_id", "=", runId).where("current", "=", true).executeTakeFirstOrThrow();
  const review = await db.selectFrom("run_review").select(["id", "signature_id"]).where("run_id", "=", runId).where("decision", "=", "accepted").executeTakeFirst();
  const certificate = await db.selectFrom("certificate").select(["id", "signature_id"]).where("run_id", "=", runId).executeTakeFirst();
  const run = await db.selectFrom("run").select(["procedure_version_id", "status"]).where("id", "=", runId).executeTakeFirstOrThrow();
  return { runId, logId: log.id, fileId: log.stored_file_id, review, certificate, versionId: run.procedure_version_id, status: run.status };
}

let certifiedRunId: string;
let acceptedRunId: string;

beforeAll(async () => {
  const engineer = await setPassword(await makeUser("engineer", "Edda Engineer"), PASSWORD);
  const reviewer = await setPassword(await makeUser("engineer", "Ravi Reviewer"), PASSWORD);
  const operator = await makeUser("operator", "Olu Operator");
  await upsertLab(getDb(), { name: "Harbourside Cell Test Laboratory", address: "Unit 4, 17 Ropewalk Lane, Portmere", accreditation: null });
  const specId = await createCellSpecification(engineer, { maker: "Testmoor Cells", model: "TM-ROLE", data: inventedCell });
  const { versionId } = await releaseRatedCapacityProcedure(engineer, reviewer, "T-ROLE");
  const channel = (
    await getDb()
      .insertInto("instrument")
      .values({ kind: "cycler-channel", identifier: "CH-ROLE", serial: "S-ROLE", accuracy: JSON.stringify({}), calibration_certificate: "CAL-ROLE", calibrated_on: "2026-01-10", due_on: "2027-01-10", created_by: engineer.id })
      .returning("id")
      .executeTakeFirstOrThrow()
  ).id;
  lab = { engineer, reviewer, operator, specId, versionId, channel };

  certifiedRunId = await submittedRun("CERT");
  await acceptRun(reviewer, certifiedRunId, { password: PASSWORD, acknowledgements: [] });
  await issueRunCertificate(engineer, certifiedRunId, { password: PASSWORD });
  acceptedRunId = await submittedRun("ACC");
  await acceptRun(reviewer, acceptedRunId, { password: PASSWORD, acknowledgements: [] });
}, 120_000);

/** Sends one statement on the app's connection and returns the database's refusal (or null if it was allowed). */
async function refusal(statement: ReturnType<typeof sql>): Promise<string | null> {
  try {
    await statement.execute(getDb());
    return null;
  } catch (error) {
    return (error as Error).message;
  }
}

describe("the app's database role", () => {
  it("is not a superuser, may not create roles or databases, belongs to no other role and owns nothing", async () => {
    const db = getDb();
    const me = (await sql<{ rolname: string; rolsuper: boolean; rolcreaterole: boolean; rolcreatedb: boolean; rolreplication: boolean; rolbypassrls: boolean }>`
      select rolname, rolsuper, rolcreaterole, rolcreatedb, rolreplication, rolbypassrls from pg_roles where rolname = current_user`.execute(db)).rows[0];
    expect(me).toEqual({ rolname: "cellwright_app", rolsuper: false, rolcreaterole: false, rolcreatedb: false, rolreplication: false, rolbypassrls: false });

    const owned = await sql<{ what: string; n: number }>`
      select 'relations' as what, count(*)::int as n from pg_class where relowner = current_user::regrole
      union all select 'routines', count(*)::int from pg_proc where proowner = current_user::regrole
      union all select 'schemas', count(*)::int from pg_namespace where nspowner = current_user::regrole
      union all select 'types', count(*)::int from pg_type where typowner = current_user::regrole
      union all select 'databases', count(*)::int from pg_database where datdba = current_user::regrole
      union all select 'memberships', count(*)::int from pg_auth_members where member = current_user::regrole`.execute(db);
    expect(Object.fromEntries(owned.rows.map((r) => [r.what, r.n]))).toEqual({ relations: 0, routines: 0, schemas: 0, types: 0, databases: 0, memberships: 0 });

    // The migrations ran as the owner role, which is no superuser either and owns every table.
    const owners = await sql<{ owner: string; super: boolean }>`
      select distinct pg_get_userbyid(c.relowner) as owner, r.rolsuper as super
        from pg_class c join pg_namespace n on n.oid = c.relnamespace join pg_roles r on r.oid = c.relowner
       where n.nspname = 'public' and c.relkind in ('r', 'S')`.execute(db);
    expect(owners.rows).toEqual([{ owner: "cellwright_owner", super: false }]);

    await expect(sql`set role cellwright_owner`.execute(db)).rejects.toThrow(/permission denied/);
    await expect(sql`set role postgres`.execute(db)).rejects.toThrow(/permission denied/);
    await expect(sql`create table smuggled (id int)`.execute(db)).rejects.toThrow(/permission denied/);
    await expect(sql`create temporary table run (id uuid, number text, status text)`.execute(db)).rejects.toThrow(/permission denied/);
  });

  it("cannot make a guard read a table of its own: the guards resolve names in public before pg_temp", async () => {
    // The guards of migrations 0001–0008 (0009 pins them); a later migration's function sets its own search_path.
    const guards = [
      "audit_event_refuse_change",
      "procedure_version_guard",
      "specimen_matches_lot",
      "lot_keeps_specimens_matching",
      "run_guard",
      "electronic_signature_guard",
      "run_review_guard",
      "certificate_guard",
      "lot_sample_draw_guard",
      "run_is_frozen",
      "run_evidence_guard",
      "run_log_chunk_guard",
      "stored_file_guard",
      "run_status_guard",
      "refuse_truncate",
    ];
    const pinned = await sql<{ name: string }>`
      select p.proname as name from pg_proc p
       where p.pronamespace = 'public'::regnamespace and 'search_path=public, pg_temp' = any(p.proconfig)`.execute(getDb());
    expect(pinned.rows.map((r) => r.name)).toEqual(expect.arrayContaining(guards));
    // And every function any later migration adds: each names where it looks tables up.
    const unpinned = await sql<{ name: string }>`
      select p.proname as name from pg_proc p
       where p.pronamespace = 'public'::regnamespace
         and not exists (select 1 from unnest(coalesce(p.proconfig, '{}')) c where c like 'search_path=%')`.execute(getDb());
    expect(unpinned.rows.map((r) => r.name)).toEqual([]);
  });

  it("holds no TRUNCATE, TRIGGER or REFERENCES right on any table, and none at all on the migration records", async () => {
    const rights = await sql<{ table: string; privilege: string }>`
      select c.relname as table, p.privilege
        from pg_class c join pg_namespace n on n.oid = c.relnamespace
        cross join unnest(array['TRUNCATE', 'TRIGGER', 'REFERENCES']) as p(privilege)
       where n.nspname = 'public' and c.relkind = 'r' and has_table_privilege(current_user, c.oid, p.privilege)`.execute(getDb());
    expect(rights.rows).toEqual([]);
    expect(await refusal(sql`select * from kysely_migration`)).toMatch(/permission denied/);
    expect(await refusal(sql`delete from kysely_migration`)).toMatch(/permission denied/);
  });

  it("has only the row rights each table needs: the evidence tables are SELECT and INSERT only", async () => {
    const rows = await sql<{ table: string; rights: string }>`
      select c.relname as table,
             concat_ws(',', case when has_table_privilege(current_user, c.oid, 'SELECT') then 'S' end,
                            case when has_table_privilege(current_user, c.oid, 'INSERT') then 'I' end,
                            case when has_table_privilege(current_user, c.oid, 'UPDATE') then 'U' end,
                            case when has_table_privilege(current_user, c.oid, 'DELETE') then 'D' end) as rights
        from pg_class c join pg_namespace n on n.oid = c.relnamespace
       where n.nspname = 'public' and c.relkind = 'r'`.execute(getDb());
    const rights = Object.fromEntries(rows.rows.map((r) => [r.table, r.rights]));
    for (const table of ["audit_event", "electronic_signature", "run_review", "run_log_chunk", "run_evaluation", "stored_file", "run_instrument", "lot_sample_draw", "procedure", "lab_signing_key"]) {
      expect(rights[table], table).toBe("S,I");
    }
    for (const table of ["run", "step_record", "run_log", "certificate", "procedure_version"]) expect(rights[table], table).toBe("S,I,U");
    expect(rights.user_session).toBe("S,I,U,D");
    expect(rights.kysely_migration).toBe("");
  });

  it("may not turn off triggers or replication-role checks, on any protected table", async () => {
    const protectedTables = [
      "audit_event",
      "electronic_signature",
      "certificate",
      "procedure_version",
      "run_review",
      "run",
      "step_record",
      "run_instrument",
      "run_log",
      "run_log_chunk",
      "stored_file",
      "run_evaluation",
      "lot_sample_draw",
    ];
    for (const table of protectedTables) {
      expect(await refusal(sql`alter table ${sql.table(table)} disable trigger all`), table).toMatch(/must be owner/);
      expect(await refusal(sql`alter table ${sql.table(table)} disable trigger user`), table).toMatch(/must be owner/);
      expect(await refusal(sql`truncate ${sql.table(table)} cascade`), table).toMatch(/permission denied/);
    }
    expect(await refusal(sql`set session_replication_role = replica`)).toMatch(/permission denied to set parameter/);
    expect(await refusal(sql`set local session_replication_role = replica`)).toMatch(/permission denied to set parameter/);
    expect(await refusal(sql`select set_config('session_replication_role', 'replica', false)`)).toMatch(/permission denied to set parameter/);
    // And the owner role, which may alter its tables, still meets every trigger unless it disables them.
    await withOwnerClient(async (owner) => {
      await expect(owner.query("set session_replication_role = replica")).rejects.toThrow(/permission denied to set parameter/);
      await expect(owner.query("truncate certificate cascade")).rejects.toThrow(/never emptied|TRUNCATE refused/);
    });
  });
});

describe("a certified run's whole chain, from the app's role", () => {
  it("refuses UPDATE and DELETE of the run, its step records and ambient readings, instruments, log, samples, file, evaluation, review, signatures, certificate and procedure version", async () => {
    const c = await chainOf(certifiedRunId);
    expect(c.status).toBe("certified");
    expect(c.certificate && c.review).toBeTruthy();
    const run = c.runId;
    const attempts: [string, ReturnType<typeof sql>, RegExp][] = [
      ["run status", sql`update run set status = 'in_progress' where id = ${run}`, /frozen/],
      ["run back to accepted", sql`update run set status = 'accepted' where id = ${run}`, /frozen/],
      ["run stamp", sql`update run set submitted_at = now() where id = ${run}`, /frozen/],
      ["run delete", sql`delete from run where id = ${run}`, /permission denied/],
      ["step record", sql`update step_record set completed = false where run_id = ${run}`, /frozen/],
      ["ambient readings", sql`update step_record set record = jsonb_set(record, '{ambientReadings}', '[]'::jsonb) where run_id = ${run}`, /frozen/],
      ["step record delete", sql`delete from step_record where run_id = ${run}`, /permission denied/],
      ["instrument used", sql`delete from run_instrument where run_id = ${run}`, /permission denied/],
      ["instrument used update", sql`update run_instrument set instrument_id = instrument_id where run_id = ${run}`, /permission denied/],
      ["log", sql`update run_log set current = false where id = ${c.logId}`, /frozen/],
      ["log mapping", sql`update run_log set sample_count = sample_count + 1 where id = ${c.logId}`, /frozen/],
      ["log delete", sql`delete from run_log where id = ${c.logId}`, /permission denied/],
      ["log samples", sql`update run_log_chunk set voltage_v = current_a where run_log_id = ${c.logId}`, /permission denied/],
      ["log samples delete", sql`delete from run_log_chunk where run_log_id = ${c.logId}`, /permission denied/],
      ["stored file hash", sql`update stored_file set sha256 = ${"0".repeat(64)} where id = ${c.fileId}`, /permission denied/],
      ["stored file delete", sql`delete from stored_file where id = ${c.fileId}`, /permission denied/],
      ["evaluation", sql`update run_evaluation set specimen_conforms = 'conforms' where run_id = ${run}`, /permission denied/],
      ["evaluation delete", sql`delete from run_evaluation where run_id = ${run}`, /permission denied/],
      ["review", sql`update run_review set comments = 'softened' where run_id = ${run}`, /permission denied/],
      ["review delete", sql`delete from run_review where run_id = ${run}`, /permission denied/],
      ["signature", sql`update electronic_signature set printed_name = 'Someone Else' where entity_id = ${run}`, /permission denied/],
      ["signature delete", sql`delete from electronic_signature where id = ${c.review!.signature_id}`, /permission denied/],
      ["certificate", sql`update certificate set payload_sha256 = ${"0".repeat(64)} where run_id = ${run}`, /never change/],
      ["certificate delete", sql`delete from certificate where run_id = ${run}`, /permission denied/],
      ["procedure version", sql`update procedure_version set title = 'tampered' where id = ${c.versionId}`, /released and frozen/],
      ["procedure version delete", sql`delete from procedure_version where id = ${c.versionId}`, /permission denied/],
      ["audit trail", sql`update audit_event set action = 'tampered' where entity_id = ${run}`, /permission denied/],
      ["audit trail delete", sql`delete from audit_event where entity_id = ${run}`, /permission denied/],
    ];
    for (const [what, statement, expected] of attempts) expect(await refusal(statement), what).toMatch(expected);
    // Nothing moved.
    expect(await chainOf(run)).toEqual(c);
  });

  it("refuses new records, logs, samples, instruments or evaluations on an accepted run", async () => {
    const run = acceptedRunId;
    const c = await chainOf(run);
    expect(c.status).toBe("accepted");
    const step = await getDb().selectFrom("step_record").selectAll().where("run_id", "=", run).limit(1).executeTakeFirstOrThrow();
    const evaluation = await getDb().selectFrom("run_evaluation").selectAll().where("run_id", "=", run).limit(1).executeTakeFirstOrThrow();
    const attempts: [string, ReturnType<typeof sql>][] = [
      ["step record", sql`insert into step_record (run_id, step_id, cycle, record, completed, recorded_by) values (${run}, ${step.step_id}, 99, ${JSON.stringify(step.record)}, true, ${lab.operator.id})`],
      ["step record correction", sql`update step_record set record = record || '{"notes": "added later"}'::jsonb where id = ${step.id}`],
      ["instrument", sql`insert into run_instrument (run_id, instrument_id) select ${run}, id from instrument where identifier <> 'CH-ROLE' limit 1`],
      ["second log", sql`insert into run_log (run_id, stored_file_id, mapping, sample_count, uploaded_by) values (${run}, ${c.fileId}, '{}', 1, ${lab.operator.id})`],
      ["extra samples", sql`insert into run_log_chunk (run_log_id, chunk, sample_count, time_s, voltage_v, current_a) values (${c.logId}, 9999, 1, '\\x00', '\\x00', '\\x00')`],
      [
        "evaluation",
        sql`insert into run_evaluation (run_id, run_log_id, procedure_version_id, evaluation, procedure_followed, specimen_conforms)
            values (${run}, ${c.logId}, ${evaluation.procedure_version_id}, ${JSON.stringify(evaluation.evaluation)}, 'followed', 'conforms')`,
      ],
      ["status skipping the certificate", sql`update run set status = 'certified' where id = ${run}`],
    ];
    // The instrument insert selects nothing if the lab has one instrument: add a second one first.
    await getDb()
      .insertInto("instrument")
      .values({ kind: "thermometer", identifier: "TH-ROLE", serial: "S-TH", accuracy: JSON.stringify({}), calibration_certificate: "CAL-TH", calibrated_on: "2026-01-10", due_on: "2027-01-10", created_by: lab.engineer.id })
      .execute();
    for (const [what, statement] of attempts) expect(await refusal(statement), what).toMatch(/frozen|accepted|certified only/);
    expect(await chainOf(run)).toEqual(c);
  });

  it("freezes the chain for the owner role too, as long as the triggers are on", async () => {
    const c = await chainOf(certifiedRunId);
    await withOwnerClient(async (owner) => {
      for (const statement of [
        "update step_record set completed = false where run_id = $1",
        "delete from run_evaluation where run_id = $1",
        "update run set status = 'returned' where id = $1",
        "delete from run_log_chunk where run_log_id = (select id from run_log where run_id = $1 and current)",
      ]) {
        await expect(owner.query(statement, [certifiedRunId]), statement).rejects.toThrow(/frozen/);
      }
      await expect(owner.query("update stored_file set sha256 = $2 where id = $1", [c.fileId, "0".repeat(64)])).rejects.toThrow(/never changes/);
      await expect(owner.query("truncate run_log_chunk")).rejects.toThrow(/never emptied/);
    });
    expect(await chainOf(certifiedRunId)).toEqual(c);
  });

  it("lets a run reach 'accepted' only from review with a signed acceptance, and 'certified' only with its certificate", async () => {
    const runId = await submittedRun("FLOW");
    expect(await refusal(sql`update run set status = 'accepted' where id = ${runId}`)).toMatch(/accepted only from review/);
    expect(await refusal(sql`update run set status = 'certified' where id = ${runId}`)).toMatch(/certified only once accepted/);
    const startsAccepted = await refusal(sql`
      insert into run (procedure_version_id, specimen_id, operator_id, status, resolution, cell_rating, procedure_source)
      select procedure_version_id, specimen_id, operator_id, 'accepted', resolution, cell_rating, procedure_source from run where id = ${runId}`);
    expect(startsAccepted).toMatch(/starts open/);
    // A returned run stays open to corrections: the freeze never reaches it.
    await returnRun(lab.reviewer, runId, { comments: "Re-read the rest step's ambient temperature." });
    expect(await refusal(sql`update step_record set record = record || '{"notes": "re-read"}'::jsonb where run_id = ${runId}`)).toBeNull();
    expect(await refusal(sql`update run_log set current = current where run_id = ${runId}`)).toBeNull();
  });
});
