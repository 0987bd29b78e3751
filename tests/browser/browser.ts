import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { chromium, type BrowserContext, type Page } from "playwright-core";
import { afterAll, beforeAll, inject } from "vitest";

export const CHROMIUM = ["/usr/bin/chromium", "/usr/bin/chromium-browser"].find((p) => fs.existsSync(p));
export const SHOTS = path.resolve("test-results/screens");

/** A fresh Debian chromium profile; nothing is downloaded. */
export async function openBrowser(viewport = { width: 1280, height: 900 }): Promise<{ context: BrowserContext; page: Page; close: () => Promise<void> }> {
  if (!CHROMIUM) throw new Error("Debian chromium is not installed: apt-get install -y chromium");
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), "heatpath-chromium-"));
  const context = await chromium.launchPersistentContext(dir, {
    executablePath: CHROMIUM,
    headless: true,
    viewport,
    args: ["--headless", "--no-sandbox", "--disable-gpu", "--disable-quic", "--no-first-run", "--disable-background-networking", "--disable-component-update", "--disable-sync"],
  });
  const page = context.pages()[0] ?? (await context.newPage());
  page.setDefaultTimeout(20_000);
  return {
    context,
    page,
    close: async () => {
      await context.close();
      fs.rmSync(dir, { recursive: true, force: true });
    },
  };
}

export const baseURL = () => inject("baseURL");

export async function shot(page: Page, name: string) {
  fs.mkdirSync(SHOTS, { recursive: true });
  await page.screenshot({ path: path.join(SHOTS, `${name}.png`), fullPage: true });
}

export async function signIn(page: Page, email: string, password = "larkspur-demo-2026") {
  await page.goto(`${baseURL()}/sign-in`);
  await page.getByLabel("E-mail").fill(email);
  await page.getByLabel("Password").fill(password);
  await page.getByRole("button", { name: "Sign in" }).click();
  await page.waitForURL((url) => !url.pathname.startsWith("/sign-in"));
}

export async function signOut(page: Page) {
  // On a phone, Sign out sits in the menu.
  const menu = page.getByRole("button", { name: "Menu" });
  if ((await menu.isVisible()) && (await menu.getAttribute("aria-expanded")) !== "true") await menu.click();
  await page.getByRole("button", { name: "Sign out" }).click();
  await page.waitForURL(/\/sign-in/);
}

export type BrowserSession = Awaited<ReturnType<typeof openBrowser>>;

/** One browser for the whole test file: opened before the first test, closed after the last. */
export function browserForFile(viewport?: { width: number; height: number }): BrowserSession {
  const session = {} as BrowserSession;
  beforeAll(async () => {
    Object.assign(session, await openBrowser(viewport));
  });
  afterAll(async () => {
    await session.close?.();
  });
  return session;
}
