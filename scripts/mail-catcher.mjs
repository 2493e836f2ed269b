// A local stand-in for the lab's mail server, on loopback only, for the demo and the tests.
// It accepts every message over SMTP, keeps each as a JSON file and lists them over HTTP:
//   node scripts/mail-catcher.mjs <smtp-port> <http-port> <directory>
//   GET    http://127.0.0.1:<http-port>/messages   the messages, newest first
//   DELETE http://127.0.0.1:<http-port>/messages   empties the folder
// Port 0 picks a free port; the ports in use are printed on the first line of output.
import { randomBytes } from "node:crypto";
import { mkdir, readdir, readFile, rm, writeFile } from "node:fs/promises";
import { createServer } from "node:http";
import path from "node:path";
import { simpleParser } from "mailparser";
import { SMTPServer } from "smtp-server";

const HOST = "127.0.0.1";
const MAX_MESSAGE_BYTES = 5 * 1024 * 1024;

const [smtpPortArg, httpPortArg, directory] = process.argv.slice(2);
if (smtpPortArg === undefined || httpPortArg === undefined || !directory) {
  console.error("usage: node scripts/mail-catcher.mjs <smtp-port> <http-port> <directory>");
  process.exit(2);
}
await mkdir(directory, { recursive: true });

function addressesOf(field) {
  const list = Array.isArray(field) ? field : field ? [field] : [];
  return list.flatMap((a) => a.value.map((v) => v.address).filter(Boolean));
}

async function keepMessage(stream, session) {
  const parsed = await simpleParser(stream);
  const receivedAt = new Date();
  const id = `${receivedAt.getTime()}-${randomBytes(4).toString("hex")}`;
  const message = {
    id,
    receivedAt: receivedAt.toISOString(),
    from: session.envelope.mailFrom ? session.envelope.mailFrom.address : (addressesOf(parsed.from)[0] ?? ""),
    // The envelope says who the message was delivered to; the header's To line may differ (Bcc).
    to: session.envelope.rcptTo.map((r) => r.address),
    headerTo: addressesOf(parsed.to),
    subject: parsed.subject ?? "",
    text: parsed.text ?? "",
    messageId: parsed.messageId ?? null,
  };
  await writeFile(path.join(directory, `${id}.json`), JSON.stringify(message, null, 2));
  return message;
}

const smtp = new SMTPServer({
  authOptional: true,
  disabledCommands: ["STARTTLS"],
  size: MAX_MESSAGE_BYTES,
  banner: "Cellwright local mail catcher (loopback only; nothing is delivered onward)",
  onData(stream, session, callback) {
    keepMessage(stream, session).then(
      (m) => {
        console.log(`${m.receivedAt} caught "${m.subject}" for ${m.to.join(", ")}`);
        callback(null, `kept as ${m.id}`);
      },
      (error) => callback(error),
    );
  },
});
smtp.on("error", (error) => console.error("mail catcher SMTP error:", error.message));

async function listMessages() {
  const names = (await readdir(directory)).filter((n) => n.endsWith(".json"));
  const messages = await Promise.all(names.map(async (n) => JSON.parse(await readFile(path.join(directory, n), "utf8"))));
  return messages.sort((a, b) => (a.receivedAt < b.receivedAt ? 1 : a.receivedAt > b.receivedAt ? -1 : b.id.localeCompare(a.id)));
}

const http = createServer((req, res) => {
  const url = new URL(req.url ?? "/", `http://${HOST}`);
  const answer = (status, body) => {
    res.writeHead(status, { "content-type": "application/json; charset=utf-8", "cache-control": "no-store" });
    res.end(JSON.stringify(body));
  };
  if (url.pathname !== "/messages") return answer(404, { error: "only /messages is served" });
  if (req.method === "GET") {
    listMessages().then((m) => answer(200, m), (e) => answer(500, { error: e.message }));
  } else if (req.method === "DELETE") {
    readdir(directory)
      .then((names) => Promise.all(names.filter((n) => n.endsWith(".json")).map((n) => rm(path.join(directory, n), { force: true }))))
      .then((removed) => answer(200, { removed: removed.length }), (e) => answer(500, { error: e.message }));
  } else {
    answer(405, { error: "GET or DELETE" });
  }
});

const listen = (server, port) =>
  new Promise((resolve, reject) => {
    server.once("error", reject);
    server.listen(Number(port), HOST, () => resolve(server.server ? server.server.address().port : server.address().port));
  });

const smtpPort = await listen(smtp, smtpPortArg);
const httpPort = await listen(http, httpPortArg);
console.log(`mail catcher: SMTP ${HOST}:${smtpPort}, HTTP http://${HOST}:${httpPort}/messages, messages in ${directory}`);

for (const signal of ["SIGINT", "SIGTERM"]) {
  process.on(signal, () => {
    http.close();
    smtp.close(() => process.exit(0));
    setTimeout(() => process.exit(0), 2000).unref();
  });
}
