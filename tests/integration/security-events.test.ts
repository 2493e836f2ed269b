import { describe, expect, it } from "vitest";
import { getDb } from "@/db";
import { listAuditEvents } from "@/db/audit";
import { OTHER_ORIGINS, ORIGINS_PER_WINDOW, recordForeignOrigin } from "@/lib/auth/foreign-origin";

// Issue 11 row 6: 50 foreign-origin POSTs in 2 s made 50 permanent audit rows with attacker-chosen text.
describe("refused cross-site requests", () => {
  it("counts a flood from one origin and audits it once, with the header text cut short", async () => {
    const origin = `http://evil.example/${"A".repeat(5000)}\u0000\n`;
    const at = new Date("2026-12-04T10:00:05Z");
    for (let i = 0; i < 50; i++) {
      await recordForeignOrigin({ method: "POST", path: "/admin/users", origin, host: "localhost:3000" }, new Date(at.getTime() + i * 40));
    }
    const events = await listAuditEvents(getDb(), { action: "security.foreign-origin-refused" });
    expect(events).toHaveLength(1);
    const detail = events[0]!.detail as { origin: string; path: string };
    expect(detail.origin.length).toBeLessThanOrEqual(200);
    expect(detail.origin).not.toMatch(/[\u0000\n]/);
    const tally = await getDb().selectFrom("refused_request_tally").select(["count", "origin"]).execute();
    expect(tally).toEqual([{ count: 50, origin: detail.origin }]);
  });

  it("caps the origins audited per window when the attacker varies the header", async () => {
    const at = new Date("2026-12-04T11:00:00Z");
    for (let i = 0; i < ORIGINS_PER_WINDOW + 15; i++) {
      await recordForeignOrigin({ method: "POST", path: "/", origin: `http://evil${i}.example`, host: "localhost:3000" }, at);
    }
    const rows = await getDb().selectFrom("refused_request_tally").select(["origin", "count"]).where("window_start", "=", at).execute();
    expect(rows).toHaveLength(ORIGINS_PER_WINDOW + 1);
    expect(rows.find((r) => r.origin === OTHER_ORIGINS)?.count).toBe(15);
    const events = await getDb().selectFrom("audit_event").select("id").where("action", "=", "security.foreign-origin-refused").where("at", ">=", new Date(Date.now() - 60_000)).execute();
    expect(events.length).toBeLessThanOrEqual(1 + ORIGINS_PER_WINDOW + 1);
  });
});
