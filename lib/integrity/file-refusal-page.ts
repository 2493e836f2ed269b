import "server-only";
import { isDomainError } from "@/lib/errors";

const escape = (s: string) => s.replace(/[&<>"']/g, (c) => `&#${c.charCodeAt(0)};`);

/** A link the person clicked (a page load), not a script's fetch: they should read a page, not JSON. */
function isNavigation(req: Request): boolean {
  return req.headers.get("sec-fetch-dest") === "document" || (req.headers.get("accept") ?? "").includes("text/html");
}

/**
 * Wraps a file download's handler: when a stored file is refused (changed or missing) and the request is
 * a click on a download link, the person gets a short page saying so in plain words, instead of a failed
 * download or a JSON body. API clients still get the usual JSON error from apiRoute.
 */
export function withFileRefusalPage<C>(handler: (req: Request, ctx: C) => Promise<Response>): (req: Request, ctx: C) => Promise<Response> {
  return async (req, ctx) => {
    try {
      return await handler(req, ctx);
    } catch (error) {
      if (!isDomainError(error) || error.code !== "integrity" || !isNavigation(req)) throw error;
      const html = `<!doctype html><html lang="en"><head><meta charset="utf-8"><title>File not handed out — Cellwright</title>
<meta name="viewport" content="width=device-width, initial-scale=1">
<style>body{font-family:system-ui,sans-serif;background:#faf7f0;color:#1f1d1a;max-width:44rem;margin:3rem auto;padding:0 1rem;line-height:1.5}
.box{border-left:4px solid #9b2c1f;background:#fff;padding:1rem 1.25rem}h1{font-family:Georgia,serif;font-size:1.4rem}a{color:#8a4a1c}</style></head>
<body><main><h1>This file is not handed out</h1><div class="box" role="alert"><p>${escape(error.message)}</p>
<p>Cellwright hands out a stored file only when its bytes match the SHA-256 recorded when it arrived, so that what you receive is what was uploaded or issued. An administrator sees this refusal under Administration → Integrity and can restore the file from a backup.</p></div>
<p><a href="javascript:history.back()">Back</a></p></main></body></html>`;
      return new Response(html, { status: error.status, headers: { "content-type": "text/html; charset=utf-8" } });
    }
  };
}
