import { NextResponse, type NextRequest } from "next/server";
import { isSameOrigin } from "@/lib/auth/origin";
import { recordForeignOrigin } from "@/lib/auth/foreign-origin";
import { SESSION_COOKIE, sessionCookieAttributes, slideSession } from "@/lib/auth/session-cookie";
import { findUnstorableInRequest } from "@/lib/security/request-text-check";
import { contentSecurityPolicy, securityHeaders } from "@/lib/security/security-headers";
import { describeUnstorableText, UNSTORABLE_HEADER } from "@/lib/security/unstorable-text";

/**
 * Runs before every request. It refuses writes from a foreign origin (CSRF) and text the database
 * cannot store, sets the security headers (a fresh CSP nonce per request) and passes the path on for
 * sign-in redirects; authorisation happens in each page, handler and action.
 */
export async function proxy(request: NextRequest) {
  const method = request.method.toUpperCase();
  const https = request.nextUrl.protocol === "https:" || request.headers.get("x-forwarded-proto") === "https";
  const nonce = Buffer.from(crypto.getRandomValues(new Uint8Array(16))).toString("base64");
  const csp = contentSecurityPolicy(nonce, { dev: process.env.NODE_ENV === "development" });
  const finish = (response: NextResponse) => {
    response.headers.set("content-security-policy", csp);
    for (const [name, value] of Object.entries(securityHeaders({ https }))) response.headers.set(name, value);
    return response;
  };

  if (method !== "GET" && method !== "HEAD" && method !== "OPTIONS") {
    const origin = request.headers.get("origin");
    const host = request.headers.get("x-forwarded-host") ?? request.headers.get("host");
    if (!isSameOrigin(origin, host)) {
      await recordForeignOrigin({ method, path: request.nextUrl.pathname, origin, host });
      return finish(
        NextResponse.json({ error: { code: "foreign-origin", message: "This request came from another site and was refused." } }, { status: 403 }),
      );
    }
  }

  const headers = new Headers(request.headers);
  headers.delete(UNSTORABLE_HEADER);
  const unstorable = await findUnstorableInRequest(request);
  if (unstorable) {
    const message = describeUnstorableText(unstorable, { saving: method !== "GET" && method !== "HEAD" });
    if (request.headers.has("next-action")) {
      // A server action answers in its own format: it reads this and refuses with the message.
      headers.set(UNSTORABLE_HEADER, encodeURIComponent(JSON.stringify({ field: unstorable.path, message })));
    } else if (request.nextUrl.pathname.startsWith("/api/")) {
      return finish(NextResponse.json({ error: { code: "invalid", message, fields: [{ path: unstorable.path, message }] } }, { status: 422 }));
    } else {
      return finish(new NextResponse(refusalPage(message), { status: 422, headers: { "content-type": "text/html; charset=utf-8" } }));
    }
  }

  headers.set("x-cellwright-path", request.nextUrl.pathname + request.nextUrl.search);
  headers.set("x-nonce", nonce);
  headers.set("content-security-policy", csp);
  const response = NextResponse.next({ request: { headers } });
  await followSession(request, response);
  return finish(response);
}

/**
 * The session cookie expires with its session, and both slide while the person works. Only on reads:
 * sign-in and sign-out (actions, POST) set the cookie themselves and must have the last word. An
 * unknown or ended session is left to the session check, which removes its cookie.
 */
async function followSession(request: NextRequest, response: NextResponse): Promise<void> {
  const sessionId = request.cookies.get(SESSION_COOKIE)?.value;
  if (!sessionId || (request.method !== "GET" && request.method !== "HEAD")) return;
  try {
    const expires = await slideSession(sessionId);
    if (expires) response.cookies.set(SESSION_COOKIE, sessionId, sessionCookieAttributes(expires));
  } catch {
    // The database is unreachable: the page itself says so; the cookie stays as it is.
  }
}

function refusalPage(message: string): string {
  const text = message.replace(/[&<>"]/g, (c) => `&#${c.charCodeAt(0)};`);
  return `<!doctype html><html lang="en"><head><meta charset="utf-8"><title>Not accepted</title></head><body style="font-family:sans-serif;max-width:40rem;margin:3rem auto;padding:0 1rem"><h1>This address was not accepted</h1><p>${text}</p><p><a href="/">Back to the workbench</a></p></body></html>`;
}

/**
 * The uploads (a log up to 200 MB, a datasheet up to 10 MB) are left out: the proxy would buffer their
 * bodies, and cut them at its own limit. Those routes make the same origin check themselves before they
 * read a byte, and count the body as it arrives (lib/api/limited-body.ts).
 * The public certificate check is left out too: it changes nothing, needs no session, and an
 * assessor may call it from a script (`curl --data-binary @certificate.pdf`), which sends no Origin.
 * The cycler's part route is the one write left out on purpose: a cycler PC sends a bearer token, no
 * cookie and no Origin; its handler admits nothing but a token (ROUTE_ACCESS "machine-token"), and
 * tests/e2e/cycler-tokens.spec.ts proves a session cannot use it and the token opens nothing else.
 */
export const config = {
  matcher: ["/((?!_next/static|_next/image|favicon.ico|api/runs/[^/]+/logs$|api/runs/[^/]+/log-parts$|api/specs/[^/]+/datasheet$|api/check/|api/channel/log-parts$).*)"],
};
