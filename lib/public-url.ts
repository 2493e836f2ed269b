/**
 * The address people reach the workbench at, for links in e-mails and the certificate's QR code.
 * Set CELLWRIGHT_PUBLIC_URL in production (e.g. https://lab.example); the scripts set it locally.
 */
export function getPublicBaseUrl(): string {
  const configured = process.env.CELLWRIGHT_PUBLIC_URL?.trim();
  return (configured && configured.length > 0 ? configured : "http://localhost:3000").replace(/\/+$/, "");
}

/** Absolute address of a path of the workbench, e.g. publicUrl("/check/C-00001"). */
export function publicUrl(path: string): string {
  return `${getPublicBaseUrl()}${path.startsWith("/") ? path : `/${path}`}`;
}
