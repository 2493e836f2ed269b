// A local S3-compatible store on loopback for the demo and the tests (s3rver behind scripts/s3-fake-guard.mjs:
// signed requests only, objects stored exactly as sent). Usage:
//   S3_ACCESS_KEY_ID=… S3_SECRET_ACCESS_KEY=… node scripts/s3-fake.mjs <port> <directory>
import S3rver from "s3rver";
import AWSAccount from "s3rver/lib/models/account.js";
import { s3Guard } from "./s3-fake-guard.mjs";

const [port, directory] = process.argv.slice(2);
const keys = { accessKeyId: process.env.S3_ACCESS_KEY_ID, secretAccessKey: process.env.S3_SECRET_ACCESS_KEY };
if (!port || !directory || !keys.accessKeyId || !keys.secretAccessKey) {
  console.error("usage: S3_ACCESS_KEY_ID=… S3_SECRET_ACCESS_KEY=… node scripts/s3-fake.mjs <port> <directory>");
  process.exit(2);
}
// s3rver knows one built-in key pair; replace it with ours so no other key opens the store.
AWSAccount.DUMMY_ACCOUNT.revokeAccessKey("S3RVER");
AWSAccount.DUMMY_ACCOUNT.createKeyPair(keys.accessKeyId, keys.secretAccessKey);
const server = new S3rver({
  address: "127.0.0.1",
  port: Number(port),
  directory,
  silent: true,
  configureBuckets: [{ name: process.env.S3_BUCKET ?? "cellwright", configs: [] }],
});
// First in the chain: nothing reaches s3rver unsigned, and uploads arrive decoded and checked.
server.middleware.unshift(s3Guard(keys));
await server.run();
console.log(`S3 fake listening on 127.0.0.1:${port}, data in ${directory}`);
for (const signal of ["SIGINT", "SIGTERM"]) {
  process.on(signal, () => server.close().then(() => process.exit(0)));
}
