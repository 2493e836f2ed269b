import { findInString, findUnstorableText, parseJsonSafely, TOO_DEEP, type UnstorableText } from "./unstorable-text";

/**
 * Looks through a request's query and body for text that cannot be stored (lib/security/unstorable-text):
 * JSON bodies, server-action bodies (a form or a JSON list) and forms, field by field. Files are not text
 * and are left to their own checks. Reads a clone, so the route still gets the whole body.
 */
export async function findUnstorableInRequest(request: Request): Promise<UnstorableText | null> {
  const url = new URL(request.url);
  for (const [key, value] of url.searchParams) {
    const problem = findInString(value) ?? findInString(key);
    if (problem) return { path: key, problem };
  }
  const method = request.method.toUpperCase();
  if (method === "GET" || method === "HEAD" || method === "OPTIONS" || !request.body) return null;
  const type = (request.headers.get("content-type") ?? "").toLowerCase();
  if (type.startsWith("multipart/form-data") || type.startsWith("application/x-www-form-urlencoded")) {
    let form: FormData;
    try {
      form = await request.clone().formData();
    } catch {
      return null; // not a well-formed form: the route says so itself
    }
    for (const [key, value] of form) {
      if (typeof value !== "string") continue;
      const found = findUnstorableText(value, [key]);
      if (found) return found;
    }
    return null;
  }
  if (type.startsWith("application/json") || type.startsWith("text/plain") || type === "") {
    const text = await request.clone().text();
    const parsed = parseJsonSafely(text);
    if (parsed === TOO_DEEP) return { path: "", problem: "too-deep" };
    if (parsed === undefined) {
      const problem = findInString(text);
      return problem && problem !== "year-zero" ? { path: "", problem } : null;
    }
    return findUnstorableText(parsed);
  }
  return null;
}
