import { spawn, spawnSync, type ChildProcess } from "node:child_process";
import fs from "node:fs";
import net from "node:net";
import os from "node:os";
import path from "node:path";

const root = path.resolve(import.meta.dirname, "../..");

export function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const s = net.createServer();
    s.listen(0, "127.0.0.1", () => {
      const { port } = s.address() as net.AddressInfo;
      s.close(() => resolve(port));
    });
    s.on("error", reject);
  });
}

export async function waitFor(url: string, ms = 60_000): Promise<void> {
  const until = Date.now() + ms;
  while (Date.now() < until) {
    try {
      if ((await fetch(url)).ok) return;
    } catch {
      // not listening yet
    }
    await new Promise((r) => setTimeout(r, 200));
  }
  throw new Error(`server did not answer ${url} within ${ms} ms`);
}

/** A migrated, seeded database in a fresh folder, and the environment to serve it. */
export async function prepareDatabase(extraEnv: Record<string, string> = {}) {
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), "heatpath-server-"));
  const port = await freePort();
  const baseURL = `http://127.0.0.1:${port}`;
  const env: NodeJS.ProcessEnv = { ...process.env, HEATPATH_MODE: "demo", DATABASE_PATH: path.join(dir, "heatpath.sqlite"), APP_URL: baseURL, MAIL_CATCHER_PORT: String(await freePort()), ...extraEnv };
  for (const step of ["migrate", "seed"]) {
    const r = spawnSync(path.join(root, "node_modules/.bin/tsx"), ["scripts/db.ts", step], { cwd: root, env, stdio: "inherit" });
    if (r.status !== 0) throw new Error(`db ${step} failed`);
  }
  return { dir, port, baseURL, env, databasePath: env.DATABASE_PATH! };
}

/** `next start` on 127.0.0.1 as one process, so one PID stops it (the build must exist). */
export async function startServer(env: NodeJS.ProcessEnv, port: number): Promise<ChildProcess> {
  const child = spawn(process.execPath, [path.join(root, "node_modules/next/dist/bin/next"), "start", "-H", "127.0.0.1", "-p", String(port)], {
    cwd: root,
    env,
    stdio: ["ignore", "ignore", "inherit"],
  });
  await waitFor(`http://127.0.0.1:${port}/api/v1/health`);
  return child;
}

export async function stopServer(child: ChildProcess | undefined, signal: NodeJS.Signals = "SIGTERM"): Promise<void> {
  if (!child || child.exitCode !== null) return;
  const exited = new Promise((r) => child.once("exit", r));
  child.kill(signal);
  await Promise.race([exited, new Promise((r) => setTimeout(r, 5000))]);
  if (child.exitCode === null) child.kill("SIGKILL");
}
