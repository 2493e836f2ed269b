import { readdirSync, readFileSync, statSync } from "node:fs";
import path from "node:path";
import pg from "pg";
import { routeAccess, type Access, type HttpMethod } from "../../lib/auth/route-access";

// The routes on disk and real sample records for their dynamic segments, shared by the route × role
// matrix and the plain-words scan (both walk every page).

export type Found = { route: string; kind: "page" | "api"; methods: HttpMethod[] };

/** Every page and route handler under app/, as URL patterns (route groups dropped), with its methods. */
export function discoverRoutes(dir = path.join(process.cwd(), "app"), segments: string[] = []): Found[] {
  const found: Found[] = [];
  for (const entry of readdirSync(dir)) {
    const full = path.join(dir, entry);
    if (statSync(full).isDirectory()) {
      if (entry.startsWith("_")) continue;
      const next = entry.startsWith("(") && entry.endsWith(")") ? segments : [...segments, entry];
      found.push(...discoverRoutes(full, next));
    } else if (entry === "page.tsx") {
      found.push({ route: `/${segments.join("/")}`, kind: "page", methods: ["GET"] });
    } else if (entry === "route.ts") {
      const source = readFileSync(full, "utf8");
      const methods = (["GET", "POST", "PUT", "PATCH", "DELETE"] as const).filter((m) =>
        new RegExp(`export (const|async function) ${m}\\b`).test(source),
      );
      found.push({ route: `/${segments.join("/")}`, kind: "api", methods: [...methods] });
    }
  }
  return found;
}

export function accessOf(route: string, method: HttpMethod): Access | undefined {
  return routeAccess(route, method);
}

/** Real records from the seeded e2e database, so dynamic routes answer for real. */
export async function sampleParams(): Promise<Record<string, string>> {
  const c = new pg.Client({ connectionString: process.env.E2E_DATABASE_URL });
  await c.connect();
  try {
    const proc = await c.query(`select p.id, v.number from procedure p join procedure_version v on v.procedure_id = p.id
      where v.status = 'released' order by p.code limit 1`);
    const spec = await c.query(`select id from cell_specification where datasheet_file_id is not null order by maker limit 1`);
    const instrument = await c.query(`select id from instrument order by identifier limit 1`);
    const lot = await c.query(`select id from lot order by identifier limit 1`);
    const specimen = await c.query(`select id from specimen order by identifier limit 1`);
    // The seeded demo run (scripts/seed-library.ts), planned with nothing recorded.
    const run = await c.query(`select id from run order by number limit 1`);
    const certificate = await c.query(`select number from certificate order by number limit 1`);
    return {
      procedure: proc.rows[0].id,
      n: String(proc.rows[0].number),
      spec: spec.rows[0].id,
      instrument: instrument.rows[0].id,
      lot: lot.rows[0].id,
      specimen: specimen.rows[0].id,
      run: run.rows[0].id,
      // The seeded certificate (scenarios/demo-lab.ts); a number never issued if there is none.
      certificate: certificate.rows[0]?.number ?? "C-99999",
      hasCertificate: String(certificate.rows.length > 0),
    };
  } finally {
    await c.end();
  }
}

export function toUrl(route: string, p: Record<string, string>): string {
  return route
    .replace("/procedures/[id]", `/procedures/${p.procedure}`)
    .replace("/specs/[id]", `/specs/${p.spec}`)
    .replace("/runs/[id]", `/runs/${p.run}`)
    .replace("/instruments/[id]", `/instruments/${p.instrument}`)
    .replace("/lots/[id]", `/lots/${p.lot}`)
    .replace("/specimens/[id]", `/specimens/${p.specimen}`)
    .replace("[number]", p.certificate!)
    .replace("[n]", p.n!)
    .replace(/\[(\w+)\]/, (_, name: string) => {
      throw new Error(`no sample value for [${name}] in ${route}: add one in route-matrix.spec.ts`);
    });
}
