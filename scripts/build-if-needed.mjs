/** Shared by `npm start` and the browser tests: build only when sources are newer than the last build. */
import { spawnSync } from "node:child_process";
import fs from "node:fs";
import path from "node:path";

const SOURCES = ["app", "components", "lib", "models", "proxy.ts", "instrumentation.ts", "next.config.mjs", "tailwind.config.ts", "package-lock.json"];

function newestMtime(p) {
  if (!fs.existsSync(p)) return 0;
  const stat = fs.statSync(p);
  if (!stat.isDirectory()) return stat.mtimeMs;
  let newest = stat.mtimeMs;
  for (const entry of fs.readdirSync(p)) newest = Math.max(newest, newestMtime(path.join(p, entry)));
  return newest;
}

export function needsBuild(root) {
  const marker = path.join(root, ".next", "BUILD_ID");
  if (!fs.existsSync(marker)) return true;
  const built = fs.statSync(marker).mtimeMs;
  return SOURCES.some((s) => newestMtime(path.join(root, s)) > built);
}

export function buildIfNeeded(root, env = process.env) {
  if (!needsBuild(root)) return false;
  const r = spawnSync(process.execPath, [path.join(root, "node_modules/next/dist/bin/next"), "build"], { cwd: root, stdio: "inherit", env });
  if (r.status !== 0) throw new Error(`next build failed with exit code ${r.status}`);
  return true;
}
