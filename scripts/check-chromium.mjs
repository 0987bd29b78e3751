/**
 * Run first by `npm test`, `npm run test:browser` and the browser part of `npm run test:postgres`:
 * the browser tests need Debian's chromium. When it is missing, install it if this machine allows
 * (root and apt-get, as .ci/run does); otherwise stop at once with the one command to run, rather
 * than failing deep inside the browser suite. Nothing is ever downloaded except the Debian package.
 */
import { spawnSync } from "node:child_process";
import fs from "node:fs";
import { pathToFileURL } from "node:url";

/** Where Debian (and derivatives) put the browser; tests/browser/browser.ts looks in the same places. */
export const CHROMIUM_PATHS = ["/usr/bin/chromium", "/usr/bin/chromium-browser"];
export const INSTALL_COMMAND = "sudo apt-get update && sudo apt-get install -y chromium";

const onPath = (cmd) => spawnSync("sh", ["-c", `command -v ${cmd}`], { stdio: "ignore" }).status === 0;

/**
 * @param {{ paths?: string[], exists?: (p: string) => boolean, isRoot?: boolean, hasAptGet?: boolean,
 *   install?: () => boolean, log?: (line: string) => void }} [o]
 * @returns {{ ok: boolean, path?: string, installed?: boolean, message?: string }}
 */
export function checkChromium(o = {}) {
  const paths = o.paths ?? CHROMIUM_PATHS;
  const exists = o.exists ?? ((p) => fs.existsSync(p));
  const log = o.log ?? ((line) => console.log(line));
  const found = () => paths.find((p) => exists(p));
  const present = found();
  if (present) return { ok: true, path: present };
  const isRoot = o.isRoot ?? (typeof process.getuid === "function" && process.getuid() === 0);
  const hasAptGet = o.hasAptGet ?? onPath("apt-get");
  if (isRoot && hasAptGet) {
    log("check-chromium: Debian chromium is missing; installing it with apt-get (the browser tests need it)");
    const install =
      o.install ??
      (() => {
        const env = { ...process.env, DEBIAN_FRONTEND: "noninteractive" };
        const update = spawnSync("apt-get", ["update", "-qq"], { stdio: "inherit", env });
        if (update.status !== 0) return false;
        return spawnSync("apt-get", ["install", "-y", "-qq", "chromium"], { stdio: "inherit", env }).status === 0;
      });
    const after = install() ? found() : undefined;
    if (after) return { ok: true, path: after, installed: true };
    return { ok: false, message: `check-chromium: installing Debian chromium failed; run: ${INSTALL_COMMAND}` };
  }
  return { ok: false, message: `check-chromium: the browser tests need Debian chromium at ${paths[0]}, which is missing. Run: ${INSTALL_COMMAND}` };
}

if (import.meta.url === pathToFileURL(process.argv[1] ?? "").href) {
  const result = checkChromium();
  if (!result.ok) {
    console.error(result.message);
    process.exit(1);
  }
}
