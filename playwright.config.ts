import { defineConfig } from "@playwright/test";

// Browser tests run against a production build on its own port and the test database
// (scripts/test.sh prepares both); Debian's Chromium, never a downloaded browser.
const port = Number(process.env.E2E_PORT ?? 3100);
const baseURL = `http://localhost:${port}`;

export default defineConfig({
  testDir: "tests/e2e",
  fullyParallel: false,
  workers: 1,
  retries: 0,
  timeout: 30_000,
  expect: { timeout: 7_000 },
  reporter: [["list"]],
  outputDir: "test-results",
  use: {
    baseURL,
    trace: "retain-on-failure",
    screenshot: "only-on-failure",
    launchOptions: {
      executablePath: "/usr/bin/chromium",
      args: [
        "--no-sandbox",
        "--disable-gpu",
        "--disable-dev-shm-usage",
        "--disable-background-networking",
        "--disable-component-update",
        "--disable-sync",
        "--no-first-run",
        "--disable-quic",
      ],
    },
  },
  webServer: {
    command: `node scripts/serve.mjs -H 127.0.0.1 -p ${port}`,
    url: `${baseURL}/api/health`,
    reuseExistingServer: false,
    timeout: 60_000,
    stdout: "pipe",
    stderr: "pipe",
    env: {
      DATABASE_URL: process.env.E2E_DATABASE_URL ?? "",
      S3_ENDPOINT: process.env.S3_ENDPOINT ?? "",
      S3_BUCKET: process.env.S3_BUCKET ?? "cellwright",
      S3_ACCESS_KEY_ID: process.env.S3_ACCESS_KEY_ID ?? "",
      S3_SECRET_ACCESS_KEY: process.env.S3_SECRET_ACCESS_KEY ?? "",
      // Links in e-mails and certificates point at the app under test.
      CELLWRIGHT_PUBLIC_URL: baseURL,
      // The test mail catcher (scripts/test.sh starts it); the outbox is sent every 2 s, not 30 s.
      SMTP_HOST: process.env.SMTP_HOST ?? "",
      SMTP_PORT: process.env.SMTP_PORT ?? "",
      MAIL_FROM: process.env.MAIL_FROM ?? "",
      MAIL_CATCHER_URL: process.env.MAIL_CATCHER_URL ?? "",
      MAIL_DISPATCH_INTERVAL_MS: "2000",
      // Shared by every app server of an installation (scripts/env.sh makes them; docs/deployment.md).
      CELLWRIGHT_SIGNING_KEY_ENCRYPTION_KEY: process.env.CELLWRIGHT_SIGNING_KEY_ENCRYPTION_KEY ?? "",
      NEXT_SERVER_ACTIONS_ENCRYPTION_KEY: process.env.NEXT_SERVER_ACTIONS_ENCRYPTION_KEY ?? "",
      NEXT_TELEMETRY_DISABLED: "1",
    },
  },
});
