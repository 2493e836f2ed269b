// `npm run verify [demo|test]`: walks the audit trail's hash chain and reads every stored file back
// against its recorded SHA-256. Prints what is intact and names each broken row or file in plain words;
// exits 1 when anything is broken. Reads only.
import { getDb } from "../db";
import { closePool } from "../db/pool";
import { describeChainBreak, verifyAuditChain } from "../lib/integrity/verify-audit-chain";
import { verifyStoredFiles } from "../lib/integrity/verify-stored-files";

export async function main(): Promise<number> {
  const started = performance.now();
  const db = getDb();
  const chain = await verifyAuditChain(db);
  const chainMs = performance.now() - started;
  const files = await verifyStoredFiles(db);
  const filesMs = performance.now() - started - chainMs;

  if (chain.breaks.length === 0) {
    console.log(`Audit trail: intact, ${chain.rows} rows chained (${chainMs.toFixed(0)} ms).`);
    if (chain.head) console.log(`  Newest row: place ${chain.head.position}, hash ${chain.head.hash}`);
  } else {
    console.log(`Audit trail: BROKEN. ${chain.rows} rows read (${chainMs.toFixed(0)} ms). First broken link:`);
    console.log(`  ${describeChainBreak(chain.breaks[0]!)}`);
    for (const b of chain.breaks.slice(1)) console.log(`  then: ${describeChainBreak(b)}`);
  }
  const mb = (files.bytes / 1024 / 1024).toFixed(1);
  if (files.faults.length === 0) {
    console.log(`Stored files: all ${files.checked} match their recorded SHA-256 (${mb} MB read, ${filesMs.toFixed(0)} ms).`);
  } else {
    console.log(`Stored files: ${files.faults.length} of ${files.checked} do NOT match their recorded SHA-256 (${filesMs.toFixed(0)} ms):`);
    for (const f of files.faults) console.log(`  ${f.message} (recorded SHA-256 ${f.file.sha256})`);
  }
  return chain.breaks.length === 0 && files.faults.length === 0 ? 0 : 1;
}

if (import.meta.url === `file://${process.argv[1]}`) {
  main()
    .then(async (code) => {
      await closePool();
      process.exit(code);
    })
    .catch(async (error: unknown) => {
      console.error("verify could not run:", error instanceof Error ? error.message : error);
      await closePool().catch(() => {});
      process.exit(2);
    });
}
