import next from "eslint-config-next";

const config = [
  { ignores: [".next/**", "node_modules/**", "data/**", "test-results/**", "next-env.d.ts", "bench/**/*.py"] },
  ...next,
  {
    files: ["**/*.cjs"],
    rules: { "@typescript-eslint/no-require-imports": "off" },
  },
];

export default config;
