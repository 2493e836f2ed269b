import "server-only";
import { isIP } from "node:net";
import nodemailer from "nodemailer";

/**
 * Where the lab's mail goes. SMTP_HOST names the lab's mail server (the scripts point it at the
 * local catcher on 127.0.0.1); without it nothing is sent and messages wait in the outbox.
 * SMTP_USER / SMTP_PASSWORD are for a server that wants a sign-in; port 465 (or SMTP_SECURE=true)
 * means TLS from the first byte.
 */
export interface MailSettings {
  host: string;
  port: number;
  from: string;
  secure: boolean;
  auth: { user: string; pass: string } | null;
}

const DEFAULT_FROM = "Cellwright <cellwright@localhost>";

export function readMailSettings(env: Readonly<Record<string, string | undefined>> = process.env): MailSettings | null {
  const host = env.SMTP_HOST?.trim();
  if (!host) return null;
  const port = Number(env.SMTP_PORT?.trim() || 587);
  if (!Number.isInteger(port) || port < 1 || port > 65_535) throw new Error(`SMTP_PORT must be a port number, not "${env.SMTP_PORT}"`);
  const user = env.SMTP_USER?.trim();
  return {
    host,
    port,
    from: env.MAIL_FROM?.trim() || DEFAULT_FROM,
    secure: env.SMTP_SECURE === "true" || port === 465,
    auth: user ? { user, pass: env.SMTP_PASSWORD ?? "" } : null,
  };
}

/** 127.0.0.0/8, ::1 and localhost: the machine itself, where the mail catcher listens. */
export function isLoopbackHost(host: string): boolean {
  const h = host.trim().toLowerCase().replace(/^\[(.*)\]$/, "$1");
  if (h === "localhost" || h.endsWith(".localhost")) return true;
  if (isIP(h) === 4) return h.startsWith("127.");
  if (isIP(h) === 6) return h === "::1" || h === "0:0:0:0:0:0:0:1";
  return false;
}

/**
 * A nodemailer SMTP transport for the settings. The loopback catcher speaks no TLS, so TLS is
 * skipped there only; any other server must offer STARTTLS (or be on port 465), so messages never
 * cross a network in clear text.
 */
export function createMailTransport(settings: MailSettings) {
  const loopback = isLoopbackHost(settings.host);
  return nodemailer.createTransport({
    host: settings.host,
    port: settings.port,
    secure: settings.secure,
    ignoreTLS: loopback && !settings.secure,
    requireTLS: !loopback && !settings.secure,
    auth: settings.auth ?? undefined,
    // Short timeouts: a sender stuck on a dead server would hold up the rest of the outbox.
    connectionTimeout: 10_000,
    greetingTimeout: 10_000,
    socketTimeout: 30_000,
  });
}
