#!/usr/bin/env node
/**
 * `npm start`: check the production settings (they need no tables, so a fresh
 * database is fine), migrate, seed the demo (demo mode), build when the sources
 * are newer than the last build, then serve on HOST:PORT (127.0.0.1:3000). One
 * process tree; Ctrl-C stops it all. HOST and PORT are passed on, so demo mode's
 * mail links point at this address when APP_URL is unset.
 */
import { spawn, spawnSync } from "node:child_process";
import path from "node:path";
import { buildIfNeeded } from "./build-if-needed.mjs";

const root = path.resolve(path.dirname(new URL(import.meta.url).pathname), "..");
const port = process.env.PORT ?? "3000";
const host = process.env.HOST ?? "127.0.0.1";
const tsx = path.join(root, "node_modules", ".bin", "tsx");
const env = { ...process.env, HOST: host, PORT: port };

function run(cmd, args) {
  const r = spawnSync(cmd, args, { cwd: root, stdio: "inherit", env });
  if (r.status !== 0) process.exit(r.status ?? 1);
}

run(tsx, ["scripts/db.ts", "check-production"]);
run(tsx, ["scripts/db.ts", "migrate"]);
run(tsx, ["scripts/db.ts", "seed"]);
buildIfNeeded(root, env);

const server = spawn(process.execPath, [path.join(root, "node_modules/next/dist/bin/next"), "start", "-H", host, "-p", port], {
  cwd: root,
  stdio: "inherit",
  env,
});
console.log(`Heatpath: http://${host}:${port}`);
for (const signal of ["SIGINT", "SIGTERM"]) process.on(signal, () => server.kill(signal));
server.on("exit", (code) => process.exit(code ?? 0));
