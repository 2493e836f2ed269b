import Papa from "papaparse";
import { describe, expect, it } from "vitest";
import { getDb } from "@/db";
import { listAuditActors, listAuditEvents, recordAuditEvent } from "@/db/audit";
import { listProceduresAwaitingRelease } from "@/db/queues";
import { formatReadableAuditCsv } from "@/lib/audit-trail-csv";
import { auditTrailSearchSchema, toAuditFilter } from "@/lib/audit-trail-filter";
import { createProcedure, submitForReview } from "@/lib/procedures/lifecycle";
import { procedureDraftSchema } from "@/lib/procedures/procedure-input";
import { ratedCapacityAt20cTemplate } from "@/protocols";
import { makeUser } from "./fixtures";

// The queues page; these tests' few rows all fit on the first.
const FIRST_PAGE = { page: 1, pageSize: 100 };

function draftOf(code: string) {
  const definition = structuredClone(ratedCapacityAt20cTemplate);
  definition.header.code = code;
  return procedureDraftSchema.parse({ definition });
}

describe("the audit trail for people", () => {
  it("filters by person, record name, kind and whole UTC days, and exports what it shows as readable CSV", async () => {
    const ada = await makeUser("engineer", "Ada Filter");
    const ben = await makeUser("engineer", "Ben Filter");
    const { versionId } = await createProcedure(ada, draftOf("T-AUD-1"));
    await submitForReview(ada, versionId);
    await recordAuditEvent(getDb(), { actorId: ben.id, actorLabel: "Ben Filter <b@x>", action: "user.change-role", entityType: "user", entityId: ada.id, before: { role: "operator" }, after: { role: "engineer" } });
    // An old entry, for the date filter.
    await getDb()
      .insertInto("audit_event")
      .values({ actor_id: ben.id, actor_label: "Ben Filter <b@x>", action: "auth.sign-in", at: new Date("2020-03-04T10:00:00Z") })
      .execute();

    const byAda = await listAuditEvents(getDb(), toAuditFilter(auditTrailSearchSchema.parse({ person: ada.id })));
    expect(new Set(byAda.map((e) => e.action))).toEqual(new Set(["procedure.create", "procedure.submit"]));

    const byRecord = await listAuditEvents(getDb(), toAuditFilter(auditTrailSearchSchema.parse({ record: "t-aud-1 version" })));
    expect(byRecord.map((e) => e.entityLabel)).toEqual(["T-AUD-1 version 1", "T-AUD-1 version 1"]);

    const users = await listAuditEvents(getDb(), toAuditFilter(auditTrailSearchSchema.parse({ kind: "user" })));
    expect(users.map((e) => e.entityLabel)).toContain("Ada Filter");

    const today = new Date().toISOString().slice(0, 10);
    const todayOnly = await listAuditEvents(getDb(), toAuditFilter(auditTrailSearchSchema.parse({ from: today, to: today })));
    expect(todayOnly.length).toBeGreaterThanOrEqual(3);
    expect(todayOnly.every((e) => e.at.toISOString().startsWith(today))).toBe(true);
    const march2020 = await listAuditEvents(getDb(), toAuditFilter(auditTrailSearchSchema.parse({ from: "2020-03-04", to: "2020-03-04" })));
    expect(march2020.map((e) => e.action)).toEqual(["auth.sign-in"]);

    expect((await listAuditActors(getDb())).map((a) => a.label)).toEqual(expect.arrayContaining(["Ada Filter <engineer-ada-filter@test.example>"]));

    const csv = formatReadableAuditCsv(users);
    const rows = Papa.parse<string[]>(csv.trim()).data;
    expect(rows[0]).toEqual(["When (UTC)", "Who", "What happened", "Record", "What changed (was → now)", "From"]);
    expect(rows[1]).toEqual([expect.stringMatching(/^\d{4}-\d\d-\d\d \d\d:\d\d:\d\d$/), "Ben Filter <b@x>", "changed a role", "user Ada Filter", "role: operator → engineer", ""]);
  });

  it("lists a version in review for every engineer but its author and submitter", async () => {
    const ada = await makeUser("engineer", "Ada Queue");
    const ben = await makeUser("engineer", "Ben Queue");
    const { versionId } = await createProcedure(ada, draftOf("T-AUD-2"));
    await submitForReview(ada, versionId);
    expect((await listProceduresAwaitingRelease(getDb(), ben.id, FIRST_PAGE)).rows.map((e) => e.code)).toContain("T-AUD-2");
    expect((await listProceduresAwaitingRelease(getDb(), ada.id, FIRST_PAGE)).rows.map((e) => e.code)).not.toContain("T-AUD-2");
  });
});
