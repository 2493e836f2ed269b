import { describe, expect, it } from "vitest";
import { encodeUploadMessage, readUploadMessages, throttleProgress } from "@/lib/runs/upload-progress";

describe("upload progress messages", () => {
  it("reads whole lines and keeps a cut line for later", () => {
    const text = encodeUploadMessage({ type: "progress", bytes: 10, rows: 2 }) + encodeUploadMessage({ type: "refused", error: { code: "time-backwards", message: "Line 4", line: 4 } });
    const cut = text.length - 5;
    const first = readUploadMessages(text.slice(0, cut));
    expect(first.messages).toEqual([{ type: "progress", bytes: 10, rows: 2 }]);
    const second = readUploadMessages(first.rest + text.slice(cut));
    expect(second.messages).toEqual([{ type: "refused", error: { code: "time-backwards", message: "Line 4", line: 4 } }]);
    expect(second.rest).toBe("");
  });

  it("reports an unreadable line as a failure instead of throwing", () => {
    const { messages } = readUploadMessages('<html>oops</html>\n{"type":"nope"}\n');
    expect(messages.map((m) => m.type)).toEqual(["failed", "failed"]);
  });

  it("sends progress at most once per interval", () => {
    let clock = 0;
    const sent: number[] = [];
    const send = throttleProgress<number>((v) => sent.push(v), 200, () => clock);
    for (let k = 0; k < 10; k++) {
      send(k);
      clock += 50;
    }
    expect(sent).toEqual([0, 4, 8]);
  });
});
