import next from "eslint-config-next";

const config = [
  { ignores: [".next/**", "node_modules/**", "data/**", "test-results/**", "next-env.d.ts", "bench/**/*.py"] },
  ...next,
  {
    files: ["**/*.cjs"],
    rules: { "@typescript-eslint/no-require-imports": "off" },
  },
  // The import graph: no cycles, and nothing in components/ or lib/ imports from app/ (a page passes its server actions in as props).
  { files: ["app/**/*.{ts,tsx}", "components/**/*.{ts,tsx}", "lib/**/*.{ts,tsx,mjs}"], rules: { "import/no-cycle": "error" } },
  {
    files: ["components/**/*.{ts,tsx}", "lib/**/*.{ts,tsx}"],
    rules: {
      "no-restricted-imports": ["error", { patterns: [{ group: ["@/app/*"], message: "components/ and lib/ never import from app/: pass a server action in as a prop." }] }],
    },
  },
];

export default config;
