import { ROLE_LABELS } from "../lib/auth/permissions";
import { DEMO_LAB, DEMO_USERS } from "../scenarios/demo-lab";

const url = process.argv[2] ?? "http://localhost:3000";
console.log(`\nCellwright is running at ${url}  (${DEMO_LAB.name}, an invented demo lab)\n`);
console.log("Demo accounts:");
for (const u of DEMO_USERS) {
  console.log(`  ${ROLE_LABELS[u.role].padEnd(17)} ${u.email.padEnd(32)} ${u.password}`);
}
console.log("");
