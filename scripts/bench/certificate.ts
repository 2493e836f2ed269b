/**
 * Certificate benchmark (`npm run bench`): render a certificate with the react-pdf document and sign it
 * with a lab key, as issuing does. Reports, does not assert; the target is a total under 1 s warm.
 * The fixture is the invented scenario of tests/unit/certificates: a clean run without uncertainty
 * budgets (two pages), and a run with a noted deviation and budgets (three pages).
 * `--preloaded` first does what a server does when it starts (preloadCertificateTools, from
 * instrumentation.ts), so "first" is the first certificate a started server makes; without it, "first"
 * also pays for loading react-pdf, the fonts and the signing packages (a process that never preloaded).
 */
import { performance } from "node:perf_hooks";
import { hashCanonicalJson } from "../../lib/certificates/canonical-json";
import { preloadCertificateTools } from "../../lib/certificates/preload-certificate-tools";
import { renderCertificatePdf } from "../../lib/certificates/render-certificate";
import { createSelfSignedP12 } from "../../lib/certificates/self-signed-p12";
import { signPdf } from "../../lib/certificates/sign-pdf";
import { buildFixturePayload } from "../../scenarios/run-certificate";

const WARM_RUNS = 10;
const TARGET_MS = 1000;

const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)] as number;
const ms = (x: number) => `${x.toFixed(0).padStart(5)} ms`;
const countPages = (pdf: Buffer) => (pdf.toString("latin1").match(/\/Type\s*\/Page\b(?!s)/g) ?? []).length;

async function time<T>(fn: () => Promise<T>): Promise<[T, number]> {
  const t = performance.now();
  const value = await fn();
  return [value, performance.now() - t];
}

const preloaded = process.argv.includes("--preloaded");
const p12 = createSelfSignedP12("Harbourside Cell Test Laboratory", "bench");
if (preloaded) console.log(`preloaded as a server does at start: ${ms(await preloadCertificateTools())} (before any request)`);
else console.log("not preloaded: the first certificate loads react-pdf, the fonts and the signing packages");
const identity = { p12, passphrase: "bench" };

const variants = [
  { name: "of a clean run, no budgets", uncertainty: false, deviation: false },
  { name: "with a deviation and budgets", uncertainty: true, deviation: true },
];
for (const [k, variant] of variants.entries()) {
  const { payload, curves } = buildFixturePayload({ uncertainty: variant.uncertainty, deviation: variant.deviation });
  const input = { payload, payloadSha256: hashCanonicalJson(payload), curves, checkUrl: "http://localhost:3000/check/C-00042", signingSubject: "Harbourside Cell Test Laboratory" };
  const sign = (pdf: Buffer) => signPdf(pdf, identity, { reason: "bench", name: "Harbourside Cell Test Laboratory", location: "Portmere", contactInfo: "", signingTime: new Date() });

  const [firstPdf, firstRender] = await time(() => renderCertificatePdf(input));
  const [firstSigned, firstSign] = await time(() => sign(firstPdf));
  const renders: number[] = [];
  const signs: number[] = [];
  const totals: number[] = [];
  for (let i = 0; i < WARM_RUNS; i++) {
    const [pdf, r] = await time(() => renderCertificatePdf(input));
    const [, s] = await time(() => sign(pdf));
    renders.push(r);
    signs.push(s);
    totals.push(r + s);
  }
  const total = median(totals);
  console.log(`certificate ${variant.name}: ${countPages(firstSigned)} pages, ${(firstSigned.byteLength / 1024).toFixed(0)} kB signed`);
  const note = k === 0 && !preloaded ? "  (includes importing react-pdf and unpacking the fonts)" : "";
  console.log(`  first:  render ${ms(firstRender)}  sign ${ms(firstSign)}  total ${ms(firstRender + firstSign)}${note}`);
  console.log(`  warm (median of ${WARM_RUNS}):  render ${ms(median(renders))}  sign ${ms(median(signs))}  total ${ms(total)}  target <= ${TARGET_MS} ms: ${total <= TARGET_MS ? "met" : "NOT met"}`);
}
