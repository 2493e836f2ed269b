import { type ChildProcess, spawn } from "node:child_process";
import { mkdtemp, rm } from "node:fs/promises";
import { createServer } from "node:net";
import { tmpdir } from "node:os";
import path from "node:path";
import { afterAll, beforeAll, beforeEach, describe, expect, it } from "vitest";
import { getDb } from "@/db";
import { listAuditEvents } from "@/db/audit";
import { getRun } from "@/db/runs";
import { queueCalibrationReminders } from "@/lib/mail/calibration-reminders";
import { startMailDispatchLoop, stopMailDispatchLoop, waitForMailDispatch } from "@/lib/mail/dispatch";
import { enqueueMail } from "@/lib/mail/enqueue-mail";
import { MAX_SEND_ATTEMPTS } from "@/lib/mail/retry-backoff";
import { sendPendingMail } from "@/lib/mail/send-pending-mail";
import { formatLogCsv } from "@/lib/analysis";
import { listFindings } from "@/lib/conformance";
import { evaluateStoredRun } from "@/lib/runs/evaluate-stored-run";
import { ingestLog } from "@/lib/runs/ingest-log";
import { recordStep } from "@/lib/runs/record-step";
import { startRun } from "@/lib/runs/start-run";
import { submitRun } from "@/lib/runs/submit-run";
import { createCellSpecification } from "@/lib/specs/cell-specifications";
import { buildRatedCapacityRun, inventedCell } from "@/scenarios/rated-capacity-run";
import { withOwnerClient } from "../support/test-database";
import { chunksOf, makeUser, ELAPSED_LOG_MAPPING as MAPPING, releaseRatedCapacityProcedure } from "./fixtures";

interface CaughtMail {
  id: string;
  receivedAt: string;
  from: string;
  to: string[];
  subject: string;
  text: string;
  messageId: string | null;
}

// This file's own catcher (scripts/mail-catcher.mjs) on free loopback ports, so it can empty the
// inbox and point the sender away from it without touching anything else.
let catcher: ChildProcess;
let catcherDir: string;
let smtpPort: number;
let inboxUrl: string;

beforeAll(async () => {
  catcherDir = await mkdtemp(path.join(tmpdir(), "cellwright-mail-"));
  catcher = spawn(process.execPath, ["scripts/mail-catcher.mjs", "0", "0", catcherDir], { stdio: ["ignore", "pipe", "inherit"] });
  const firstLine = await new Promise<string>((resolve, reject) => {
    let out = "";
    catcher.stdout!.on("data", (chunk: Buffer) => {
      out += chunk.toString();
      if (out.includes("\n")) resolve(out.split("\n")[0]!);
    });
    catcher.once("exit", (code) => reject(new Error(`the mail catcher exited with ${code}`)));
  });
  const m = /SMTP 127\.0\.0\.1:(\d+), HTTP (http:\/\/127\.0\.0\.1:\d+)\/messages/.exec(firstLine);
  if (!m) throw new Error(`unexpected catcher output: ${firstLine}`);
  smtpPort = Number(m[1]);
  inboxUrl = `${m[2]}/messages`;
  process.env.SMTP_HOST = "127.0.0.1";
  process.env.MAIL_FROM = "Cellwright test <cellwright@test.localhost>";
});

afterAll(async () => {
  await waitForMailDispatch();
  catcher?.kill("SIGTERM");
  if (catcherDir) await rm(catcherDir, { recursive: true, force: true });
});

beforeEach(async () => {
  pointSenderAtCatcher();
  await fetch(inboxUrl, { method: "DELETE" });
});

function pointSenderAtCatcher() {
  process.env.SMTP_PORT = String(smtpPort);
}

/** A loopback port where nothing listens: the server is down. */
async function pointSenderAtNothing() {
  const port = await new Promise<number>((resolve) => {
    const s = createServer().listen(0, "127.0.0.1", () => {
      const p = (s.address() as { port: number }).port;
      s.close(() => resolve(p));
    });
  });
  process.env.SMTP_PORT = String(port);
}

async function readInbox(): Promise<CaughtMail[]> {
  const res = await fetch(inboxUrl);
  expect(res.ok).toBe(true);
  return (await res.json()) as CaughtMail[];
}

async function outboxRow(subject: string) {
  return getDb().selectFrom("mail_message").selectAll().where("subject", "=", subject).executeTakeFirstOrThrow();
}

const later = (minutes: number) => new Date(Date.now() + minutes * 60_000);

describe("the outbox", () => {
  it("never sends a message whose transaction rolled back; a committed one arrives with its subject and recipients", async () => {
    await expect(
      getDb()
        .transaction()
        .execute(async (tx) => {
          await enqueueMail(tx, { kind: "run-returned", recipients: ["op@test.example"], subject: "Rolled back notice", body: "never" });
          throw new Error("the change failed");
        }),
    ).rejects.toThrow("the change failed");
    await getDb()
      .transaction()
      .execute((tx) =>
        enqueueMail(tx, { kind: "certificate-issued", recipients: ["Aud@Test.example", "second@test.example"], subject: "Committed notice", body: "Line one\nLine two" }),
      );

    expect(await sendPendingMail()).toEqual({ sent: 1, failed: 0 });
    const inbox = await readInbox();
    expect(inbox.map((m) => m.subject)).toEqual(["Committed notice"]);
    expect(inbox[0]!.to).toEqual(["aud@test.example", "second@test.example"]);
    expect(inbox[0]!.from).toBe("cellwright@test.localhost");
    expect(inbox[0]!.text.trim()).toBe("Line one\nLine two");

    const row = await outboxRow("Committed notice");
    expect(row.sent_at).toBeInstanceOf(Date);
    expect(row.smtp_message_id).toBe(inbox[0]!.messageId);
    expect(await getDb().selectFrom("mail_message").select("id").where("subject", "=", "Rolled back notice").execute()).toHaveLength(0);
    // Nothing is sent twice.
    expect(await sendPendingMail({ now: later(60) })).toEqual({ sent: 0, failed: 0 });
    expect(await readInbox()).toHaveLength(1);
  });

  it("keeps each message to one sender when several run at once", async () => {
    for (let i = 1; i <= 5; i++) {
      await enqueueMail(getDb(), { kind: "run-returned", recipients: [`op${i}@test.example`], subject: `Parallel ${i}`, body: "b" });
    }
    const results = await Promise.all([sendPendingMail({ limit: 2 }), sendPendingMail({ limit: 2 }), sendPendingMail({ limit: 2 }), sendPendingMail({ limit: 2 })]);
    expect(results.reduce((n, r) => n + r.sent, 0)).toBe(5);
    const subjects = (await readInbox()).map((m) => m.subject).sort();
    expect(subjects).toEqual(["Parallel 1", "Parallel 2", "Parallel 3", "Parallel 4", "Parallel 5"]);
  });

  it("gives up after the last allowed attempt and leaves the message visible as failed", async () => {
    await enqueueMail(getDb(), { kind: "run-returned", recipients: ["op@test.example"], subject: "Hopeless notice", body: "b" });
    await getDb().updateTable("mail_message").set({ attempts: MAX_SEND_ATTEMPTS - 1 }).where("subject", "=", "Hopeless notice").execute();
    await pointSenderAtNothing();
    expect(await sendPendingMail()).toEqual({ sent: 0, failed: 1 });
    const row = await outboxRow("Hopeless notice");
    expect(row.attempts).toBe(MAX_SEND_ATTEMPTS);
    expect(row.sent_at).toBeNull();
    expect(row.last_error).toMatch(/ECONNREFUSED/);
    pointSenderAtCatcher();
    expect(await sendPendingMail({ now: later(24 * 60) })).toEqual({ sent: 0, failed: 0 });
    expect(await readInbox()).toHaveLength(0);
    const [event] = await listAuditEvents(getDb(), { action: "mail.failed", entityId: row.id });
    expect(event?.detail).toMatchObject({ attempt: MAX_SEND_ATTEMPTS, gaveUp: true });
  });

  it("does nothing without SMTP_HOST: messages keep waiting", async () => {
    await enqueueMail(getDb(), { kind: "run-returned", recipients: ["op@test.example"], subject: "Unconfigured notice", body: "b" });
    delete process.env.SMTP_HOST;
    try {
      expect(await sendPendingMail()).toEqual({ sent: 0, failed: 0 });
    } finally {
      process.env.SMTP_HOST = "127.0.0.1";
    }
    expect((await outboxRow("Unconfigured notice")).attempts).toBe(0);
    expect(await sendPendingMail()).toEqual({ sent: 1, failed: 0 });
  });
});

async function planTickedRun() {
  const engineer = await makeUser("engineer", "Eli Engineer");
  const second = await makeUser("engineer", "Sol Second");
  const operator = await makeUser("operator", "Oda Operator");
  const specId = await createCellSpecification(engineer, { maker: "Testmoor Cells", model: "TM-MAIL", data: inventedCell });
  const { versionId } = await releaseRatedCapacityProcedure(engineer, second, "T-MAIL");
  // The notice that the version waited for release is not what these tests count: take it out of the outbox.
  // The app's role never deletes mail; the owner does it for the test.
  await withOwnerClient((c) => c.query("delete from mail_message where kind = 'procedure-awaiting-release'"));
  const channel = (
    await getDb()
      .insertInto("instrument")
      .values({ kind: "cycler-channel", identifier: "CH-MAIL", serial: "S-1", accuracy: JSON.stringify({}), calibration_certificate: "CAL-1", calibrated_on: "2026-01-10", due_on: "2027-01-10", created_by: engineer.id })
      .returning("id")
      .executeTakeFirstOrThrow()
  ).id;
  const specimen = (
    await getDb()
      .insertInto("specimen")
      .values({ identifier: "SP-MAIL", cell_specification_id: specId, received_on: "2026-11-20", condition_on_receipt: "intact, 3.4 V", created_by: engineer.id })
      .returning("id")
      .executeTakeFirstOrThrow()
  ).id;
  const run = await startRun(operator, { procedureVersionId: versionId, specimenId: specimen, instrumentIds: [channel] }, "2026-12-01");
  const built = buildRatedCapacityRun({ sampleIntervalS: 60 });
  for (const record of built.input.stepRecords) await recordStep(operator, run.id, record);
  // A run is submitted only with its log stored and evaluated.
  const csv = formatLogCsv(built.log.columns, { columns: ["time", "voltage", "current"] });
  if (!csv.ok) throw new Error(csv.error.message);
  const ingested = await ingestLog(operator, run.id, { name: "mail.csv", chunks: chunksOf(csv.value), mapping: MAPPING });
  if (!ingested.ok) throw new Error(ingested.error.message);
  const evaluation = await evaluateStoredRun(operator, run.id, { columns: ingested.columns });
  const deviations = listFindings(evaluation).filter((f) => f.outcome === "deviates").length;
  return { engineer, second, operator, run: { ...run, deviations } };
}

describe("run submitted", () => {
  it("queues the notice with the submission; a failed send keeps the run submitted, is logged, and a retry delivers it", async () => {
    const { engineer, second, operator, run } = await planTickedRun();
    // The operator has since become an engineer: they still get no notice to review their own run.
    await getDb().updateTable("app_user").set({ role: "engineer" }).where("id", "=", operator.id).execute();

    await pointSenderAtNothing();
    // This process sends as an app server does: the submission's kick sends at once, in the background.
    // (Its hourly and 30 s passes are cleared by the stop below before they are due.)
    startMailDispatchLoop();
    const before = Date.now();
    try {
      await submitRun(operator, run.id, { confirmedDeviations: run.deviations });
      await waitForMailDispatch();
    } finally {
      stopMailDispatchLoop();
    }

    expect((await getRun(getDb(), run.id))?.status).toBe("submitted");
    const row = await getDb().selectFrom("mail_message").selectAll().where("kind", "=", "run-submitted").where("entity_id", "=", run.id).executeTakeFirstOrThrow();
    expect(row.subject).toBe(`Run ${run.number} submitted for review`);
    expect([...row.recipients].sort()).toEqual([engineer.email, second.email].sort());
    expect(row.attempts).toBe(1);
    expect(row.sent_at).toBeNull();
    expect(row.last_error).toMatch(/ECONNREFUSED/);
    // Backoff: the next try is about a minute on, not at once.
    expect(row.next_attempt_at.getTime()).toBeGreaterThanOrEqual(before + 55_000);
    const [failure] = await listAuditEvents(getDb(), { action: "mail.failed", entityId: row.id });
    expect(failure?.actorLabel).toBe("mail sender");
    expect(failure?.detail).toMatchObject({ kind: "run-submitted", attempt: 1 });
    expect(await readInbox()).toHaveLength(0);

    // Not yet due: the server is back but the message waits for its turn.
    pointSenderAtCatcher();
    expect(await sendPendingMail()).toEqual({ sent: 0, failed: 0 });
    expect(await sendPendingMail({ now: later(2) })).toEqual({ sent: 1, failed: 0 });
    const [caught] = await readInbox();
    expect(caught?.subject).toBe(`Run ${run.number} submitted for review`);
    expect([...caught!.to].sort()).toEqual([engineer.email, second.email].sort());
    expect(caught?.text).toContain(`/runs/${run.id}`);
    expect(caught?.text).toContain("Oda Operator submitted");
    const sent = await outboxRow(row.subject);
    expect(sent.sent_at).not.toBeNull();
    expect(sent.attempts).toBe(1);
  });
});

describe("calibration reminders", () => {
  it("go to the admins once per instrument and due date, for instruments in use due within 30 days or overdue", async () => {
    const admin = await makeUser("admin", "Ada Admin");
    const other = await makeUser("admin", "Abe Admin");
    const engineer = await makeUser("engineer", "Eli Engineer");
    const add = async (identifier: string, dueOn: string, active = true) =>
      (
        await getDb()
          .insertInto("instrument")
          .values({ kind: "thermometer", identifier, serial: "T", accuracy: JSON.stringify({}), calibration_certificate: "C", calibrated_on: "2026-01-01", due_on: dueOn, active, created_by: engineer.id })
          .returning("id")
          .executeTakeFirstOrThrow()
      ).id;
    const soon = await add("TH-SOON", "2026-12-20");
    const overdue = await add("TH-LATE", "2026-11-25");
    await add("TH-FAR", "2027-02-01");
    await add("TH-RETIRED", "2026-12-05", false);
    const noon = new Date("2026-12-02T12:00:00");

    expect(await queueCalibrationReminders(noon)).toBe(2);
    expect(await queueCalibrationReminders(noon)).toBe(0);
    expect(await queueCalibrationReminders(new Date("2026-12-03T12:00:00"))).toBe(0);

    const rows = await getDb().selectFrom("mail_message").selectAll().where("kind", "=", "calibration-due").orderBy("subject").execute();
    expect(rows.map((r) => [r.subject, r.entity_id, r.once_key])).toEqual([
      ["Calibration of thermometer TH-LATE overdue (was due on 2026-11-25)", overdue, `calibration-due:${overdue}:2026-11-25`],
      ["Calibration of thermometer TH-SOON due on 2026-12-20", soon, `calibration-due:${soon}:2026-12-20`],
    ]);
    for (const r of rows) expect([...r.recipients].sort()).toEqual([admin.email, other.email].sort());

    // Recalibrated with a new due date that is again near: a new reminder for the new date.
    await getDb().updateTable("instrument").set({ due_on: "2026-12-30" }).where("id", "=", overdue).execute();
    expect(await queueCalibrationReminders(noon)).toBe(1);

    expect(await sendPendingMail()).toEqual({ sent: 3, failed: 0 });
    const inbox = await readInbox();
    expect(inbox.map((m) => m.subject).sort()).toEqual([
      "Calibration of thermometer TH-LATE due on 2026-12-30",
      "Calibration of thermometer TH-LATE overdue (was due on 2026-11-25)",
      "Calibration of thermometer TH-SOON due on 2026-12-20",
    ]);
    expect(inbox.find((m) => m.subject.includes("TH-SOON"))?.text).toContain("is due on 2026-12-20, in 18 days");
  });
});
