/**
 * Runs once when a Next.js server starts: each app process sends the outbox's due mail and queues
 * the calibration reminders in the background (lib/mail/dispatch.ts). Not in the edge runtime, not
 * while building. The import stays inside the check so the bundler leaves it out of the edge build.
 */
export async function register(): Promise<void> {
  if (process.env.NEXT_RUNTIME === "nodejs" && process.env.NEXT_PHASE !== "phase-production-build") {
    const { startMailDispatchLoop } = await import("./lib/mail/dispatch");
    startMailDispatchLoop();
  }
}
