/**
 * Runs once when a Next.js server starts: each app process sends the outbox's due mail and queues
 * the calibration reminders in the background (lib/mail/dispatch.ts), then loads the certificate tools
 * (react-pdf, the fonts, the PDF signing packages) so the first certificate is as fast as the next.
 * Not in the edge runtime, not while building. The imports stay inside the check so the bundler leaves
 * them out of the edge build. The preload is not awaited: the server answers while it runs, and a
 * certificate asked for meanwhile waits for the same loading (render-certificate.ts keeps one per process).
 */
export async function register(): Promise<void> {
  if (process.env.NEXT_RUNTIME === "nodejs" && process.env.NEXT_PHASE !== "phase-production-build") {
    const { startMailDispatchLoop } = await import("./lib/mail/dispatch");
    startMailDispatchLoop();
    if (process.env.CELLWRIGHT_PRELOAD_CERTIFICATE_TOOLS !== "0") {
      const { preloadCertificateTools } = await import("./lib/certificates/preload-certificate-tools");
      preloadCertificateTools().then(
        (ms) => console.log(`certificate tools loaded in ${Math.round(ms)} ms`),
        (error: unknown) => console.error("could not preload the certificate tools; the first certificate will load them", error),
      );
    }
  }
}
