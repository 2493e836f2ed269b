// Which address a request came from (issue 11 row 4). A forwarding header is the word of whoever sent
// it, so it is believed only from the proxies named in CELLWRIGHT_TRUSTED_PROXIES (default: none).

/** "::ffff:127.0.0.1" and "127.0.0.1" are one address. */
export function normaliseAddress(address) {
  const a = String(address ?? "").trim().toLowerCase();
  return a.startsWith("::ffff:") && a.includes(".") ? a.slice(7) : a;
}

/** The trusted proxies from a comma-separated setting: exact addresses. */
export function parseTrustedProxies(setting) {
  return new Set(String(setting ?? "").split(",").map(normaliseAddress).filter(Boolean));
}

/**
 * The client: the socket's peer, unless the peer is a trusted proxy; then the X-Forwarded-For entries
 * are read from the right (the nearest hop) and the first one that is not a trusted proxy is the client.
 */
export function resolveClientAddress(peer, forwardedFor, trusted) {
  const direct = normaliseAddress(peer) || "unknown";
  if (!trusted.has(direct)) return direct;
  const hops = String(forwardedFor ?? "").split(",").map(normaliseAddress).filter(Boolean);
  for (let i = hops.length - 1; i >= 0; i--) {
    if (!trusted.has(hops[i])) return hops[i];
  }
  return hops[0] ?? direct;
}

const FORWARDING_HEADERS = ["x-forwarded-for", "x-forwarded-host", "x-forwarded-proto", "x-forwarded-port", "x-real-ip", "forwarded"];

/**
 * Rewrites a Node request's headers before the app sees them: X-Forwarded-For becomes the one client
 * address; the other forwarding headers are kept only when a trusted proxy sent them.
 */
export function settleForwardingHeaders(headers, peer, trusted) {
  const fromProxy = trusted.has(normaliseAddress(peer));
  const client = resolveClientAddress(peer, headers["x-forwarded-for"], trusted);
  if (!fromProxy) for (const name of FORWARDING_HEADERS) delete headers[name];
  headers["x-forwarded-for"] = client;
  delete headers["x-real-ip"];
  return client;
}
