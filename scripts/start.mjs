#!/usr/bin/env node
/**
 * `npm start`: migrate, seed the demo (demo mode), build when the sources are
 * newer than the last build, then serve on 127.0.0.1:3000. One process tree;
 * Ctrl-C stops it all.
 */
import { spawn, spawnSync } from "node:child_process";
import fs from "node:fs";
import path from "node:path";

const root = path.resolve(path.dirname(new URL(import.meta.url).pathname), "..");
const port = process.env.PORT ?? "3000";
const host = process.env.HOST ?? "127.0.0.1";
const bin = (name) => path.join(root, "node_modules", ".bin", name);

function run(cmd, args) {
  const r = spawnSync(cmd, args, { cwd: root, stdio: "inherit", env: process.env });
  if (r.status !== 0) process.exit(r.status ?? 1);
}

function newestMtime(dir) {
  let newest = 0;
  if (!fs.existsSync(dir)) return 0;
  for (const entry of fs.readdirSync(dir, { withFileTypes: true })) {
    const p = path.join(dir, entry.name);
    newest = Math.max(newest, entry.isDirectory() ? newestMtime(p) : fs.statSync(p).mtimeMs);
  }
  return newest;
}

function needsBuild() {
  const marker = path.join(root, ".next", "BUILD_ID");
  if (!fs.existsSync(marker)) return true;
  const built = fs.statSync(marker).mtimeMs;
  const sources = ["app", "components", "lib", "models", "proxy.ts", "next.config.mjs", "tailwind.config.ts", "package-lock.json"];
  return sources.some((s) => {
    const p = path.join(root, s);
    if (!fs.existsSync(p)) return false;
    return (fs.statSync(p).isDirectory() ? newestMtime(p) : fs.statSync(p).mtimeMs) > built;
  });
}

run(bin("tsx"), ["scripts/db.ts", "check-production"]);
run(bin("tsx"), ["scripts/db.ts", "migrate"]);
run(bin("tsx"), ["scripts/db.ts", "seed"]);
if (needsBuild()) run(bin("next"), ["build"]);

const server = spawn(process.execPath, [path.join(root, "node_modules/next/dist/bin/next"), "start", "-H", host, "-p", port], {
  cwd: root,
  stdio: "inherit",
  env: process.env,
});
console.log(`Heatpath: http://${host}:${port}`);
for (const signal of ["SIGINT", "SIGTERM"]) process.on(signal, () => server.kill(signal));
server.on("exit", (code) => process.exit(code ?? 0));
