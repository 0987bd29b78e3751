/**
 * After sign-in the app returns only to a page of its own (issue: trust, item 8: open
 * redirect), and pages hydrate under the nonce-based CSP (item 11): no CSP violations while
 * a case page draws its charts.
 */
import { describe, expect, it } from "vitest";
import { baseURL, browserForFile, shot } from "./browser";

const b = browserForFile();

async function signInFrom(next: string) {
  const { page, context } = b;
  await context.clearCookies();
  await page.goto(`${baseURL()}/sign-in?next=${next}`);
  await page.getByLabel("E-mail").fill("erin.engineer@example.test");
  await page.getByLabel("Password").fill("larkspur-demo-2026");
  await page.getByRole("button", { name: "Sign in" }).click();
  await page.waitForURL((url) => !url.pathname.startsWith("/sign-in"));
  return new URL(page.url());
}

describe("return after sign-in", () => {
  it.each([
    // As written in the address bar: the query decodes to a backslash, a tab, two slashes.
    "/%5Cevil.example/",
    "/\\evil.example/",
    "/%09/evil.example/",
    "//evil.example",
  ])("next=%s lands on this site's home page", async (next) => {
    const url = await signInFrom(next);
    expect(url.origin).toBe(baseURL());
    expect(url.pathname).toBe("/");
  });

  it("a local next path is kept", async () => {
    const url = await signInFrom(encodeURIComponent("/cases?mine=1"));
    expect(url.origin).toBe(baseURL());
    expect(url.pathname).toBe("/cases");
    expect(url.search).toBe("?mine=1");
  });
});

describe("hydration under the nonce CSP", () => {
  it("draws a case's charts with no CSP violation", async () => {
    const { page } = b;
    const violations: string[] = [];
    page.on("console", (m) => {
      if (/Content Security Policy|Refused to (execute|load)/i.test(m.text())) violations.push(m.text());
    });
    await signInFrom(encodeURIComponent("/cases"));
    const first = page.locator("a[href^='/cases/']").filter({ hasNotText: "New" }).first();
    await first.click();
    await page.waitForURL(/\/cases\/\d+/);
    await page.locator(".recharts-surface").first().waitFor({ timeout: 30_000 });
    await shot(page, "csp-case-charts");
    expect(violations).toEqual([]);
  });
});
