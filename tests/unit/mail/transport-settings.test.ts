import { describe, expect, it } from "vitest";
import { isLoopbackHost, readMailSettings } from "@/lib/mail/transport";

describe("isLoopbackHost", () => {
  it("knows this machine's addresses", () => {
    for (const h of ["127.0.0.1", "127.8.9.10", "localhost", "LOCALHOST", "::1", "[::1]", "mail.localhost"]) expect(isLoopbackHost(h), h).toBe(true);
  });

  it("treats every other host as a network one", () => {
    for (const h of ["10.0.0.5", "128.0.0.1", "smtp.example.org", "localhost.example.org", "::2", "0.0.0.0"]) expect(isLoopbackHost(h), h).toBe(false);
  });
});

describe("readMailSettings", () => {
  it("sends nothing without SMTP_HOST", () => {
    expect(readMailSettings({})).toBeNull();
    expect(readMailSettings({ SMTP_HOST: "  " })).toBeNull();
  });

  it("reads host, port, sender and sign-in; port 465 means TLS from the start", () => {
    expect(readMailSettings({ SMTP_HOST: "127.0.0.1", SMTP_PORT: "54343", MAIL_FROM: "Lab <lab@x.example>" })).toEqual({
      host: "127.0.0.1",
      port: 54343,
      from: "Lab <lab@x.example>",
      secure: false,
      auth: null,
    });
    expect(readMailSettings({ SMTP_HOST: "smtp.x.example", SMTP_PORT: "465", SMTP_USER: "lab", SMTP_PASSWORD: "pw" })).toMatchObject({
      port: 465,
      secure: true,
      auth: { user: "lab", pass: "pw" },
    });
  });

  it("refuses a port that is not one", () => {
    expect(() => readMailSettings({ SMTP_HOST: "x", SMTP_PORT: "smtp" })).toThrow(/SMTP_PORT/);
    expect(() => readMailSettings({ SMTP_HOST: "x", SMTP_PORT: "70000" })).toThrow(/SMTP_PORT/);
  });
});
