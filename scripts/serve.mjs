// Serves the production build like `next start`, with one difference: the client address the app sees
// is the socket's peer, or what a configured trusted proxy says it is (scripts/client-address.mjs).
// `next start` keeps any X-Forwarded-For a client sends, so a forged header would count as the address.
// Usage: node scripts/serve.mjs -H 127.0.0.1 -p 3000
import { createServer } from "node:http";
import path from "node:path";
import { fileURLToPath } from "node:url";
import next from "next";
import { parseTrustedProxies, settleForwardingHeaders } from "./client-address.mjs";

const args = process.argv.slice(2);
const option = (flag, fallback) => {
  const i = args.indexOf(flag);
  return i >= 0 && args[i + 1] ? args[i + 1] : fallback;
};
const hostname = option("-H", "127.0.0.1");
const port = Number(option("-p", process.env.PORT ?? "3000"));
const dir = path.resolve(path.dirname(fileURLToPath(import.meta.url)), "..");
const trusted = parseTrustedProxies(process.env.CELLWRIGHT_TRUSTED_PROXIES);

process.env.NODE_ENV ??= "production";
const app = next({ dev: false, dir, hostname, port });
const handle = app.getRequestHandler();
await app.prepare();
createServer((req, res) => {
  settleForwardingHeaders(req.headers, req.socket.remoteAddress, trusted);
  void handle(req, res);
}).listen(port, hostname, () => {
  console.log(`▲ Cellwright on http://${hostname}:${port}${trusted.size ? ` (trusting forwarding headers from ${[...trusted].join(", ")})` : ""}`);
});
