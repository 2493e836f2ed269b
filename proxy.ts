import { NextResponse, type NextRequest } from "next/server";
import { isSameOrigin } from "@/lib/auth/origin";
import { recordForeignOrigin } from "@/lib/auth/foreign-origin";

/**
 * Runs before every request. It only refuses writes from a foreign origin (CSRF) and passes the
 * path on for sign-in redirects; authorisation happens in each page, handler and action.
 */
export async function proxy(request: NextRequest) {
  const method = request.method.toUpperCase();
  if (method !== "GET" && method !== "HEAD" && method !== "OPTIONS") {
    const origin = request.headers.get("origin");
    const host = request.headers.get("x-forwarded-host") ?? request.headers.get("host");
    if (!isSameOrigin(origin, host)) {
      await recordForeignOrigin({ method, path: request.nextUrl.pathname, origin, host });
      return NextResponse.json(
        { error: { code: "foreign-origin", message: "This request came from another site and was refused." } },
        { status: 403 },
      );
    }
  }
  const headers = new Headers(request.headers);
  headers.set("x-cellwright-path", request.nextUrl.pathname + request.nextUrl.search);
  return NextResponse.next({ request: { headers } });
}

/**
 * The uploads (a log up to 200 MB, a datasheet up to 10 MB) are left out: the proxy would buffer their
 * bodies, and cut them at its own limit. Those routes make the same origin check themselves before they
 * read a byte, and count the body as it arrives (lib/api/limited-body.ts).
 * The public certificate check is left out too: it changes nothing, needs no session, and an
 * assessor may call it from a script (`curl --data-binary @certificate.pdf`), which sends no Origin.
 */
export const config = {
  matcher: ["/((?!_next/static|_next/image|favicon.ico|api/runs/[^/]+/logs$|api/specs/[^/]+/datasheet$|api/check/).*)"],
};
