import { readdirSync, readFileSync, statSync } from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { ROUTE_ACCESS } from "@/lib/auth/route-access";

// Access is written once, in ROUTE_ACCESS; these checks read the code to see that every entry point reads it.
const APP = path.join(process.cwd(), "app");
type Entry = { file: string; pattern: string; kind: "page" | "route" | "layout" | "actions" };

function walk(dir = APP, segments: string[] = []): Entry[] {
  const found: Entry[] = [];
  for (const name of readdirSync(dir)) {
    const full = path.join(dir, name);
    if (statSync(full).isDirectory()) {
      if (name.startsWith("_")) continue;
      found.push(...walk(full, name.startsWith("(") && name.endsWith(")") ? segments : [...segments, name]));
      continue;
    }
    const kind = ({ "page.tsx": "page", "route.ts": "route", "layout.tsx": "layout", "actions.ts": "actions" } as const)[name];
    if (kind) found.push({ file: path.relative(process.cwd(), full), pattern: `/${segments.join("/")}`, kind });
  }
  return found;
}

const entries = walk();
const read = (e: Entry) => readFileSync(e.file, "utf8");
const exportedMethods = (source: string) =>
  (["GET", "POST", "PUT", "PATCH", "DELETE"] as const).filter((m) => new RegExp(`export (const|async function) ${m}\\b`).test(source));

describe("access written once", () => {
  it("every page calls requirePageAccess with its own route pattern", () => {
    const wrong = entries.filter((e) => e.kind === "page" && !read(e).includes(`requirePageAccess("${e.pattern}")`));
    expect(wrong.map((e) => `${e.file} should call requirePageAccess("${e.pattern}")`)).toEqual([]);
  });

  it("every route handler method goes through apiRoute with its own pattern and method", () => {
    const wrong = entries
      .filter((e) => e.kind === "route")
      .flatMap((e) => exportedMethods(read(e)).filter((m) => !read(e).includes(`apiRoute("${e.pattern}", "${m}"`)).map((m) => `${m} ${e.file}`));
    expect(wrong).toEqual([]);
  });

  it("a layout that guards its area names its own folder", () => {
    const wrong = entries.filter((e) => e.kind === "layout" && /requireAreaAccess\(/.test(read(e)) && !read(e).includes(`requireAreaAccess("${e.pattern}")`));
    expect(wrong.map((e) => e.file)).toEqual([]);
  });

  it("no page or layout writes a permission by hand", () => {
    const literal = entries.filter((e) => /requirePagePermission\(|requireActionPermission\(/.test(read(e)));
    expect(literal.map((e) => e.file)).toEqual([]);
  });

  it("every pattern in the table exists on disk", () => {
    const onDisk = new Set(entries.filter((e) => e.kind === "page" || e.kind === "route").map((e) => e.pattern));
    expect(Object.keys(ROUTE_ACCESS).filter((p) => !onDisk.has(p))).toEqual([]);
  });

  it("no route handler re-checks roles by hand", () => {
    const byHand = entries.filter((e) => e.kind === "route" && /can\(user\.role, "[^"]+"\)\s*(&&|\|\|)|throw new DomainError\("forbidden"/.test(read(e)));
    expect(byHand.map((e) => e.file)).toEqual([]);
  });
});

describe("every server action is built with serverAction", () => {
  const files = entries.filter((e) => e.kind === "actions");

  it("finds the action files", () => expect(files.length).toBeGreaterThan(10));

  for (const e of files) {
    it(e.file, () => {
      const source = read(e);
      const exported = [...source.matchAll(/^export\s+(?:async\s+)?(?:const|function|let|var)\s+(\w+)/gm)].map((m) => m[1]!);
      const wrapped = new Set([...source.matchAll(/^export const (\w+)\s*=\s*serverAction(?:\.withArgument|\.plain|\.read)?\(/gm)].map((m) => m[1]!));
      const bare = exported.filter((name) => !wrapped.has(name));
      expect(bare.map((name) => `${name} in ${e.file} is not built with serverAction`)).toEqual([]);
      expect(exported.length).toBeGreaterThan(0);
    });
  }
});
