import { describe, expect, it } from "vitest";
import { isSameOrigin } from "@/lib/auth/origin";

describe("isSameOrigin", () => {
  it.each([
    ["http://localhost:3000", "localhost:3000", true],
    ["https://lab.example", "lab.example", true],
    ["http://LOCALHOST:3000", "localhost:3000", true],
    ["http://evil.example", "localhost:3000", false],
    ["http://localhost:3001", "localhost:3000", false],
    [null, "localhost:3000", false],
    ["null", "localhost:3000", false],
    ["http://localhost:3000", null, false],
  ])("origin %s to host %s → %s", (origin, host, expected) => {
    expect(isSameOrigin(origin, host)).toBe(expected);
  });
});
