import type { CertificateDocumentInput } from "./certificate-document";
import type { CertificatePayload } from "./certificate-payload";
import { createQrModules } from "./qr-modules";
import type { DischargeCurve } from "./vq-plot";

type DocumentModule = typeof import("./certificate-document");

const globalForPdf = globalThis as unknown as { cellwrightCertificateDocument?: Promise<DocumentModule> };

/** The react-pdf document module, imported once per process (its import costs 0.3–0.5 s, docs/stack.md). */
function loadDocumentModule(): Promise<DocumentModule> {
  globalForPdf.cellwrightCertificateDocument ??= import("./certificate-document").catch((error: unknown) => {
    globalForPdf.cellwrightCertificateDocument = undefined;
    throw error;
  });
  return globalForPdf.cellwrightCertificateDocument;
}

/** Renders the certificate PDF (unsigned) from its payload, the discharge curves and the check address. */
export async function renderCertificatePdf(input: {
  payload: CertificatePayload;
  payloadSha256: string;
  curves: DischargeCurve[];
  checkUrl: string;
  signingSubject: string;
}): Promise<Buffer> {
  const { renderCertificateDocument } = await loadDocumentModule();
  const documentInput: CertificateDocumentInput = { ...input, qr: createQrModules(input.checkUrl) };
  return renderCertificateDocument(documentInput);
}

/** The unsigned warm-up page (certificate-document.tsx): react-pdf loaded, fonts parsed, layout run once. */
export async function renderWarmUpPdf(): Promise<Buffer> {
  const { renderWarmUpDocument } = await loadDocumentModule();
  return renderWarmUpDocument(createQrModules("http://localhost/check/C-00000"));
}
