import { describe, expect, it } from "vitest";
import { checkPassword } from "@/lib/auth/password-policy";
import { createUserSchema } from "@/lib/auth/user-admin";
import { DEMO_USERS } from "@/scenarios/demo-lab";

// Issue 11 row 8: "aaaaaaaaaa", "1234567890" and ten spaces were accepted as passwords.
describe("password policy", () => {
  it.each([
    ["aaaaaaaaaa", /at least 12 characters/],
    ["1234567890", /at least 12 characters/],
    [" ".repeat(10), /at least 12 characters/],
    ["aaaaaaaaaaaa", /more than one or two different characters/],
    [" ".repeat(14), /more than one or two different characters/],
    ["ababababababab", /more than one or two different characters/],
    ["123456789012", /found in breaches/],
    ["qwerty123456", /found in breaches/],
    ["Password1234", /found in breaches/],
  ])("refuses %j", (password, reason) => {
    expect(checkPassword(password)).toMatch(reason);
  });

  it("refuses a password containing the account's e-mail or its name part", () => {
    expect(checkPassword("priya.raman spring 2026", { email: "priya.raman@brackwater.example" })).toMatch(/e-mail address/);
    expect(checkPassword("x PRIYA.RAMAN@BRACKWATER.EXAMPLE", { email: "priya.raman@brackwater.example" })).toMatch(/e-mail address/);
    const parsed = createUserSchema.safeParse({ email: "noor.newcomer@lab.example", displayName: "Noor", role: "operator", password: "noor.newcomer is here" });
    expect(parsed.error?.issues.map((i) => [i.path.join("."), i.message])).toEqual([["password", expect.stringMatching(/e-mail address/)]]);
  });

  it("accepts passphrases of ordinary words, and every demo account's password", () => {
    expect(checkPassword("correct horse battery staple")).toBeNull();
    expect(checkPassword("Zelle lädt bei 20 °C")).toBeNull();
    for (const u of DEMO_USERS) expect(checkPassword(u.password, { email: u.email }), u.email).toBeNull();
  });
});
