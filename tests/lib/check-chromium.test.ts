import { describe, expect, it } from "vitest";
// @ts-expect-error plain ESM script shared with npm test
import { checkChromium, CHROMIUM_PATHS, INSTALL_COMMAND } from "../../scripts/check-chromium.mjs";

type Check = { ok: boolean; path?: string; installed?: boolean; message?: string };
const run = checkChromium as (o: Record<string, unknown>) => Check;
const quiet = { log: () => undefined };

describe("scripts/check-chromium.mjs (first step of npm test and test:browser)", () => {
  it("passes when Debian chromium is present, without installing", () => {
    let installs = 0;
    const r = run({ ...quiet, exists: (p: string) => p === "/usr/bin/chromium", isRoot: true, hasAptGet: true, install: () => ++installs > 0 });
    expect(r).toEqual({ ok: true, path: "/usr/bin/chromium" });
    expect(installs).toBe(0);
  });

  it("installs it as root with apt-get, then finds it", () => {
    let installed = false;
    const r = run({ ...quiet, exists: () => installed, isRoot: true, hasAptGet: true, install: () => (installed = true) });
    expect(r).toMatchObject({ ok: true, installed: true, path: CHROMIUM_PATHS[0] });
  });

  it("fails naming the one command when it cannot install (not root, or no apt-get), without trying", () => {
    for (const machine of [
      { isRoot: false, hasAptGet: true },
      { isRoot: true, hasAptGet: false },
    ]) {
      let tried = false;
      const r = run({ ...quiet, ...machine, exists: () => false, install: () => (tried = true) });
      expect(r.ok).toBe(false);
      expect(r.message).toContain(INSTALL_COMMAND);
      expect(tried).toBe(false);
    }
  });

  it("fails naming the command when the install does not produce the browser", () => {
    const r = run({ ...quiet, exists: () => false, isRoot: true, hasAptGet: true, install: () => true });
    expect(r.ok).toBe(false);
    expect(r.message).toContain(INSTALL_COMMAND);
  });
});
