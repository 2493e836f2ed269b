import { describe, expect, it } from "vitest";
import { describeUnstorableText, fieldInWords, findUnstorableText, parseJsonSafely, TOO_DEEP } from "@/lib/security/unstorable-text";
import { findUnstorableInRequest } from "@/lib/security/request-text-check";

function nested(levels: number): unknown {
  let node: unknown = { type: "text", text: "x" };
  for (let i = 0; i < levels; i++) node = { type: "paragraph", content: [node] };
  return { type: "doc", content: [node] };
}

// Issue 11 row 7: NUL, lone surrogates, year 0000, ?q=%00 and rich text 1 000 deep answered 500.
describe("text that cannot be stored", () => {
  it.each([
    [{ supplier: "Cells\u0000Ltd" }, "supplier", "nul"],
    [{ displayName: "Ana \uD800" }, "displayName", "surrogate"],
    [{ note: "end \uDC00" }, "note", "surrogate"],
    [{ receivedOn: "0000-01-01" }, "receivedOn", "year-zero"],
    [{ steps: [{ label: "ok" }, { label: "bad\u0000" }] }, "steps.1.label", "nul"],
    [{ "1_instructions": JSON.stringify({ type: "doc", content: [{ type: "text", text: "\u0000" }] }) }, "1_instructions", "nul"],
  ])("finds %j", (value, path, problem) => {
    expect(findUnstorableText(value)).toEqual({ path, problem });
  });

  it("lets ordinary text through: emoji (a proper surrogate pair), dates, deep-enough documents", () => {
    expect(findUnstorableText({ note: "ok 🔋 ✓", date: "2026-12-04", at: "2026-12-04T10:00:00Z", doc: nested(20) })).toBeNull();
  });

  it("refuses rich text nested 1 000 deep without exhausting the stack, as JSON text or inside a form field", () => {
    const text = JSON.stringify(nested(1000));
    expect(parseJsonSafely(text)).toBe(TOO_DEEP);
    expect(findUnstorableText({ "1_cautions": text })).toEqual({ path: "1_cautions", problem: "too-deep" });
    const deepText = "[".repeat(100_000) + "]".repeat(100_000);
    expect(parseJsonSafely(deepText)).toBe(TOO_DEEP);
  });

  it("names the field in words", () => {
    expect(fieldInWords("1_displayName")).toBe("display name");
    expect(fieldInWords("data.ratedCapacityMah")).toBe("rated capacity mah");
    expect(fieldInWords("steps.1.label")).toBe("label");
    expect(describeUnstorableText({ path: "1_supplier", problem: "nul" })).toBe(
      "The field “supplier” contains a NUL character (U+0000), which cannot be stored. Nothing was saved.",
    );
  });

  it("looks through query strings, JSON bodies and forms of a request", async () => {
    expect(await findUnstorableInRequest(new Request("http://x/procedures?q=%00"))).toEqual({ path: "q", problem: "nul" });
    const json = new Request("http://x/api/specs", { method: "POST", headers: { "content-type": "application/json" }, body: '{"maker":"A\\u0000"}' });
    expect(await findUnstorableInRequest(json)).toEqual({ path: "maker", problem: "nul" });
    const form = new FormData();
    form.set("1_supplier", "ok");
    form.set("1_receivedOn", "0000-05-01");
    expect(await findUnstorableInRequest(new Request("http://x/lots/new", { method: "POST", body: form }))).toEqual({ path: "1_receivedOn", problem: "year-zero" });
    const fine = new Request("http://x/api/specs", { method: "POST", headers: { "content-type": "application/json" }, body: '{"maker":"Quillon"}' });
    expect(await findUnstorableInRequest(fine)).toBeNull();
  });
});
