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
 * A log upload (up to 200 MB) is left out: the proxy would buffer its whole body. That route makes
 * the same origin check itself before it reads a byte (app/api/runs/[id]/logs/route.ts).
 * The public certificate check is left out too: it changes nothing, needs no session, and an
 * assessor may call it from a script (`curl --data-binary @certificate.pdf`), which sends no Origin.
 */
export const config = {
  matcher: ["/((?!_next/static|_next/image|favicon.ico|api/runs/[^/]+/logs$|api/check/).*)"],
};
