// A local S3-compatible store on loopback for the demo and the tests (s3rver). Usage:
//   node scripts/s3-fake.mjs <port> <directory>
import S3rver from "s3rver";

const [port, directory] = process.argv.slice(2);
if (!port || !directory) {
  console.error("usage: node scripts/s3-fake.mjs <port> <directory>");
  process.exit(2);
}
const server = new S3rver({
  address: "127.0.0.1",
  port: Number(port),
  directory,
  silent: true,
  configureBuckets: [{ name: process.env.S3_BUCKET ?? "cellwright", configs: [] }],
});
await server.run();
console.log(`S3 fake listening on 127.0.0.1:${port}, data in ${directory}`);
for (const signal of ["SIGINT", "SIGTERM"]) {
  process.on(signal, () => server.close().then(() => process.exit(0)));
}
