import nextVitals from "eslint-config-next/core-web-vitals";
import nextTs from "eslint-config-next/typescript";

const config = [
  ...nextVitals,
  ...nextTs,
  {
    // Migrations are typed Kysely<any> on purpose: they must not depend on today's schema type.
    files: ["migrations/**/*.ts"],
    rules: { "@typescript-eslint/no-explicit-any": "off" },
  },
  {
    // Layers import downwards only (tests/unit/layering.test.ts checks the same): lib/, db/ and protocols/
    // never reach up into components/, and nothing outside tests/ imports test code.
    files: ["lib/**/*.{ts,tsx}", "db/**/*.ts", "protocols/**/*.ts"],
    rules: {
      "no-restricted-imports": ["error", { patterns: [{ group: ["@/components/*", "**/components/*"], message: "lib/, db/ and protocols/ must not import from components/: move the type down into lib/." }, { group: ["@/tests/*", "**/tests/*"], message: "Only tests import test code: shared invented data lives in scenarios/." }] }],
    },
  },
  {
    files: ["app/**/*.{ts,tsx}", "components/**/*.{ts,tsx}", "scripts/**/*.ts", "scenarios/**/*.ts"],
    rules: {
      "no-restricted-imports": ["error", { patterns: [{ group: ["@/tests/*", "**/tests/*"], message: "Only tests import test code: shared invented data lives in scenarios/." }] }],
    },
  },
  {
    ignores: [".next/**", ".data/**", "node_modules/**", "test-results/**", "playwright-report/**", "next-env.d.ts"],
  },
];

export default config;
