import { spawn, spawnSync, type ChildProcess } from "node:child_process";
import fs from "node:fs";
import net from "node:net";
import os from "node:os";
import path from "node:path";
import type { TestProject } from "vitest/node";
// @ts-expect-error plain ESM helper shared with `npm start`
import { buildIfNeeded } from "../../scripts/build-if-needed.mjs";

const root = path.resolve(import.meta.dirname, "../..");
let server: ChildProcess | undefined;
let workDir: string | undefined;

function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const s = net.createServer();
    s.listen(0, "127.0.0.1", () => {
      const { port } = s.address() as net.AddressInfo;
      s.close(() => resolve(port));
    });
    s.on("error", reject);
  });
}

async function waitFor(url: string, ms: number) {
  const until = Date.now() + ms;
  while (Date.now() < until) {
    try {
      if ((await fetch(url)).ok) return;
    } catch {
      // not listening yet
    }
    await new Promise((r) => setTimeout(r, 250));
  }
  throw new Error(`server did not answer ${url} within ${ms} ms`);
}

export default async function setup(project: TestProject) {
  workDir = fs.mkdtempSync(path.join(os.tmpdir(), "heatpath-browser-"));
  const port = await freePort();
  const baseURL = `http://127.0.0.1:${port}`;
  const env = { ...process.env, HEATPATH_MODE: "demo", DATABASE_PATH: path.join(workDir, "heatpath.sqlite"), APP_URL: baseURL, MAIL_CATCHER_PORT: String(await freePort()) };
  for (const step of ["migrate", "seed"]) {
    const r = spawnSync(path.join(root, "node_modules/.bin/tsx"), ["scripts/db.ts", step], { cwd: root, env, stdio: "inherit" });
    if (r.status !== 0) throw new Error(`db ${step} failed`);
  }
  buildIfNeeded(root, env);
  server = spawn(process.execPath, [path.join(root, "node_modules/next/dist/bin/next"), "start", "-H", "127.0.0.1", "-p", String(port)], {
    cwd: root,
    env,
    stdio: ["ignore", "inherit", "inherit"],
  });
  await waitFor(`${baseURL}/api/v1/health`, 60_000);
  project.provide("baseURL", baseURL);
  project.provide("workDir", workDir);
  project.provide("databasePath", env.DATABASE_PATH);
  return async () => {
    server?.kill("SIGTERM");
    await new Promise((r) => setTimeout(r, 300));
    server?.kill("SIGKILL");
    if (workDir) fs.rmSync(workDir, { recursive: true, force: true });
  };
}

declare module "vitest" {
  export interface ProvidedContext {
    baseURL: string;
    workDir: string;
    databasePath: string;
  }
}
