import { readdirSync, readFileSync } from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";

// The layers import downwards only (DEVELOPERS.md, Layout): app → components → lib → db → protocols,
// and nothing that ships or seeds the demo imports test code.
const root = path.resolve(import.meta.dirname, "../..");

function listSourceFiles(dir: string): string[] {
  const out: string[] = [];
  for (const entry of readdirSync(path.join(root, dir), { withFileTypes: true })) {
    const rel = path.join(dir, entry.name);
    if (entry.isDirectory()) out.push(...listSourceFiles(rel));
    else if (/\.(ts|tsx|mts|mjs)$/.test(entry.name)) out.push(rel);
  }
  return out;
}

/** Every module specifier a file imports or re-exports, static or dynamic. */
export function listImports(source: string): string[] {
  const specifiers: string[] = [];
  const patterns = [/\bfrom\s+["']([^"']+)["']/g, /\bimport\s+["']([^"']+)["']/g, /\bimport\(\s*["']([^"']+)["']\s*\)/g];
  for (const pattern of patterns) for (const m of source.matchAll(pattern)) specifiers.push(m[1]!);
  return specifiers;
}

/** Where an import lands, as a path from the repository's root ("tests/support/x"), or null for a package. */
function resolveImport(file: string, specifier: string): string | null {
  if (specifier.startsWith("@/")) return specifier.slice(2);
  if (specifier.startsWith(".")) return path.relative(root, path.resolve(root, path.dirname(file), specifier));
  return null;
}

function findImportsInto(dirs: readonly string[], target: string): string[] {
  return dirs.flatMap((dir) =>
    listSourceFiles(dir).flatMap((file) =>
      listImports(readFileSync(path.join(root, file), "utf8"))
        .filter((specifier) => {
          const landed = resolveImport(file, specifier);
          return landed !== null && (landed === target || landed.startsWith(`${target}/`));
        })
        .map((specifier) => `${file} imports ${specifier}`),
    ),
  );
}

describe("layering", () => {
  it("reads imports of every form, and resolves relative ones", () => {
    const source = `import a from "@/tests/support/x";\nexport { b } from "../../tests/y";\nimport "./side";\nconst c = await import("../tests/z");`;
    expect(listImports(source)).toEqual(["@/tests/support/x", "../../tests/y", "./side", "../tests/z"]);
    expect(resolveImport("scripts/bench/a.ts", "../../tests/y")).toBe("tests/y");
    expect(resolveImport("scripts/a.ts", "zod")).toBeNull();
  });

  it("keeps the app, its libraries, the database layer and the scripts free of test code", () => {
    expect(findImportsInto(["app", "components", "lib", "db", "protocols", "scripts", "scenarios"], "tests")).toEqual([]);
  });

  it("keeps lib/, db/ and protocols/ free of components/ (not even their types)", () => {
    expect(findImportsInto(["lib", "db", "protocols"], "components")).toEqual([]);
  });
});
