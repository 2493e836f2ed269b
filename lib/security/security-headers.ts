/**
 * The headers every page and answer carries (issue 11 row 9). Scripts run only with this request's
 * nonce ('strict-dynamic' lets Next's own chunks load from them); styles may be inline because React
 * writes style attributes; nothing may frame the workbench; HSTS only when the request came over https,
 * so a plain-http demo on a laptop is not pinned to https.
 */
export function contentSecurityPolicy(nonce: string, opts: { dev: boolean }): string {
  return [
    "default-src 'self'",
    `script-src 'self' 'nonce-${nonce}' 'strict-dynamic'${opts.dev ? " 'unsafe-eval'" : ""}`,
    "style-src 'self' 'unsafe-inline'",
    "img-src 'self' blob: data:",
    "font-src 'self'",
    "connect-src 'self'",
    "object-src 'none'",
    "base-uri 'self'",
    "form-action 'self'",
    "frame-ancestors 'none'",
  ].join("; ");
}

export function securityHeaders(opts: { https: boolean }): Record<string, string> {
  return {
    "x-content-type-options": "nosniff",
    "referrer-policy": "strict-origin-when-cross-origin",
    "x-frame-options": "DENY",
    "cross-origin-opener-policy": "same-origin",
    "permissions-policy": "camera=(), microphone=(), geolocation=(), payment=()",
    ...(opts.https && { "strict-transport-security": "max-age=31536000; includeSubDomains" }),
  };
}
