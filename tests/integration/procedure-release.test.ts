import { sql } from "kysely";
import { describe, expect, it } from "vitest";
import { getDb } from "@/db";
import { listAuditEvents } from "@/db/audit";
import { createProcedure, signAndReleaseVersion, submitForReview } from "@/lib/procedures/lifecycle";
import { procedureDraftSchema } from "@/lib/procedures/procedure-input";
import { ratedCapacityAt20cTemplate } from "@/protocols";
import { makeUser, setPassword } from "./fixtures";

function draftOf(code: string) {
  const definition = structuredClone(ratedCapacityAt20cTemplate);
  definition.header.code = code;
  return procedureDraftSchema.parse({ definition });
}

async function versionRow(id: string) {
  return getDb().selectFrom("procedure_version").select(["status", "updated_at", "released_by"]).where("id", "=", id).executeTakeFirstOrThrow();
}

describe("releasing a procedure version is an electronic signature", () => {
  it("refuses a wrong password (audited on the version, nothing released), then signs with the right one", async () => {
    const author = await makeUser("engineer", "Rhea Writer");
    const second = await setPassword(await makeUser("engineer", "Olu Releaser"), "release-pass-1");
    const { versionId } = await createProcedure(author, draftOf("T-REL-1"));
    await submitForReview(author, versionId);
    const savedBefore = (await versionRow(versionId)).updated_at;

    await expect(signAndReleaseVersion(second, versionId, "wrong")).rejects.toThrow(/password is not right/);
    expect((await versionRow(versionId)).status).toBe("in_review");
    const refused = await listAuditEvents(getDb(), { action: "signature.refused", entityId: versionId });
    expect(refused).toHaveLength(1);

    const signature = await signAndReleaseVersion(second, versionId, "release-pass-1");
    expect(signature).toMatchObject({ printedName: "Olu Releaser", meaning: "released" });
    const after = await versionRow(versionId);
    expect(after.status).toBe("released");
    expect(after.released_by).toBe(second.id);
    // The author's "last saved" time is not the release time.
    expect(after.updated_at.toISOString()).toBe(savedBefore.toISOString());
    const stored = await getDb().selectFrom("electronic_signature").selectAll().where("entity_id", "=", versionId).execute();
    expect(stored).toHaveLength(1);
    expect(stored[0]).toMatchObject({ entity_type: "procedure-version", meaning: "released", signer_id: second.id });
    expect(stored[0]!.record_sha256).toMatch(/^[0-9a-f]{64}$/);
  });

  it("refuses the author before asking for a password, and the database refuses an author's release signature", async () => {
    const author = await setPassword(await makeUser("engineer", "Rhea Writer"), "author-pass-1");
    const { versionId } = await createProcedure(author, draftOf("T-REL-2"));
    await submitForReview(author, versionId);
    await expect(signAndReleaseVersion(author, versionId, "author-pass-1")).rejects.toThrow(/second engineer/);
    await expect(
      sql`insert into electronic_signature (signer_id, printed_name, meaning, entity_type, entity_id, record_sha256)
          values (${author.id}, 'Rhea Writer', 'released', 'procedure-version', ${versionId}, ${"a".repeat(64)})`.execute(getDb()),
    ).rejects.toThrow(/second engineer must release/);
  });

  it("e-mails the engineers who may release it when a version is submitted, never its author", async () => {
    const author = await makeUser("engineer", "Rhea Writer");
    await makeUser("engineer", "Olu Releaser");
    const { versionId } = await createProcedure(author, draftOf("T-REL-3"));
    await submitForReview(author, versionId);
    const mail = await getDb().selectFrom("mail_message").selectAll().where("entity_id", "=", versionId).execute();
    expect(mail).toHaveLength(1);
    expect(mail[0]!.kind).toBe("procedure-awaiting-release");
    expect(mail[0]!.recipients).toContain("engineer-olu-releaser@test.example");
    expect(mail[0]!.recipients).not.toContain(author.email);
    expect(mail[0]!.subject).toBe("Procedure T-REL-3 version 1 waits for release");
  });
});
