/**
 * Where to go after signing in: only a path on this site. Browsers read `/\host`, `/\t/host` and
 * `//host` as another site, so anything that does not resolve to this origin goes home.
 */
export function safeNextPath(value: unknown): string {
  if (typeof value !== "string" || value.length === 0 || value.length > 2000) return "/";
  if (!value.startsWith("/") || value.startsWith("//") || value.startsWith("/\\")) return "/";
  // Control characters and backslashes anywhere are stripped or reinterpreted by browsers; refuse them.
  if (/[\u0000-\u001f\u007f\\]/.test(value)) return "/";
  try {
    const base = "http://cellwright.invalid";
    const url = new URL(value, base);
    if (url.origin !== base) return "/";
    return url.pathname + url.search + url.hash;
  } catch {
    return "/";
  }
}
