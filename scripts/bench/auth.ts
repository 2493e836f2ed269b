import { hash, verify } from "@node-rs/argon2";
import { performance } from "node:perf_hooks";

// Sign-in cost: argon2id at the parameters lib/auth/password.ts uses (OWASP minimum).
const OPTIONS = { memoryCost: 19456, timeCost: 2, parallelism: 1, outputLen: 32 } as const;

function median(xs: number[]): number {
  const s = [...xs].sort((a, b) => a - b);
  return s[Math.floor(s.length / 2)]!;
}

const runs = 15;
const hashTimes: number[] = [];
const verifyTimes: number[] = [];
let h = "";
for (let i = 0; i < runs; i++) {
  let t = performance.now();
  h = await hash(`bench password ${i}`, OPTIONS);
  hashTimes.push(performance.now() - t);
  t = performance.now();
  await verify(h, `bench password ${i}`);
  verifyTimes.push(performance.now() - t);
}
console.log(`argon2id hash:   median ${median(hashTimes).toFixed(1)} ms over ${runs}`);
console.log(`argon2id verify: median ${median(verifyTimes).toFixed(1)} ms over ${runs} (one sign-in)`);
