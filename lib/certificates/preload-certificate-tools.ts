import { randomBytes } from "node:crypto";
import { renderWarmUpPdf } from "./render-certificate";
import { createSelfSignedP12 } from "./self-signed-p12";
import { signPdf } from "./sign-pdf";

/**
 * Makes the first certificate of a process as fast as the next: loads react-pdf, unpacks and parses the
 * Merriweather faces, lays out a page and signs it with a throwaway key (loading pdf-lib, @signpdf and
 * node-forge), so none of that is paid inside the first issuing request. Started by instrumentation.ts
 * when a server starts; the lab's own key is not touched (it is read from the database on first use).
 * Returns how long it took, in milliseconds.
 */
export async function preloadCertificateTools(): Promise<number> {
  const started = performance.now();
  // Twice: the second pass runs the layout code once more, now compiled, and costs a fraction of the first.
  await renderWarmUpPdf();
  const unsigned = await renderWarmUpPdf();
  const passphrase = randomBytes(12).toString("hex");
  const identity = { p12: createSelfSignedP12("Cellwright warm-up (never used for certificates)", passphrase), passphrase };
  await signPdf(unsigned, identity, { reason: "warm-up", name: "warm-up", location: "", contactInfo: "", signingTime: new Date() });
  return performance.now() - started;
}
